# Empty compiler generated dependencies file for contrasta_exe.
# This may be replaced when dependencies are built.
