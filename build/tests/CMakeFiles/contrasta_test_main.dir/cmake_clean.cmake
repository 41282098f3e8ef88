file(REMOVE_RECURSE
  "CMakeFiles/contrasta_test_main.dir/test_main.cpp.o"
  "CMakeFiles/contrasta_test_main.dir/test_main.cpp.o.d"
)

# Per-language clean rules from dependency scanning.
foreach(lang CXX)
  include(CMakeFiles/contrasta_test_main.dir/cmake_clean_${lang}.cmake OPTIONAL)
endforeach()
