filter --f0 10GHz --bw 100MHz --order 5 --ripple 0.05dB --format csv
