size --mode TE011 --freq 5GHz --ratio 0.5 --fill ptfe
