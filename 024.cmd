chart --mode TE011 --freq 5GHz --ratio 1 --fill ptfe --units ghz-mm --axes linear -o chart2.svg
