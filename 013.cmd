size --mode TE011 --freq 10GHz --ratio 1 --format csv
