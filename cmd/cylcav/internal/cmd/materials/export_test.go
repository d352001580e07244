package materials

// CSVHeader exports the CSV header to the external tests.
var CSVHeader = csvHeader
