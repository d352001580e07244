// Command cylcav designs closed circular-cylindrical cavity resonators and
// the bandpass filters built from them. Run `cylcav --help` for the commands.
package main

import (
	"os"

	"cylcav/cmd/cylcav/internal/cmd/root"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

func main() {
	os.Exit(root.Main(cmdutil.System(), os.Args[1:]))
}
