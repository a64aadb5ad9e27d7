package main

import (
	"github.com/spf13/cobra"

	"forelay/scenario"
)

// SchemaOptions are the settings of "forelay schema".
type SchemaOptions struct {
	IO *IOStreams
}

func newCmdSchema(f *Factory, runF func(*SchemaOptions) error) *cobra.Command {
	opts := &SchemaOptions{IO: f.IO}
	return &cobra.Command{
		Use:   "schema",
		Short: "Print a JSON Schema of the scenario file, for editors",
		Long:  helpText("schema"),
		Example: `  forelay schema > forelay.schema.json
  # then, as the first line of a scenario file:
  # yaml-language-server: $schema=forelay.schema.json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if runF != nil {
				return runF(opts)
			}
			return schemaRun(opts)
		},
	}
}

// schemaRun prints the schema on Out.
func schemaRun(opts *SchemaOptions) error {
	_, err := opts.IO.Out.Write(scenario.Schema())
	return err
}
