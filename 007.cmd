design --mode TM010 --freq 1.3GHz --wall copper --tuning 1% --format csv
