# Empty compiler generated dependencies file for contrasta_test_main.
# This may be replaced when dependencies are built.
