
# Consider dependencies only in project.
set(CMAKE_DEPENDS_IN_PROJECT_ONLY OFF)

# The set of languages for which implicit dependencies are needed:
set(CMAKE_DEPENDS_LANGUAGES
  )

# The set of dependency files which are needed:
set(CMAKE_DEPENDS_DEPENDENCY_FILES
  "/work/main/src/anova.cpp" "CMakeFiles/contrasta.dir/src/anova.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/anova.cpp.o.d"
  "/work/main/src/classical.cpp" "CMakeFiles/contrasta.dir/src/classical.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/classical.cpp.o.d"
  "/work/main/src/comparison.cpp" "CMakeFiles/contrasta.dir/src/comparison.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/comparison.cpp.o.d"
  "/work/main/src/contrast.cpp" "CMakeFiles/contrasta.dir/src/contrast.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/contrast.cpp.o.d"
  "/work/main/src/dataset.cpp" "CMakeFiles/contrasta.dir/src/dataset.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/dataset.cpp.o.d"
  "/work/main/src/decimal.cpp" "CMakeFiles/contrasta.dir/src/decimal.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/decimal.cpp.o.d"
  "/work/main/src/distributions.cpp" "CMakeFiles/contrasta.dir/src/distributions.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/distributions.cpp.o.d"
  "/work/main/src/family.cpp" "CMakeFiles/contrasta.dir/src/family.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/family.cpp.o.d"
  "/work/main/src/methods.cpp" "CMakeFiles/contrasta.dir/src/methods.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/methods.cpp.o.d"
  "/work/main/src/multiplicity.cpp" "CMakeFiles/contrasta.dir/src/multiplicity.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/multiplicity.cpp.o.d"
  "/work/main/src/options.cpp" "CMakeFiles/contrasta.dir/src/options.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/options.cpp.o.d"
  "/work/main/src/overall.cpp" "CMakeFiles/contrasta.dir/src/overall.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/overall.cpp.o.d"
  "/work/main/src/pending_methods.cpp" "CMakeFiles/contrasta.dir/src/pending_methods.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/pending_methods.cpp.o.d"
  "/work/main/src/prepared.cpp" "CMakeFiles/contrasta.dir/src/prepared.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/prepared.cpp.o.d"
  "/work/main/src/read.cpp" "CMakeFiles/contrasta.dir/src/read.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/read.cpp.o.d"
  "/work/main/src/recommend.cpp" "CMakeFiles/contrasta.dir/src/recommend.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/recommend.cpp.o.d"
  "/work/main/src/summary.cpp" "CMakeFiles/contrasta.dir/src/summary.cpp.o" "gcc" "CMakeFiles/contrasta.dir/src/summary.cpp.o.d"
  )

# Targets to which this target links.
set(CMAKE_TARGET_LINKED_INFO_FILES
  )

# Fortran module output directory.
set(CMAKE_Fortran_TARGET_MODULE_DIR "")
