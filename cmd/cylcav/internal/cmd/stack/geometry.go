package stack

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"strings"

	"go.yaml.in/yaml/v3"

	"cylcav/axisym"
	"cylcav/cmd/cylcav/internal/cmdutil"
	"cylcav/physics"
	"cylcav/qfactor"
)

// FileError is an error in a geometry file: the file, the line and the key
// it concerns.
type FileError struct {
	File string
	Line int
	Key  string
	Err  error
}

func (e *FileError) Error() string {
	if e.Key == "" {
		return fmt.Sprintf("%s:%d: %v", e.File, e.Line, e.Err)
	}
	return fmt.Sprintf("%s:%d: %s: %v", e.File, e.Line, e.Key, e.Err)
}

func (e *FileError) Unwrap() error { return e.Err }

// Geometry is a parsed geometry file.
type Geometry struct {
	Title string
	Body  axisym.Body
	// Walls, when not nil (the file's walls key), gives the metal of each
	// kind of surface (at 20 C, smooth); nil when the file has none.
	Walls *axisym.Walls
}

// Keys of the geometry file, in the order the help text lists them.
var (
	topKeys     = []string{"title", "end_a", "end_b", "walls", "sections"}
	endWords    = []string{"plate", "pipe"}
	wallKeys    = []string{"side", "steps", "inner", "plate_a", "plate_b"}
	sectionKeys = []string{"length", "radius", "inner_radius", "fill", "start", "layers"}
	layerKeys   = []string{"radius", "fill"}
)

// ParseGeometry reads a geometry file's bytes (YAML; see the command's help
// for the format). Every error is a *FileError naming file, line and key:
// unknown or repeated keys, missing lengths or radii, values that are not
// lengths, zero or negative sizes, an inner radius not below the outer,
// a start that overlaps the previous section or leaves a gap, unknown
// materials, and bodies that axisym.Body.Validate rejects.
func ParseGeometry(file string, data []byte) (Geometry, error) {
	var g Geometry
	var doc yaml.Node
	if err := yaml.Unmarshal(data, &doc); err != nil {
		line := 1
		msg := err.Error()
		// The decoder's messages read "yaml: line N: ..."; keep the line.
		if _, e := fmt.Sscanf(msg, "yaml: line %d:", &line); e == nil {
			if parts := strings.SplitN(msg, ": ", 3); len(parts) == 3 {
				msg = parts[2]
			}
		}
		return g, &FileError{File: file, Line: line, Err: fmt.Errorf("not valid YAML: %s", msg)}
	}
	if len(doc.Content) == 0 {
		return g, &FileError{File: file, Line: 1, Err: fmt.Errorf("empty file; it needs a 'sections' list")}
	}
	if line := secondDocument(data); line > 0 {
		return g, &FileError{File: file, Line: line, Err: fmt.Errorf("a second YAML document ('---'): a geometry file holds one body; split it into two files")}
	}
	root := doc.Content[0]
	ferr := func(n *yaml.Node, key string, format string, a ...any) error {
		return &FileError{File: file, Line: n.Line, Key: key, Err: fmt.Errorf(format, a...)}
	}
	if root.Kind != yaml.MappingNode {
		return g, ferr(root, "", "the file must be a mapping with the keys %s", strings.Join(topKeys, ", "))
	}
	var sections, wallsNode *yaml.Node
	if err := eachKey(file, root, "", topKeys, func(k, v *yaml.Node) error {
		switch k.Value {
		case "title":
			if v.Kind != yaml.ScalarNode {
				return ferr(v, "title", "must be text")
			}
			g.Title = v.Value
		case "sections":
			sections = v
		case "end_a", "end_b":
			e, err := parseEnd(v)
			if err != nil {
				return ferr(v, k.Value, "%v", err)
			}
			if k.Value == "end_a" {
				g.Body.EndA = e
			} else {
				g.Body.EndB = e
			}
		case "walls":
			w, err := parseWalls(file, v)
			if err != nil {
				return err
			}
			g.Walls = w
			wallsNode = v
		}
		return nil
	}); err != nil {
		return g, err
	}
	if sections == nil {
		return g, ferr(root, "sections", "missing: list the sections from the end plate at z = 0")
	}
	if wallsNode != nil {
		// A plate's metal for an end that is a pipe would be ignored.
		for i := 0; i+1 < len(wallsNode.Content); i += 2 {
			k := wallsNode.Content[i]
			if (k.Value == "plate_a" && g.Body.EndA == axisym.Pipe) || (k.Value == "plate_b" && g.Body.EndB == axisym.Pipe) {
				end := "end_" + strings.TrimPrefix(k.Value, "plate_")
				return g, ferr(k, "walls."+k.Value, "%s is a pipe: there is no plate to give a metal; remove walls.%s or make %s a plate", end, k.Value, end)
			}
		}
	}
	if sections.Kind != yaml.SequenceNode || len(sections.Content) == 0 {
		return g, ferr(sections, "sections", "must be a non-empty list of sections")
	}
	z := 0.0
	for i, sn := range sections.Content {
		prefix := fmt.Sprintf("sections[%d]", i+1)
		if sn.Kind != yaml.MappingNode {
			return g, ferr(sn, prefix, "must be a mapping with the keys %s", strings.Join(sectionKeys, ", "))
		}
		var s axisym.Section
		var haveLength, haveRadius bool
		var startNode *yaml.Node
		start := math.NaN()
		err := eachKey(file, sn, prefix, sectionKeys, func(k, v *yaml.Node) error {
			key := prefix + "." + k.Value
			if k.Value == "layers" {
				layers, err := parseLayers(file, key, v)
				s.Layers = layers
				return err
			}
			if v.Kind != yaml.ScalarNode {
				return ferr(v, key, "must be a single value")
			}
			switch k.Value {
			case "fill":
				d, err := physics.ParseDielectric(v.Value)
				if err != nil {
					return ferr(v, key, "%v", err)
				}
				s.Fill = d.Medium
				return nil
			}
			x, err := cmdutil.LengthOf(v.Value)
			if err != nil {
				return ferr(v, key, "%v", err)
			}
			switch k.Value {
			case "length":
				haveLength = true
				s.Length = x
				if !(x > 0) {
					return ferr(v, key, "must be > 0, got %s", v.Value)
				}
			case "radius":
				haveRadius = true
				s.Radius = x
				if !(x > 0) {
					return ferr(v, key, "must be > 0, got %s", v.Value)
				}
			case "inner_radius":
				s.InnerRadius = x
				if x < 0 {
					return ferr(v, key, "must be >= 0 (0 means no inner conductor), got %s", v.Value)
				}
			case "start":
				start, startNode = x, v
			}
			return nil
		})
		if err != nil {
			return g, err
		}
		if !haveLength {
			return g, ferr(sn, prefix+".length", "missing")
		}
		if !haveRadius {
			return g, ferr(sn, prefix+".radius", "missing")
		}
		if s.InnerRadius != 0 && s.InnerRadius >= s.Radius {
			return g, ferr(sn, prefix+".inner_radius", "must be below the radius %s, got %s",
				lengthText(s.Radius), lengthText(s.InnerRadius))
		}
		if startNode != nil {
			tol := 1e-9 * max(z, s.Length)
			switch {
			case start < z-tol:
				return g, ferr(startNode, prefix+".start", "overlaps the previous section by %s (it ends at z = %s)",
					lengthText(z-start), lengthText(z))
			case start > z+tol:
				return g, ferr(startNode, prefix+".start", "leaves a gap of %s after the previous section (it ends at z = %s)",
					lengthText(start-z), lengthText(z))
			}
		}
		z += s.Length
		g.Body.Sections = append(g.Body.Sections, s)
		if err := (axisym.Body{Sections: []axisym.Section{s}}).Validate(); err != nil {
			msg := strings.TrimPrefix(err.Error(), "axisym: section 1: ")
			return g, ferr(sn, prefix, "%s", msg)
		}
	}
	if err := g.Body.Validate(); err != nil {
		return g, ferr(sections, "sections", "%v", err)
	}
	return g, nil
}

