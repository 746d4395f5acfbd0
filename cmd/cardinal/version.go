package main

import (
	"fmt"

	"github.com/spf13/cobra"
)

func newVersionCmd(e *env) *cobra.Command {
	return &cobra.Command{
		Use:   "version",
		Short: "Print the program version",
		Args:  cobra.NoArgs,
		RunE: func(*cobra.Command, []string) error {
			_, err := fmt.Fprintln(e.Out, "cardinal", version)
			return err
		},
	}
}

var version = "0.1.0-dev"
