# Empty dependencies file for classical_test.
# This may be replaced when dependencies are built.
