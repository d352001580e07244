package qfactor

// Combine returns the Q of several independent losses acting together,
// 1/Q = sum of 1/Q_i (Pozar 2012, sec. 6.3, eq. (6.49) as recalled from
// memory, for Q0 = 1/(1/Q_wall + 1/Q_fill)). Infinite terms contribute
// nothing; the result is +Inf when every term is. Combine with no argument
// returns +Inf.
func Combine(q ...float64) float64 {
	s := 0.0
	for _, v := range q {
		s += 1 / v
	}
	return inv(s)
}
