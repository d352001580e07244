package cmdutil

// Version is the release version of cylcav, printed by `cylcav version`
// and written into the datasheets; builds from a checkout add the VCS
// revision when the Go toolchain recorded one (see `cylcav version`).
const Version = "0.1.0"
