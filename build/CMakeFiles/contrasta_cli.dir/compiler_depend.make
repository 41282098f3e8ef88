# Empty compiler generated dependencies file for contrasta_cli.
# This may be replaced when dependencies are built.
