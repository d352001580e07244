package cmdutil

import (
	"bytes"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

// entries lists the names in dir.
func entries(t *testing.T, dir string) []string {
	t.Helper()
	es, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var names []string
	for _, e := range es {
		names = append(names, e.Name())
	}
	return names
}

// TestWriteFilesAllOrNone checks that a second output that cannot be
// written leaves the first unwritten too, for each reason the trust issue
// names: an existing file, a missing directory, a full disk.
func TestWriteFilesAllOrNone(t *testing.T) {
	dir := t.TempDir()
	html := filepath.Join(dir, "x.html")
	existing := filepath.Join(dir, "old.pdf")
	if err := os.WriteFile(existing, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	full := fileWriter{write1: func(f *os.File, data []byte) (int, error) {
		if strings.HasSuffix(f.Name(), ".pdf") || strings.Contains(f.Name(), ".pdf.tmp") {
			return 0, syscall.ENOSPC
		}
		return f.Write(data)
	}}
	for _, tc := range []struct {
		name  string
		w     fileWriter
		pdf   string
		usage bool
		want  string
	}{
		{"existing file", fileWriter{}, existing, true, "pass --force"},
		{"missing directory", fileWriter{}, filepath.Join(dir, "nodir", "x.pdf"), true, "does not exist"},
		{"full disk", full, filepath.Join(dir, "x.pdf"), false, "no space left"},
		{"same file twice", fileWriter{}, html, true, "same file"},
	} {
		err := tc.w.write(false, []File{{Flag: "output", Path: html, Data: []byte("<html>")}, {Flag: "pdf", Path: tc.pdf, Data: []byte("%PDF")}})
		if err == nil || !strings.Contains(err.Error(), tc.want) || IsUsage(err) != tc.usage {
			t.Errorf("%s: error %v (usage %v), want one containing %q with usage %v", tc.name, err, IsUsage(err), tc.want, tc.usage)
		}
		if got := entries(t, dir); len(got) != 1 || got[0] != "old.pdf" {
			t.Errorf("%s: directory holds %q after the failure, want only old.pdf", tc.name, got)
		}
	}
	if b, _ := os.ReadFile(existing); string(b) != "old" {
		t.Errorf("existing file changed to %q", b)
	}
}

// TestWriteFilesDevFull writes to a path whose directory is /dev: the
// device /dev/full is refused as not a regular file before anything is
// written (Linux only).
func TestWriteFilesDevFull(t *testing.T) {
	if _, err := os.Stat("/dev/full"); err != nil {
		t.Skip("no /dev/full")
	}
	for _, force := range []bool{false, true} {
		err := WriteFileAtomic("/dev/full", []byte("x"), force)
		if err == nil || !IsUsage(err) || !strings.Contains(err.Error(), "not a regular file (a device)") {
			t.Errorf("force %v: error %v, want a usage error: not a regular file", force, err)
		}
	}
}

func TestWriteFilesSpecialPaths(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "fifo")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Skip("mkfifo:", err)
	}
	dangling := filepath.Join(dir, "dangling")
	if err := os.Symlink(filepath.Join(dir, "missing"), dangling); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct{ path, want string }{
		{fifo, "named pipe"},
		{dangling, "symbolic link to a missing file"},
		{dir, "a directory"},
	} {
		for _, force := range []bool{false, true} {
			err := WriteFiles(force, File{Flag: "output", Path: tc.path, Data: []byte("x")})
			if err == nil || !IsUsage(err) || !strings.Contains(err.Error(), tc.want) || !strings.Contains(err.Error(), "--output") {
				t.Errorf("%s (force %v): error %v, want a usage error naming --output and %q", tc.path, force, err, tc.want)
			}
		}
	}
	if _, err := os.Lstat(filepath.Join(dir, "missing")); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("the dangling link's target was created")
	}
}

// TestWriteFilesModes checks that a new file gets 0666 less the umask (the
// test's umask is read back from a file the kernel created) and that a
// replaced file, and a file behind a symbolic link, keep their mode.
func TestWriteFilesModes(t *testing.T) {
	dir := t.TempDir()
	probe := filepath.Join(dir, "probe")
	fh, err := os.OpenFile(probe, os.O_CREATE|os.O_WRONLY, 0o666)
	if err != nil {
		t.Fatal(err)
	}
	fh.Close()
	pi, _ := os.Stat(probe)
	wantNew := pi.Mode().Perm() // 0666 &^ umask, by the kernel

	newFile := filepath.Join(dir, "new.svg")
	if err := WriteFileAtomic(newFile, []byte("a"), false); err != nil {
		t.Fatal(err)
	}
	if fi, _ := os.Stat(newFile); fi.Mode().Perm() != wantNew {
		t.Errorf("new file mode %v, want %v (0666 less the umask)", fi.Mode().Perm(), wantNew)
	}

	old := filepath.Join(dir, "old.s2p")
	if err := os.WriteFile(old, []byte("old"), 0o600); err != nil {
		t.Fatal(err)
	}
	if err := os.Chmod(old, 0o640); err != nil {
		t.Fatal(err)
	}
	link := filepath.Join(dir, "link.s2p")
	if err := os.Symlink("old.s2p", link); err != nil {
		t.Fatal(err)
	}
	if err := WriteFileAtomic(link, []byte("new"), true); err != nil {
		t.Fatal(err)
	}
	if fi, _ := os.Lstat(link); fi.Mode()&os.ModeSymlink == 0 {
		t.Errorf("the symbolic link was replaced by a file")
	}
	fi, _ := os.Stat(old)
	if b, _ := os.ReadFile(old); string(b) != "new" || fi.Mode().Perm() != 0o640 {
		t.Errorf("replaced file: contents %q mode %v, want \"new\" and 0640", b, fi.Mode().Perm())
	}
}

