package main

import "github.com/spf13/cobra"

// listOptions are the flags every list command shares: the catalog (the
// persistent --db) and --format.
type listOptions struct {
	env    *env
	DB     string
	Format string
}

// A listCommand describes a command that lists what the catalog holds:
// it takes no argument and prints in --format (table, json, csv or md).
type listCommand struct {
	Use, Short, Long, Example string
	// FormatHelp is the help of --format; "" for the usual words.
	FormatHelp string
}

// newListCmd builds a list command: on the command line it reads --db,
// checks --format and calls run. o is the listOptions of the command's
// own options (which may add flags to the command returned).
func newListCmd(e *env, d listCommand, o *listOptions, run func() error) *cobra.Command {
	o.env = e
	cmd := &cobra.Command{
		Use:     d.Use,
		Short:   d.Short,
		Long:    d.Long,
		Example: d.Example,
		Args:    cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			o.DB = dbFlag(cmd)
			if err := checkFormat(o.Format); err != nil {
				return err
			}
			return run()
		},
	}
	help := d.FormatHelp
	if help == "" {
		help = "output format: table, json, csv or md"
	}
	cmd.Flags().StringVar(&o.Format, "format", "table", help)
	return cmd
}
