package cmdutil

import (
	"fmt"
	"io"
	"strings"
	"time"
)

// Progress draws a one-line progress bar on the error stream for long runs.
// It draws nothing unless the stream is a terminal, and nothing until the
// run has lasted Delay, so short runs and piped output stay quiet. Update
// is meant to be passed as a library progress callback
// (func(done, total int)); calls must not overlap.
type Progress struct {
	w       io.Writer
	label   string
	enabled bool
	now     func() time.Time
	start   time.Time
	last    time.Time
	drawn   bool

	// Delay is how long a run must last before the bar appears.
	Delay time.Duration
	// Every is the least time between redraws.
	Every time.Duration
}

// Progress defaults.
const (
	DefaultProgressDelay = 300 * time.Millisecond
	progressEvery        = 100 * time.Millisecond
	progressWidth        = 30
)

// NewProgress returns a progress bar labelled label on io.ErrOut, enabled
// only when io.ErrIsTerminal.
func NewProgress(io *IOStreams, label string) *Progress {
	return newProgress(io.ErrOut, label, io.ErrIsTerminal, time.Now)
}

func newProgress(w io.Writer, label string, enabled bool, now func() time.Time) *Progress {
	t := now()
	return &Progress{w: w, label: label, enabled: enabled, now: now, start: t,
		Delay: DefaultProgressDelay, Every: progressEvery}
}

// Update reports that done of total units are finished and redraws the bar
// when it is due.
func (p *Progress) Update(done, total int) {
	if !p.enabled || total <= 0 {
		return
	}
	t := p.now()
	if t.Sub(p.start) < p.Delay {
		return
	}
	if p.drawn && done < total && t.Sub(p.last) < p.Every {
		return
	}
	p.last, p.drawn = t, true
	frac := float64(done) / float64(total)
	frac = min(max(frac, 0), 1)
	fill := int(frac * progressWidth)
	fmt.Fprintf(p.w, "\r%s [%s%s] %3.0f%% (%d/%d)", p.label,
		strings.Repeat("#", fill), strings.Repeat(".", progressWidth-fill), 100*frac, done, total)
}

// Done clears the bar's line if one was drawn.
func (p *Progress) Done() {
	if p.drawn {
		fmt.Fprint(p.w, "\r\x1b[K")
		p.drawn = false
	}
}