// TestWriteFilesSignal runs a child process (this test binary) that stops
// between writing its temporary file and renaming it, sends it SIGTERM and
// SIGINT, and checks that it died by the signal and left no file behind.
func TestWriteFilesSignal(t *testing.T) {
	if dir := os.Getenv("CYLCAV_SIGNAL_CHILD"); dir != "" {
		w := fileWriter{beforeRename: func() {
			os.Stdout.WriteString("ready\n")
			select {} // wait for the signal
		}}
		_ = w.write(false, []File{{Path: filepath.Join(dir, "out.pdf"), Data: bytes.Repeat([]byte("x"), 1<<16)}})
		os.Exit(3) // not reached when the signal works
	}
	for _, sig := range []syscall.Signal{syscall.SIGTERM, syscall.SIGINT} {
		dir := t.TempDir()
		cmd := exec.Command(os.Args[0], "-test.run=^TestWriteFilesSignal$")
		cmd.Env = append(os.Environ(), "CYLCAV_SIGNAL_CHILD="+dir)
		out, err := cmd.StdoutPipe()
		if err != nil {
			t.Fatal(err)
		}
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		buf := make([]byte, 6)
		if _, err := out.Read(buf); err != nil || string(buf) != "ready\n" {
			t.Fatalf("child said %q, %v", buf, err)
		}
		if got := entries(t, dir); len(got) != 1 || !strings.Contains(got[0], ".tmp") {
			t.Fatalf("before the signal the directory holds %q, want one temporary file", got)
		}
		cmd.Process.Signal(sig)
		err = cmd.Wait()
		var ee *exec.ExitError
		if !errors.As(err, &ee) {
			t.Fatalf("%v: child ended with %v, want death by signal", sig, err)
		}
		if ws, ok := ee.Sys().(syscall.WaitStatus); !ok || !ws.Signaled() || ws.Signal() != sig {
			t.Errorf("%v: child status %v, want killed by %v", sig, ee, sig)
		}
		if got := entries(t, dir); len(got) != 0 {
			t.Errorf("%v: directory holds %q after the signal, want nothing", sig, got)
		}
	}
}

func TestMessage(t *testing.T) {
	long := strings.Repeat("y", 100)
	for _, tc := range []struct{ in, want string }{
		{"cavity: radius must be > 0", "radius must be > 0"},
		{`--wall "x": wall: qfactor: conductor "copper": too hot`, `--wall "x": wall: conductor "copper": too hot`},
		{`--wall "` + long + `": unknown`, `--wall "` + long[:80] + `"...: unknown`},
		// Text between two short quotes is not a quoted value, however long.
		{`a "b" ` + long + ` "c"`, `a "b" ` + long + ` "c"`},
		{`open "` + long, `open "` + long},
	} {
		if got := Message(errors.New(tc.in)); got != tc.want {
			t.Errorf("Message(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}

// TestCheckFilesUnwritableDirectory: a directory that takes no new file is
// refused by the checks, as bad input naming the flag, before any work
// (found by the user pass: --plot /proc/p.svg ran the whole analysis and
// then failed with status 1). /proc exists on Linux and takes no regular
// file, even for root; a read-only directory does the same for other
// users.
func TestCheckFilesUnwritableDirectory(t *testing.T) {
	if fi, err := os.Stat("/proc"); err != nil || !fi.IsDir() {
		t.Skip("no /proc")
	}
	err := CheckFiles(false, File{Flag: "plot", Path: "/proc/cylcav-probe.svg"})
	if !IsUsage(err) || !strings.Contains(err.Error(), `--plot "/proc/cylcav-probe.svg": cannot create a file in /proc`) {
		t.Errorf("CheckFiles in /proc: %v; want a usage error naming --plot and /proc", err)
	}
	// A writable directory keeps no trace of the probe.
	dir := t.TempDir()
	if err := CheckFiles(false, File{Flag: "plot", Path: filepath.Join(dir, "p.svg")}); err != nil {
		t.Fatal(err)
	}
	if names := entries(t, dir); len(names) != 0 {
		t.Errorf("the probe left %v", names)
	}
}
