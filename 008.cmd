design --mode TE011 --freq 10GHz --wall copper --tolerance 0.02mm --samples 2000 --seed 3
