// Package root assembles the cylcav command tree and maps errors to exit
// statuses.
package root

import (
	"errors"
	"fmt"
	"io/fs"

	"github.com/spf13/cobra"

	"cylcav/cmd/cylcav/internal/cmd/chart"
	"cylcav/cmd/cylcav/internal/cmd/clearance"
	"cylcav/cmd/cylcav/internal/cmd/design"
	"cylcav/cmd/cylcav/internal/cmd/filter"
	"cylcav/cmd/cylcav/internal/cmd/materials"
	"cylcav/cmd/cylcav/internal/cmd/modes"
	"cylcav/cmd/cylcav/internal/cmd/report"
	"cylcav/cmd/cylcav/internal/cmd/resonances"
	"cylcav/cmd/cylcav/internal/cmd/size"
	"cylcav/cmd/cylcav/internal/cmd/stack"
	"cylcav/cmd/cylcav/internal/cmd/tune"
	"cylcav/cmd/cylcav/internal/cmd/unloadedq"
	"cylcav/cmd/cylcav/internal/cmd/version"
	"cylcav/cmd/cylcav/internal/cmdutil"
)

// NewCmdRoot returns the cylcav root command with every subcommand.
func NewCmdRoot(io *cmdutil.IOStreams) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "cylcav <command> [flags]",
		Short: "Design closed circular-cylindrical cavity resonators and cavity filters",
		Long: `cylcav designs closed circular-cylindrical cavity resonators and the
bandpass filters built from them: exact resonant frequencies of every TE and
TM mode, sizing for a target frequency, spurious-mode clearance, unloaded Q,
mode charts and filter synthesis.

Mode index convention: TE_nmp and TM_nmp with n azimuthal (cos n phi),
m radial (m-th Bessel zero), p axial (half-wavelengths along the length).

Units: lengths m, cm, mm, um, in, mil; frequencies Hz, kHz, MHz, GHz.
A length or frequency other than 0 needs its unit (a bare 176.5 is
refused with a hint). JSON and CSV output use SI base units.`,
		SilenceUsage:  true,
		SilenceErrors: true,
		// A flag given without the flag it needs is refused before any
		// command's own checks (cmdutil.Needs).
		PersistentPreRunE: func(c *cobra.Command, _ []string) error {
			return cmdutil.CheckNeeds(c)
		},
	}
	cmd.SetOut(io.Out)
	cmd.SetErr(io.ErrOut)
	cmd.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		if cmdutil.IsValueError(err) {
			return &cmdutil.UsageError{Err: cmdutil.FlagValueError(err)}
		}
		return &cmdutil.UsageError{Err: fmt.Errorf("%w (see '%s --help')", cmdutil.FlagValueError(err), c.CommandPath())}
	})

	cmd.AddCommand(version.NewCmdVersion(io))
	cmd.AddCommand(materials.NewCmdMaterials(io, nil))
	cmd.AddCommand(modes.NewCmdModes(io, nil))
	cmd.AddCommand(unloadedq.NewCmdQ(io, nil))
	cmd.AddCommand(size.NewCmdSize(io, nil))
	cmd.AddCommand(design.NewCmdDesign(io, nil))
	cmd.AddCommand(clearance.NewCmdClearance(io, nil))
	cmd.AddCommand(tune.NewCmdTune(io, nil))
	cmd.AddCommand(chart.NewCmdChart(io, nil))
	cmd.AddCommand(filter.NewCmdFilter(io, nil))
	cmd.AddCommand(report.NewCmdReport(io, nil))
	cmd.AddCommand(resonances.NewCmdResonances(io, nil))
	cmd.AddCommand(stack.NewCmdStack(io, nil))
	requireShell(cmd)
	cmdutil.HardenFlags(cmd)
	return cmd
}

// Main runs cylcav with the given arguments and returns the exit status:
// 0 on success, 2 for bad input, 1 for any other failure.
//
// Standard output goes through a cmdutil.CheckedWriter: a run whose output
// could not be written (a full disk, a closed pipe) fails with status 1,
// whichever command it was.
func Main(streams *cmdutil.IOStreams, args []string) int {
	out := cmdutil.NewCheckedWriter(streams.Out)
	io := *streams
	io.Out = out
	cmd := NewCmdRoot(&io)
	cmd.SetArgs(args)
	// Cobra reports unknown commands, bad arguments, unknown flags and
	// missing required flags as plain errors before any command runs; those
	// are usage errors too. Errors from a running command keep their own
	// status, so every RunE is wrapped to record that it started.
	started := false
	markStarted(cmd, &started)
	err := cmd.Execute()
	if werr := out.Err(); err == nil && werr != nil {
		var pe *fs.PathError
		if errors.As(werr, &pe) {
			werr = pe.Err
		}
		err = fmt.Errorf("writing standard output: %w", werr)
	}
	if err != nil {
		if !started && !cmdutil.IsUsage(err) && out.Err() == nil {
			err = &cmdutil.UsageError{Err: err}
		}
		fmt.Fprintf(io.ErrOut, "cylcav: %s\n", cmdutil.Message(err))
		return cmdutil.ExitStatus(err)
	}
	return 0
}

// markStarted wraps the RunE of cmd and all its subcommands so that *started
// becomes true when a command body begins to run.
func markStarted(cmd *cobra.Command, started *bool) {
	if run := cmd.RunE; run != nil {
		cmd.RunE = func(c *cobra.Command, args []string) error {
			*started = true
			return run(c, args)
		}
	}
	for _, sub := range cmd.Commands() {
		markStarted(sub, started)
	}
}

// requireShell makes `cylcav completion` without a shell, or with an
// unknown one, a usage error; cobra's default command would print its
// help and exit 0.
func requireShell(cmd *cobra.Command) {
	cmd.InitDefaultCompletionCmd()
	for _, c := range cmd.Commands() {
		if c.Name() == "completion" && c.Run == nil && c.RunE == nil {
			c.RunE = func(c *cobra.Command, args []string) error {
				return cmdutil.Usagef("%s needs a shell: bash, zsh, fish or powershell", c.Name())
			}
		}
	}
}
