package cmdutil

import (
	"bytes"
	"strings"
	"testing"
	"time"
)

// fakeClock advances by step on each reading.
type fakeClock struct {
	t    time.Time
	step time.Duration
}

func (c *fakeClock) now() time.Time {
	t := c.t
	c.t = c.t.Add(c.step)
	return t
}

func TestProgressQuietWhenNotTerminal(t *testing.T) {
	var buf bytes.Buffer
	clk := &fakeClock{step: time.Second}
	p := newProgress(&buf, "sampling", false, clk.now)
	for i := 1; i <= 10; i++ {
		p.Update(i, 10)
	}
	p.Done()
	if buf.Len() != 0 {
		t.Errorf("progress on a non-terminal wrote %q, want nothing", buf.String())
	}
}

func TestProgressQuietForShortRuns(t *testing.T) {
	var buf bytes.Buffer
	clk := &fakeClock{step: time.Millisecond}
	p := newProgress(&buf, "sampling", true, clk.now)
	for i := 1; i <= 10; i++ {
		p.Update(i, 10)
	}
	p.Done()
	if buf.Len() != 0 {
		t.Errorf("progress of a 10 ms run wrote %q, want nothing", buf.String())
	}
}

func TestProgressDrawsAndClears(t *testing.T) {
	var buf bytes.Buffer
	clk := &fakeClock{step: time.Second}
	p := newProgress(&buf, "sampling", true, clk.now)
	p.Update(5, 10)
	p.Update(10, 10)
	got := buf.String()
	if !strings.Contains(got, " 50% (5/10)") || !strings.Contains(got, "100% (10/10)") {
		t.Errorf("progress output = %q, want 50%% and 100%% states", got)
	}
	if !strings.Contains(got, "[###############...............]") {
		t.Errorf("progress output = %q, want a half-filled 30-cell bar", got)
	}
	p.Done()
	if !strings.HasSuffix(buf.String(), "\r\x1b[K") {
		t.Errorf("Done wrote %q, want the line cleared", buf.String())
	}
}
