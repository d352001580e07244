design --mode TE011 --freq 10GHz --ratio-range 5:6 --min-clearance 20%
