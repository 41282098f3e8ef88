#----------------------------------------------------------------
# Generated CMake target import file for configuration "Release".
#----------------------------------------------------------------

# Commands may need to know the format version.
set(CMAKE_IMPORT_FILE_VERSION 1)

# Import target "contrasta::contrasta" for configuration "Release"
set_property(TARGET contrasta::contrasta APPEND PROPERTY IMPORTED_CONFIGURATIONS RELEASE)
set_target_properties(contrasta::contrasta PROPERTIES
  IMPORTED_LINK_INTERFACE_LANGUAGES_RELEASE "CXX"
  IMPORTED_LOCATION_RELEASE "${_IMPORT_PREFIX}/lib/libcontrasta.a"
  )

list(APPEND _cmake_import_check_targets contrasta::contrasta )
list(APPEND _cmake_import_check_files_for_contrasta::contrasta "${_IMPORT_PREFIX}/lib/libcontrasta.a" )

# Commands beyond this point should not need to know the version.
set(CMAKE_IMPORT_FILE_VERSION)
