package cmdutil

import (
	"crypto/rand"
	"encoding/hex"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"os/signal"
	"path/filepath"
	"sync"
	"syscall"
)

// File is one output file of a command: the flag that named it (for error
// messages, "" for none), its path and its whole contents.
type File struct {
	Flag string
	Path string
	Data []byte
}

// WriteFiles writes every file or none, each atomically (a temporary file in
// the same directory, then a rename), so a reader never sees a partial file
// and a failed run leaves nothing behind:
//
//  1. every path is checked before anything is written: its directory must
//     exist and take a new file (probeDir); an existing path must be a regular file (or a symbolic link to
//     one, which is kept and its target replaced) and is replaced only when
//     force is true; a named pipe, device, socket, directory or dangling
//     link is refused even with force, and so is one path given twice.
//     These are usage errors (exit status 2) naming the flag and the path;
//  2. every temporary file is written and synced; a failure (a full disk)
//     removes them all;
//  3. the temporary files are renamed into place.
//
// A new file gets mode 0666 less the umask, like any file the user creates;
// a replaced file keeps its mode. SIGINT or SIGTERM during steps 2 and 3
// removes the temporary files before the process ends by that signal.
func WriteFiles(force bool, files ...File) error {
	return fileWriter{}.write(force, files)
}

// CheckFiles does the checks of WriteFiles' step 1 on the paths of files
// (their Data is not looked at), so a command can refuse a bad output path
// before it spends time computing the contents.
func CheckFiles(force bool, files ...File) error {
	seen := make(map[string]string)
	for _, f := range files {
		t, err := checkTarget(f, force)
		if err != nil {
			return err
		}
		abs, _ := filepath.Abs(t.real)
		if prev, ok := seen[abs]; ok {
			return Usagef("%s and %s name the same file %s; give two different files", prev, flagName(f), f.Path)
		}
		seen[abs] = flagName(f)
	}
	return nil
}

// WriteFileAtomic writes one file as WriteFiles does.
func WriteFileAtomic(path string, data []byte, force bool) error {
	return WriteFiles(force, File{Path: path, Data: data})
}

// fileWriter holds the seams the tests use to simulate a full disk and a
// signal in the middle of a write; the zero value writes for real.
type fileWriter struct {
	write1       func(f *os.File, data []byte) (int, error) // nil: f.Write
	beforeRename func()                                     // nil: nothing
}

// target is one checked output path.
type target struct {
	File
	real    string      // the path written: Path, or a symbolic link's target
	existed bool        // a file was there before
	perm    fs.FileMode // its permission bits, when it existed
	tmp     string      // the temporary file, once created
}

// checkTarget does step 1 of WriteFiles for one file.
func checkTarget(f File, force bool) (target, error) {
	t := target{File: f, real: f.Path}
	bad := func(format string, a ...any) error {
		msg := fmt.Sprintf(format, a...)
		if f.Flag == "" {
			return Usagef("%s: %s", f.Path, msg)
		}
		return FlagError(f.Flag, f.Path, errors.New(msg))
	}
	if f.Path == "" {
		return t, bad("empty file name")
	}
	fi, err := os.Lstat(f.Path)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		dir := filepath.Dir(f.Path)
		di, err := os.Stat(dir)
		if err != nil || !di.IsDir() {
			return t, bad("directory %s does not exist", dir)
		}
		if err := probeDir(dir); err != nil {
			return t, bad("cannot create a file in %s: %v", dir, err)
		}
		return t, nil
	case err != nil:
		return t, bad("%v", errors.Unwrap(err))
	}
	if fi.Mode()&fs.ModeSymlink != 0 {
		real, err := filepath.EvalSymlinks(f.Path)
		if err != nil {
			return t, bad("a symbolic link to a missing file; remove the link or name another file")
		}
		if fi, err = os.Stat(real); err != nil {
			return t, bad("%v", errors.Unwrap(err))
		}
		t.real = real
	}
	if !fi.Mode().IsRegular() {
		return t, bad("not a regular file (%s); name a regular file", kind(fi.Mode()))
	}
	if !force {
		return t, bad("file exists; pass --force to replace it")
	}
	if dir := filepath.Dir(t.real); probeDir(dir) != nil {
		// The replacement is written beside the file, then renamed.
		return t, bad("cannot create a file in %s: %v", dir, probeDir(dir))
	}
	t.existed, t.perm = true, fi.Mode().Perm()
	return t, nil
}

