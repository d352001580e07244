report -o datasheet.html
