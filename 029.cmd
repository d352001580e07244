modes --diameter -3mm --length 50mm
