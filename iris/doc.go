// Package iris realises the couplings of a coupled-cavity filter as holes
// you can machine: centred circular irises between in-line TE0mp or TM0mp
// cavities solved exactly by the axisymmetric mode-matching solver
// (package axisym), the end irises to circular waveguide ports through a
// port function (external Q), and off-axis holes for cross couplings by
// Bethe's small-aperture theory with the wall-thickness correction
// (package filter), each with one verdict on where its method holds.
//
// It sits above axisym and filter in the package graph and imports both.
package iris
