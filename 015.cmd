q --mode TM010 --diameter 230mm --length 115mm --wall ofhc-copper
