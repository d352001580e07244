design --format json
