package touchstone

import (
	"fmt"
	"math"
	"math/cmplx"
	"path/filepath"
	"strconv"
	"strings"
)

// Data is the network data of a one- or two-port Touchstone file, in SI
// units and as complex S-parameters whatever the file's format.
type Data struct {
	// Version is "1.1" or "2.0", the version the file declared (a file
	// without [Version] is 1.1).
	Version string

	// Ports is the number of ports, 1 or 2.
	Ports int

	// Z0 is the reference impedance of each port, in ohm (len Ports).
	Z0 []float64

	// Freq holds the frequencies in hertz, strictly ascending.
	Freq []float64

	// S holds the S-parameters: S[i*Ports+j][k] is S_(i+1)(j+1) at Freq[k].
	// Use Param to read one of them.
	S [][]complex128

	// Comments are the comment lines, without the leading "!" and
	// surrounding spaces, in file order.
	Comments []string
}

// Param returns the sweep of S_ij over Freq, with i and j counted from 1 as
// in S21. It panics if i or j is not a port of d (a programming error).
func (d *Data) Param(i, j int) []complex128 {
	if i < 1 || j < 1 || i > d.Ports || j > d.Ports {
		panic(fmt.Sprintf("touchstone: S%d%d of a %d-port", i, j, d.Ports))
	}
	return d.S[(i-1)*d.Ports+(j-1)]
}

// Validate reports whether d is a well-formed one- or two-port sweep: at
// least one point, positive finite frequencies strictly ascending, finite
// S-parameters, positive finite reference impedances.
func (d *Data) Validate() error {
	if d.Ports != 1 && d.Ports != 2 {
		return fmt.Errorf("touchstone: %d ports, only 1 and 2 are supported", d.Ports)
	}
	if len(d.Freq) == 0 {
		return fmt.Errorf("touchstone: Touchstone file needs at least one frequency point")
	}
	if len(d.Z0) != d.Ports {
		return fmt.Errorf("touchstone: %d reference impedances for %d ports", len(d.Z0), d.Ports)
	}
	for i, z := range d.Z0 {
		if !(z > 0) || math.IsInf(z, 0) {
			return fmt.Errorf("touchstone: reference impedance of port %d must be > 0 ohm and finite, got %g ohm", i+1, z)
		}
	}
	if len(d.S) != d.Ports*d.Ports {
		return fmt.Errorf("touchstone: %d S-parameters for %d ports, want %d", len(d.S), d.Ports, d.Ports*d.Ports)
	}
	for _, s := range d.S {
		if len(s) != len(d.Freq) {
			return fmt.Errorf("touchstone: S-parameter with %d points for %d frequencies", len(s), len(d.Freq))
		}
	}
	for k, f := range d.Freq {
		if !(f > 0) || math.IsInf(f, 0) {
			return fmt.Errorf("touchstone: point %d: frequency must be > 0 Hz and finite, got %g Hz", k+1, f)
		}
		if k > 0 && !(f > d.Freq[k-1]) {
			return fmt.Errorf("touchstone: frequencies must be strictly ascending, point %d (%g Hz) follows %g Hz", k+1, f, d.Freq[k-1])
		}
		for _, s := range d.S {
			if cmplx.IsNaN(s[k]) || cmplx.IsInf(s[k]) {
				return fmt.Errorf("touchstone: point %d at %g Hz has a non-finite S-parameter %v", k+1, f, s[k])
			}
		}
	}
	return nil
}

// PortsFromName returns the port count a Touchstone 1.1 file name states by
// its extension (".s1p" gives 1, ".s2p" gives 2, any case), or 0 when the
// name has no such extension.
func PortsFromName(name string) int {
	ext := strings.ToLower(filepath.Ext(name))
	if len(ext) < 4 || ext[1] != 's' || ext[len(ext)-1] != 'p' {
		return 0
	}
	n, err := strconv.Atoi(ext[2 : len(ext)-1])
	if err != nil || n < 1 {
		return 0
	}
	return n
}
