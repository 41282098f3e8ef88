file(REMOVE_RECURSE
  "CMakeFiles/nist_anova_test.dir/nist_anova_test.cpp.o"
  "CMakeFiles/nist_anova_test.dir/nist_anova_test.cpp.o.d"
  "nist_anova_test"
  "nist_anova_test.pdb"
)

# Per-language clean rules from dependency scanning.
foreach(lang CXX)
  include(CMakeFiles/nist_anova_test.dir/cmake_clean_${lang}.cmake OPTIONAL)
endforeach()
