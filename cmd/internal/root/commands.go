package root

import (
	"github.com/spf13/cobra"

	"biasbin/cmd/internal/backupcmd"
	"biasbin/cmd/internal/buildcmd"
	"biasbin/cmd/internal/checkcmd"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/democmd"
	"biasbin/cmd/internal/diagnosecmd"
	"biasbin/cmd/internal/ledgercmd"
	"biasbin/cmd/internal/pickcmd"
	"biasbin/cmd/internal/stockcmd"
	"biasbin/cmd/internal/substitutecmd"
)

// subcommands lists the top-level commands in help order.
func subcommands(f *cmdutil.Factory) []*cobra.Command {
	return []*cobra.Command{
		pickcmd.New(f),
		checkcmd.New(f),
		substitutecmd.New(f),
		diagnosecmd.New(f),
		checkcmd.NewPlot(f),
		democmd.New(f),
		buildcmd.New(f),
		ledgercmd.New(f),
		stockcmd.New(f),
		backupcmd.New(f),
	}
}
