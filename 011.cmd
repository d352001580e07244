modes --diameter 50mm --length 50mm --count 20 --wall copper --format csv
