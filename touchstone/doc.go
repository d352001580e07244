// Package touchstone reads and writes Touchstone files: the open text format
// for the network parameters of an n-port measured by a vector network
// analyser or computed by a simulator.
//
// Read accepts version 1.1 (port count from the file name's ".sNp"
// extension, or from the first data line) and version 2.0 (the [Version],
// [Number of Ports], [Two-Port Data Order], [Number of Frequencies],
// [Reference] and [Matrix Format] keywords) for one- and two-port
// S-parameter files: data as real/imaginary (RI), magnitude/angle (MA) or
// dB/angle (DB), any frequency unit (HZ, KHZ, MHZ, GHZ), comments after
// "!" anywhere, and the reference impedance of each port. Two-port noise
// data is recognised and skipped. Files with three or more ports, and Y, Z,
// H or G parameters, are refused with an error that says so. A malformed
// file gives a *ParseError carrying the line number.
//
// Write writes version 1.1 files (frequencies in hertz, RI data) and is the
// one writer behind every Touchstone file cylcav produces.
//
// The reader is written here rather than taken from a library: the format is
// small and fully specified, we found no maintained Go package for it, and
// a reader of our own lets every malformed line be reported with its line
// number and every limit of the format be checked the way the rest of
// cylcav checks its input. It is checked against an independent reader
// (scikit-rf) by a script under touchstone/testdata.
//
// References:
//   - EIA/IBIS Open Forum, Touchstone File Format Specification, version
//     1.1 (2002) and version 2.0 (2009).
package touchstone
