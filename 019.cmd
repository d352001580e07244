tune --mode TE011 --diameter 40mm --length-range 28mm:32mm --steps 5
