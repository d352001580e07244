design --mode TE011 --freq 10GHz --wall copper --ratio-range 0.5:3 --tuning 1% --tolerance 0.02mm
