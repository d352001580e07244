clearance --mode TE011 --diameter 40mm --length 30mm --window 15%
