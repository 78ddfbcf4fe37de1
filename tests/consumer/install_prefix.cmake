# cmake -DBUILD_DIR=<build tree> -DPREFIX=<dir> -DINCLUDEDIR=<rel> -DCMAKEDIR=<rel>
#       -P install_prefix.cmake
# Installs only the library component into a fresh PREFIX.
cmake_minimum_required(VERSION 3.20)
file(REMOVE_RECURSE "${PREFIX}")
execute_process(
  COMMAND "${CMAKE_COMMAND}" --install "${BUILD_DIR}" --prefix "${PREFIX}" --component counterflux
  RESULT_VARIABLE rc)
if(NOT rc EQUAL 0)
  message(FATAL_ERROR "install to ${PREFIX} failed (${rc})")
endif()
foreach(expected
    "${INCLUDEDIR}/counterflux/counterflux.hpp"
    "${CMAKEDIR}/counterfluxConfig.cmake"
    "${CMAKEDIR}/counterfluxConfigVersion.cmake"
    "${CMAKEDIR}/counterfluxTargets.cmake")
  if(NOT EXISTS "${PREFIX}/${expected}")
    message(FATAL_ERROR "installed tree lacks ${expected}")
  endif()
endforeach()
message(STATUS "counterflux installed to ${PREFIX}")
