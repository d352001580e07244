filter --f0 10GHz --bw 200MHz --return-loss 20dB --reject 40dB@10.25GHz,35dB@9.75GHz --zeros 9.8GHz,10.18GHz --mode TE011 --wall copper --format json
