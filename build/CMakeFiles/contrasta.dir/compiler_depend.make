# Empty compiler generated dependencies file for contrasta.
# This may be replaced when dependencies are built.
