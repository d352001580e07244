materials --kind dielectric --format json
