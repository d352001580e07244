// Package version implements `cylcav version`.
package version

import (
	"fmt"
	"runtime"
	"runtime/debug"

	"github.com/spf13/cobra"

	"cylcav/cmd/cylcav/internal/cmdutil"
)

// NewCmdVersion returns `cylcav version`.
func NewCmdVersion(io *cmdutil.IOStreams) *cobra.Command {
	return &cobra.Command{
		Use:     "version",
		Short:   "Print the cylcav version",
		Args:    cobra.NoArgs,
		Example: "  $ cylcav version\n  cylcav 0.1.0 (go1.26.8 linux/amd64)",
		RunE: func(cmd *cobra.Command, args []string) error {
			rev := ""
			if bi, ok := debug.ReadBuildInfo(); ok {
				for _, s := range bi.Settings {
					if s.Key == "vcs.revision" && len(s.Value) >= 12 {
						rev = " " + s.Value[:12]
					}
				}
			}
			_, err := fmt.Fprintf(io.Out, "cylcav %s%s (%s %s/%s)\n", cmdutil.Version, rev, runtime.Version(), runtime.GOOS, runtime.GOARCH)
			return err
		},
	}
}
