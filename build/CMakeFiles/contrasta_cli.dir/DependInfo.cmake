
# Consider dependencies only in project.
set(CMAKE_DEPENDS_IN_PROJECT_ONLY OFF)

# The set of languages for which implicit dependencies are needed:
set(CMAKE_DEPENDS_LANGUAGES
  )

# The set of dependency files which are needed:
set(CMAKE_DEPENDS_DEPENDENCY_FILES
  "/work/main/src/cli/common.cpp" "CMakeFiles/contrasta_cli.dir/src/cli/common.cpp.o" "gcc" "CMakeFiles/contrasta_cli.dir/src/cli/common.cpp.o.d"
  "/work/main/src/cli/compare.cpp" "CMakeFiles/contrasta_cli.dir/src/cli/compare.cpp.o" "gcc" "CMakeFiles/contrasta_cli.dir/src/cli/compare.cpp.o.d"
  "/work/main/src/cli/demo.cpp" "CMakeFiles/contrasta_cli.dir/src/cli/demo.cpp.o" "gcc" "CMakeFiles/contrasta_cli.dir/src/cli/demo.cpp.o.d"
  "/work/main/src/cli/format.cpp" "CMakeFiles/contrasta_cli.dir/src/cli/format.cpp.o" "gcc" "CMakeFiles/contrasta_cli.dir/src/cli/format.cpp.o.d"
  "/work/main/src/cli/json.cpp" "CMakeFiles/contrasta_cli.dir/src/cli/json.cpp.o" "gcc" "CMakeFiles/contrasta_cli.dir/src/cli/json.cpp.o.d"
  "/work/main/src/cli/pending_commands.cpp" "CMakeFiles/contrasta_cli.dir/src/cli/pending_commands.cpp.o" "gcc" "CMakeFiles/contrasta_cli.dir/src/cli/pending_commands.cpp.o.d"
  "/work/main/src/cli/run.cpp" "CMakeFiles/contrasta_cli.dir/src/cli/run.cpp.o" "gcc" "CMakeFiles/contrasta_cli.dir/src/cli/run.cpp.o.d"
  "/work/main/src/cli/write_compare.cpp" "CMakeFiles/contrasta_cli.dir/src/cli/write_compare.cpp.o" "gcc" "CMakeFiles/contrasta_cli.dir/src/cli/write_compare.cpp.o.d"
  )

# Targets to which this target links.
set(CMAKE_TARGET_LINKED_INFO_FILES
  "/work/main/build/CMakeFiles/contrasta.dir/DependInfo.cmake"
  )

# Fortran module output directory.
set(CMAKE_Fortran_TARGET_MODULE_DIR "")