// probeDir tells whether a file can be created in dir (a read-only
// directory or file system, a pseudo file system that takes no new
// files), by creating an empty temporary file and removing it, so that a
// path that cannot be written is refused before any work, as bad input,
// rather than failing at the end.
func probeDir(dir string) error {
	fh, err := os.CreateTemp(dir, ".cylcav-probe-*")
	if err != nil {
		var pe *fs.PathError
		if errors.As(err, &pe) {
			return pe.Err
		}
		return err
	}
	name := fh.Name()
	fh.Close()
	return os.Remove(name)
}

// kind names the type of a file that is not regular.
func kind(m fs.FileMode) string {
	switch {
	case m.IsDir():
		return "a directory"
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe"
	case m&fs.ModeSocket != 0:
		return "a socket"
	case m&fs.ModeDevice != 0:
		return "a device"
	}
	return "a special file"
}

func (w fileWriter) write(force bool, files []File) error {
	if err := CheckFiles(force, files...); err != nil {
		return err
	}
	ts := make([]target, len(files))
	for i, f := range files {
		t, err := checkTarget(f, force)
		if err != nil {
			return err
		}
		ts[i] = t
	}

	// From here on a signal removes the temporary files.
	var mu sync.Mutex
	done := false
	cleanup := func() {
		for i := range ts {
			if ts[i].tmp != "" {
				os.Remove(ts[i].tmp)
			}
		}
	}
	sig := make(chan os.Signal, 1)
	signal.Notify(sig, os.Interrupt, syscall.SIGTERM)
	stopped := make(chan struct{})
	go func() {
		defer close(stopped)
		s, ok := <-sig
		if !ok {
			return
		}
		mu.Lock()
		if !done {
			cleanup()
		}
		signal.Stop(sig)
		// End the process by the same signal, with its usual exit status.
		if p, err := os.FindProcess(os.Getpid()); err == nil {
			p.Signal(s)
		}
		// The mutex stays locked: the process is ending.
	}()
	defer func() {
		signal.Stop(sig)
		close(sig)
		<-stopped
	}()

	mu.Lock()
	for i := range ts {
		if err := w.writeTemp(&ts[i]); err != nil {
			cleanup()
			mu.Unlock()
			return err
		}
	}
	mu.Unlock()
	if w.beforeRename != nil {
		w.beforeRename()
	}
	mu.Lock()
	defer mu.Unlock()
	for i := range ts {
		if err := os.Rename(ts[i].tmp, ts[i].real); err != nil {
			cleanup()
			for _, t := range ts[:i] {
				if !t.existed {
					os.Remove(t.real)
				}
			}
			return fmt.Errorf("writing %s: %w", ts[i].Path, err)
		}
		ts[i].tmp = ""
	}
	done = true
	return nil
}

func flagName(f File) string {
	if f.Flag == "" {
		return f.Path
	}
	return "--" + f.Flag
}

// writeTemp creates, writes, syncs and closes t's temporary file. A new
// file is created with mode 0666, which the kernel reduces by the umask; a
// replacement takes the old file's permission bits.
func (w fileWriter) writeTemp(t *target) error {
	var rnd [6]byte
	if _, err := rand.Read(rnd[:]); err != nil {
		return err
	}
	name := filepath.Join(filepath.Dir(t.real), "."+filepath.Base(t.real)+".tmp"+hex.EncodeToString(rnd[:]))
	fh, err := os.OpenFile(name, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o666)
	if err != nil {
		return fmt.Errorf("writing %s: %w", t.Path, errors.Unwrap(err))
	}
	t.tmp = name
	write := w.write1
	if write == nil {
		write = (*os.File).Write
	}
	_, werr := write(fh, t.Data)
	serr := fh.Sync()
	cerr := fh.Close()
	var merr error
	if t.existed {
		merr = os.Chmod(name, t.perm)
	}
	if err := errors.Join(werr, serr, cerr, merr); err != nil {
		var pe *fs.PathError
		if errors.As(err, &pe) {
			err = pe.Err
		}
		return fmt.Errorf("writing %s: %w", t.Path, err)
	}
	return nil
}
