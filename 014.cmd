q --mode TE011 --diameter 54.8016mm --length 54.8016mm --fill eps=2.08,tand=4e-4 --wall sigma=5.813e7
