# Empty compiler generated dependencies file for nist_anova_test.
# This may be replaced when dependencies are built.
