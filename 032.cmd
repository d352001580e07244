design --mode TE011 --freq NaN
