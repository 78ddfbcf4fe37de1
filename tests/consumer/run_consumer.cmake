# cmake -DCONSUMER_SOURCE=<dir> -DCONSUMER_BINARY=<dir> [-DCONSUMER_ARGS=a|b|...]
#       [-DCONSUMER_GENERATOR=...] [-DCONSUMER_MAKE_PROGRAM=...]
#       [-DCONSUMER_CXX_COMPILER=...] [-DCONSUMER_BUILD_TYPE=...] -P run_consumer.cmake
# Configures CONSUMER_SOURCE from scratch, builds it, and runs its `consumer` program.
cmake_minimum_required(VERSION 3.20)

file(REMOVE_RECURSE "${CONSUMER_BINARY}")

set(args -S "${CONSUMER_SOURCE}" -B "${CONSUMER_BINARY}"
         -DCMAKE_FIND_USE_PACKAGE_REGISTRY=OFF)
if(CONSUMER_GENERATOR)
  list(APPEND args -G "${CONSUMER_GENERATOR}")
endif()
if(CONSUMER_MAKE_PROGRAM)
  list(APPEND args "-DCMAKE_MAKE_PROGRAM=${CONSUMER_MAKE_PROGRAM}")
endif()
if(CONSUMER_CXX_COMPILER)
  list(APPEND args "-DCMAKE_CXX_COMPILER=${CONSUMER_CXX_COMPILER}")
endif()
if(CONSUMER_BUILD_TYPE)
  list(APPEND args "-DCMAKE_BUILD_TYPE=${CONSUMER_BUILD_TYPE}")
endif()
if(CONSUMER_ARGS)
  string(REPLACE "|" ";" extra "${CONSUMER_ARGS}")
  list(APPEND args ${extra})
endif()

function(run what)
  execute_process(COMMAND ${ARGN} RESULT_VARIABLE rc COMMAND_ECHO STDOUT)
  if(NOT rc EQUAL 0)
    message(FATAL_ERROR "consumer ${what} failed (${rc})")
  endif()
endfunction()

run(configure "${CMAKE_COMMAND}" ${args})
run(build "${CMAKE_COMMAND}" --build "${CONSUMER_BINARY}")
if(EXISTS "${CONSUMER_BINARY}/consumer")
  run(run "${CONSUMER_BINARY}/consumer")
elseif(EXISTS "${CONSUMER_BINARY}/consumer.exe")
  run(run "${CONSUMER_BINARY}/consumer.exe")
else()
  message(FATAL_ERROR "consumer program was not built")
endif()
