package axisym

// illinois narrows a bracket (lo, hi) that holds exactly one root, where an
// exact count, not the sign of a function, says which side of the root a
// point lies on. Each step is a regula falsi step on g with the Illinois
// weighting (Dowell and Jarratt 1971, BIT 11, 168-174) when g changes sign
// across the bracket and the step lands inside it, and a bisection
// otherwise (or after three steps that failed to halve the bracket). probe
// returns g at x and whether x lies on lo's side; the count alone decides,
// so a pole of g can slow the search but never mislead it. It stops after
// iters steps or once done(lo, hi), and returns the bracket's midpoint.
func illinois(lo, hi, glo, ghi float64, iters int, done func(lo, hi float64) bool, probe func(x float64) (g float64, low bool)) float64 {
	side, stall := 0, 0
	for range iters {
		w := hi - lo
		if done(lo, hi) {
			break
		}
		x := 0.5 * (lo + hi)
		if stall < 3 && glo*ghi < 0 {
			if s := lo - glo*w/(ghi-glo); s > lo && s < hi {
				x = s
			}
		} else {
			stall = 0 // this step bisects
		}
		g, low := probe(x)
		if low {
			if side == -1 {
				ghi /= 2
			}
			lo, glo, side = x, g, -1
		} else {
			if side == 1 {
				glo /= 2
			}
			hi, ghi, side = x, g, 1
		}
		if hi-lo > 0.5*w {
			stall++
		} else {
			stall = 0
		}
	}
	return 0.5 * (lo + hi)
}
