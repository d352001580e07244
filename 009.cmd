modes --diameter 50mm --length 50mm --count 14
