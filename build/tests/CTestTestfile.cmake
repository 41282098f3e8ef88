# CMake generated Testfile for 
# Source directory: /work/main/tests
# Build directory: /work/main/build/tests
# 
# This file includes the relevant testing commands required for 
# testing this directory and lists subdirectories to be tested as well.
add_test([=[classical]=] "/work/main/build/tests/classical_test")
set_tests_properties([=[classical]=] PROPERTIES  LABELS "unit" TIMEOUT "600" _BACKTRACE_TRIPLES "/work/main/tests/CMakeLists.txt;19;add_test;/work/main/tests/CMakeLists.txt;0;")
add_test([=[contrast]=] "/work/main/build/tests/contrast_test")
set_tests_properties([=[contrast]=] PROPERTIES  LABELS "unit" TIMEOUT "600" _BACKTRACE_TRIPLES "/work/main/tests/CMakeLists.txt;19;add_test;/work/main/tests/CMakeLists.txt;0;")
add_test([=[decimal]=] "/work/main/build/tests/decimal_test")
set_tests_properties([=[decimal]=] PROPERTIES  LABELS "unit" TIMEOUT "600" _BACKTRACE_TRIPLES "/work/main/tests/CMakeLists.txt;19;add_test;/work/main/tests/CMakeLists.txt;0;")
add_test([=[nist_anova]=] "/work/main/build/tests/nist_anova_test")
set_tests_properties([=[nist_anova]=] PROPERTIES  LABELS "unit" TIMEOUT "600" _BACKTRACE_TRIPLES "/work/main/tests/CMakeLists.txt;19;add_test;/work/main/tests/CMakeLists.txt;0;")
add_test([=[classical_live]=] "/usr/bin/cmake" "-DSCRIPT=/work/main/tests/reference/classical_fixtures.py" "-DTEST=/work/main/build/tests/classical_test" "-DOUT=/work/main/build/tests/classical_live.json" "-P" "/work/main/tests/reference/run_live.cmake")
set_tests_properties([=[classical_live]=] PROPERTIES  LABELS "live" TIMEOUT "600" _BACKTRACE_TRIPLES "/work/main/tests/CMakeLists.txt;34;add_test;/work/main/tests/CMakeLists.txt;0;")
add_test([=[cli_bad_inputs]=] "bash" "/work/main/tests/cli/bad_inputs.sh" "/work/main/build/contrasta" "/work/main/tests")
set_tests_properties([=[cli_bad_inputs]=] PROPERTIES  LABELS "cli" TIMEOUT "600" _BACKTRACE_TRIPLES "/work/main/tests/CMakeLists.txt;49;add_test;/work/main/tests/CMakeLists.txt;0;")
add_test([=[cli_batch]=] "bash" "/work/main/tests/cli/batch.sh" "/work/main/build/contrasta" "/work/main/tests")
set_tests_properties([=[cli_batch]=] PROPERTIES  LABELS "cli" TIMEOUT "600" _BACKTRACE_TRIPLES "/work/main/tests/CMakeLists.txt;49;add_test;/work/main/tests/CMakeLists.txt;0;")
add_test([=[cli_formats]=] "bash" "/work/main/tests/cli/formats.sh" "/work/main/build/contrasta" "/work/main/tests")
set_tests_properties([=[cli_formats]=] PROPERTIES  LABELS "cli" TIMEOUT "600" _BACKTRACE_TRIPLES "/work/main/tests/CMakeLists.txt;49;add_test;/work/main/tests/CMakeLists.txt;0;")
add_test([=[cli_install]=] "bash" "/work/main/tests/cli/install.sh" "/work/main/build/contrasta" "/work/main/tests")
set_tests_properties([=[cli_install]=] PROPERTIES  LABELS "cli" TIMEOUT "600" _BACKTRACE_TRIPLES "/work/main/tests/CMakeLists.txt;49;add_test;/work/main/tests/CMakeLists.txt;0;")
