file(REMOVE_RECURSE
  "CMakeFiles/contrasta_cli.dir/src/cli/common.cpp.o"
  "CMakeFiles/contrasta_cli.dir/src/cli/common.cpp.o.d"
  "CMakeFiles/contrasta_cli.dir/src/cli/compare.cpp.o"
  "CMakeFiles/contrasta_cli.dir/src/cli/compare.cpp.o.d"
  "CMakeFiles/contrasta_cli.dir/src/cli/demo.cpp.o"
  "CMakeFiles/contrasta_cli.dir/src/cli/demo.cpp.o.d"
  "CMakeFiles/contrasta_cli.dir/src/cli/format.cpp.o"
  "CMakeFiles/contrasta_cli.dir/src/cli/format.cpp.o.d"
  "CMakeFiles/contrasta_cli.dir/src/cli/json.cpp.o"
  "CMakeFiles/contrasta_cli.dir/src/cli/json.cpp.o.d"
  "CMakeFiles/contrasta_cli.dir/src/cli/pending_commands.cpp.o"
  "CMakeFiles/contrasta_cli.dir/src/cli/pending_commands.cpp.o.d"
  "CMakeFiles/contrasta_cli.dir/src/cli/run.cpp.o"
  "CMakeFiles/contrasta_cli.dir/src/cli/run.cpp.o.d"
  "CMakeFiles/contrasta_cli.dir/src/cli/write_compare.cpp.o"
  "CMakeFiles/contrasta_cli.dir/src/cli/write_compare.cpp.o.d"
  "libcontrasta_cli.a"
  "libcontrasta_cli.pdb"
)

# Per-language clean rules from dependency scanning.
foreach(lang CXX)
  include(CMakeFiles/contrasta_cli.dir/cmake_clean_${lang}.cmake OPTIONAL)
endforeach()
