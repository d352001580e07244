// Package datasheet assembles datasheets and renders them as one
// self-contained HTML file (WriteHTML) and as a PDF (WritePDF), each to an
// io.Writer.
//
// A Sheet is generic: a title block, key figures and numbered sections,
// each a sequence of blocks (a table, a chart, a note, a paragraph, a
// list, a set of materials) whose numbers are already strings with their
// units. FromDesign builds the sheet of a single-cavity design
// (design.Result); a datasheet of another kind (a filter) builds its own
// sections and renders them the same way.
//
// The package never reads or writes files; the command that calls it
// writes the bytes.
package datasheet

// Sheet is a datasheet, formatted for people: every number is already a
// string with its unit. HTML and PDF render the same Sheet, its sections
// numbered from 1 in order.
type Sheet struct {
	// Version is the cylcav version written into the files.
	Version string
	// Kind names the kind of datasheet above the title ("Cavity resonator
	// datasheet").
	Kind     string
	Title    string
	Headline string  // one line under the title
	Notice   *Notice // a highlighted note under the headline; nil for none
	Facts    []KV    // the key figures at the top
	Sections []Section
	// Method is the closing note: where the numbers come from.
	Method string
}

// Notice is a highlighted note: a bold lead and its text, parts of which
// may be set as code (command names).
type Notice struct {
	Lead  string
	Parts []Span
}

// Span is a run of text, set as code when Code is true.
type Span struct {
	Text string
	Code bool
}

// Text returns the notice as plain text, code in single quotes.
func (n *Notice) Text() string {
	s := n.Lead + "."
	if len(n.Parts) > 0 {
		s += " "
	}
	for _, p := range n.Parts {
		if p.Code {
			s += "'" + p.Text + "'"
		} else {
			s += p.Text
		}
	}
	return s
}

// Section is a numbered section: a heading and its blocks, in order.
type Section struct {
	Heading string
	Blocks  []Block
}

// Block is one part of a section; exactly one of its fields is set.
type Block struct {
	Table     *Table
	Chart     *Chart
	Note      string // small print
	Para      string // a paragraph
	List      *List
	Materials []Material
}

// List is a bulleted list with an optional lead-in line; Class names its
// kind for the HTML styles ("cautions", "safety").
type List struct {
	Lead, Class string
	Items       []string
}

// Charts returns the charts of the sheet in the order they appear.
func (sh *Sheet) Charts() []*Chart {
	var out []*Chart
	for _, s := range sh.Sections {
		for _, b := range s.Blocks {
			if b.Chart != nil {
				out = append(out, b.Chart)
			}
		}
	}
	return out
}
