# CMake package config for building outside frostline plugins against the
# engine headers that the frostline wheel ships.
#
#   find_package(frostline CONFIG REQUIRED)   # with -Dfrostline_DIR=$(python -c "import frostline; print(frostline.get_cmake_dir())")
#   target_link_libraries(my_module PRIVATE frostline::engine)
#
# frostline::engine is header-only: include directories plus the flags that
# keep samples bit-identical across machines (no floating-point contraction).
get_filename_component(_frostline_root "${CMAKE_CURRENT_LIST_DIR}/../../.." ABSOLUTE)
if(NOT TARGET frostline::engine)
  add_library(frostline::engine INTERFACE IMPORTED)
  set_target_properties(frostline::engine PROPERTIES
    INTERFACE_INCLUDE_DIRECTORIES "${_frostline_root}/include"
    INTERFACE_COMPILE_FEATURES cxx_std_17
    INTERFACE_COMPILE_OPTIONS "-ffp-contract=off")
endif()
set(frostline_INCLUDE_DIR "${_frostline_root}/include")
set(frostline_FOUND TRUE)
