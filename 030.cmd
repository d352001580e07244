size --mode TE010 --freq 10GHz --ratio 1