// secondDocument returns the line of a second YAML document in data, or
// 0 when there is one document (yaml.Unmarshal reads only the first, so
// the rest would be ignored without a word).
func secondDocument(data []byte) int {
	dec := yaml.NewDecoder(bytes.NewReader(data))
	var first, second yaml.Node
	if dec.Decode(&first) != nil {
		return 0
	}
	if err := dec.Decode(&second); err != nil {
		if errors.Is(err, io.EOF) {
			return 0
		}
		return 1 // a malformed second document: still a second one
	}
	if len(second.Content) == 0 || (len(second.Content) == 1 && second.Content[0].Tag == "!!null" && second.Content[0].Value == "") {
		return 0 // a closing '---' with nothing after it
	}
	return max(second.Line, 1)
}

// eachKey calls fn for every key of mapping m in order, after rejecting keys
// not in allowed and repeated keys.
func eachKey(file string, m *yaml.Node, prefix string, allowed []string, fn func(k, v *yaml.Node) error) error {
	seen := map[string]int{}
	for i := 0; i+1 < len(m.Content); i += 2 {
		k, v := m.Content[i], m.Content[i+1]
		key := k.Value
		if prefix != "" {
			key = prefix + "." + k.Value
		}
		ok := false
		for _, a := range allowed {
			ok = ok || a == k.Value
		}
		if !ok {
			return &FileError{File: file, Line: k.Line, Key: key, Err: fmt.Errorf("unknown key; allowed: %s", strings.Join(allowed, ", "))}
		}
		if l, dup := seen[k.Value]; dup {
			return &FileError{File: file, Line: k.Line, Key: key, Err: fmt.Errorf("given twice (first on line %d)", l)}
		}
		seen[k.Value] = k.Line
		if err := fn(k, v); err != nil {
			return err
		}
	}
	return nil
}

