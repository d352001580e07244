q --mode TE011 --diameter 50mm --length 50mm --wall unobtainium
