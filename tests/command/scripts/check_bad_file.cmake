# Runs `counterflux design FILE --json` on one broken sensor file and checks
# the exit status and the first line of standard error against one row of
# tests/data/bad/expected.tsv.
#   -DCOMMAND=<counterflux>  -DFILE=<path>  -DEXIT=<status>  -DLINE=<n>
#   -DCOLUMN=<n or *>  -DNEEDLE=<substring of the message>  [-DNEEDLE2=<another one>]
# (two substrings because a row cannot hold a semicolon: "KEY = V is out of
# range" and "expected RULE" sit on either side of one)
foreach(var COMMAND FILE EXIT LINE COLUMN NEEDLE)
  if(NOT DEFINED ${var})
    message(FATAL_ERROR "check_bad_file.cmake: -D${var}= is required")
  endif()
endforeach()

execute_process(
  COMMAND "${COMMAND}" design "${FILE}" --json
  RESULT_VARIABLE rc
  OUTPUT_VARIABLE out
  ERROR_VARIABLE err)

if(NOT rc STREQUAL "${EXIT}")
  message(FATAL_ERROR "${FILE}: exit status ${rc}, expected ${EXIT}\nstderr:\n${err}")
endif()
if(NOT out STREQUAL "")
  message(FATAL_ERROR "${FILE}: a failed run printed to standard output:\n${out}")
endif()

string(REGEX REPLACE "\n.*" "" first "${err}")
if(COLUMN STREQUAL "*")
  set(prefix "${FILE}:${LINE}:")
else()
  set(prefix "${FILE}:${LINE}:${COLUMN}: error: ")
endif()
string(FIND "${first}" "${prefix}" at)
if(NOT at EQUAL 0)
  message(FATAL_ERROR "${FILE}: first diagnostic does not start with '${prefix}':\n${first}")
endif()
if(NOT first MATCHES ": error: ")
  message(FATAL_ERROR "${FILE}: first diagnostic is not in FILE:LINE:COLUMN: error: form:\n${first}")
endif()
foreach(needle "${NEEDLE}" "${NEEDLE2}")
  if(needle STREQUAL "")
    continue()
  endif()
  string(FIND "${first}" "${needle}" found)
  if(found EQUAL -1)
    message(FATAL_ERROR "${FILE}: first diagnostic does not mention '${needle}':\n${first}")
  endif()
endforeach()
foreach(word "terminate called" "Aborted" "Segmentation" "what():")
  string(FIND "${err}" "${word}" crash)
  if(NOT crash EQUAL -1)
    message(FATAL_ERROR "${FILE}: looks like a crash:\n${err}")
  endif()
endforeach()
message(STATUS "ok: ${first}")
