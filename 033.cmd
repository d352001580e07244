filter --f0 10GHz --bw 20GHz --order 4
