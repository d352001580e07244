design --mode TE011 --freq 10GHz --wall copper --tuning 1% --temp -20C:60C --tolerance 0.02mm --format json
