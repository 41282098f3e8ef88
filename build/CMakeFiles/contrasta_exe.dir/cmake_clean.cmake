file(REMOVE_RECURSE
  "CMakeFiles/contrasta_exe.dir/src/cli/main.cpp.o"
  "CMakeFiles/contrasta_exe.dir/src/cli/main.cpp.o.d"
  "contrasta"
  "contrasta.pdb"
)

# Per-language clean rules from dependency scanning.
foreach(lang CXX)
  include(CMakeFiles/contrasta_exe.dir/cmake_clean_${lang}.cmake OPTIONAL)
endforeach()
