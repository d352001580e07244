chart --diameter 39.6mm --length 39.6mm --mode TE011 --tuning 2% --tolerance 0.02mm --min-clearance 3% -o chart.svg
