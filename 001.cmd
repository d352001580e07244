design