// lengthText prints a length for an error message.
func lengthText(m float64) string { return cmdutil.TrimZeros(physics.FormatLength(m, 6)) }

// parseEnd reads an end_a or end_b value: plate or pipe.
func parseEnd(v *yaml.Node) (axisym.End, error) {
	if v.Kind == yaml.ScalarNode {
		switch strings.ToLower(strings.TrimSpace(v.Value)) {
		case "plate":
			return axisym.Plate, nil
		case "pipe":
			return axisym.Pipe, nil
		}
	}
	return 0, fmt.Errorf("must be %s (a metal end plate, or a pipe of the end section's cross-section running on to infinity), got %q",
		strings.Join(endWords, " or "), v.Value)
}

// parseWalls reads the walls mapping: a metal (a library name or
// sigma=/iacs=/rho=..., as --wall takes) for each kind of surface; side is
// required, the others default to it.
func parseWalls(file string, m *yaml.Node) (*axisym.Walls, error) {
	ferr := func(n *yaml.Node, key string, format string, a ...any) error {
		return &FileError{File: file, Line: n.Line, Key: key, Err: fmt.Errorf(format, a...)}
	}
	if m.Kind != yaml.MappingNode {
		return nil, ferr(m, "walls", "must be a mapping with the keys %s, each a metal (e.g. side: copper)", strings.Join(wallKeys, ", "))
	}
	got := map[string]qfactor.Surface{}
	err := eachKey(file, m, "walls", wallKeys, func(k, v *yaml.Node) error {
		key := "walls." + k.Value
		if v.Kind != yaml.ScalarNode {
			return ferr(v, key, "must be a single metal, e.g. copper")
		}
		c, err := physics.ParseConductor(v.Value)
		if err != nil {
			return ferr(v, key, "%v", err)
		}
		s := qfactor.Surface{Conductor: c}
		if err := (qfactor.SameWalls(s)).Validate(); err != nil {
			var we *qfactor.WallError
			if errors.As(err, &we) {
				err = we.Err
			}
			return ferr(v, key, "%v", err)
		}
		got[k.Value] = s
		return nil
	})
	if err != nil {
		return nil, err
	}
	side, ok := got["side"]
	if !ok {
		return nil, ferr(m, "walls.side", "missing: the side-wall metal, which the other surfaces default to")
	}
	w := &axisym.Walls{Set: qfactor.SameWalls(side)}
	if s, ok := got["plate_a"]; ok {
		w.Set.EndA = s
	}
	if s, ok := got["plate_b"]; ok {
		w.Set.EndB = s
	}
	if s, ok := got["steps"]; ok {
		w.Steps = &s
	}
	if s, ok := got["inner"]; ok {
		w.Inner = &s
	}
	return w, nil
}

// parseLayers reads a section's radial layers: a list of mappings with an
// outer radius and an optional fill (vacuum), innermost first.
func parseLayers(file, key string, v *yaml.Node) ([]axisym.Layer, error) {
	ferr := func(n *yaml.Node, key string, format string, a ...any) error {
		return &FileError{File: file, Line: n.Line, Key: key, Err: fmt.Errorf(format, a...)}
	}
	if v.Kind != yaml.SequenceNode || len(v.Content) == 0 {
		return nil, ferr(v, key, "must be a non-empty list of layers (radius, fill), innermost first")
	}
	var out []axisym.Layer
	for i, ln := range v.Content {
		lk := fmt.Sprintf("%s[%d]", key, i+1)
		if ln.Kind != yaml.MappingNode {
			return nil, ferr(ln, lk, "must be a mapping with the keys %s", strings.Join(layerKeys, ", "))
		}
		var l axisym.Layer
		have := false
		err := eachKey(file, ln, lk, layerKeys, func(k, v *yaml.Node) error {
			kk := lk + "." + k.Value
			if v.Kind != yaml.ScalarNode {
				return ferr(v, kk, "must be a single value")
			}
			switch k.Value {
			case "fill":
				d, err := physics.ParseDielectric(v.Value)
				if err != nil {
					return ferr(v, kk, "%v", err)
				}
				l.Medium = d.Medium
			case "radius":
				x, err := cmdutil.LengthOf(v.Value)
				if err != nil {
					return ferr(v, kk, "%v", err)
				}
				if !(x > 0) {
					return ferr(v, kk, "must be > 0, got %s", v.Value)
				}
				l.Radius, have = x, true
			}
			return nil
		})
		if err != nil {
			return nil, err
		}
		if !have {
			return nil, ferr(ln, lk+".radius", "missing")
		}
		out = append(out, l)
	}
	return out, nil
}
