# The atomic writer seen from the command line:
#  1. a run that fails on bad input leaves an existing --out file as it was;
#  2. a run that fails while writing (--out names a directory) leaves that
#     directory alone, exits 1, and leaves no temporary file;
#  3. a good run replaces the file with the complete report;
#  and no temporary file is ever left in the output directory.
#   -DCOMMAND= -DGOOD=<sensor file> -DBAD=<broken sensor file> -DWORK=<scratch dir>
file(REMOVE_RECURSE "${WORK}")
file(MAKE_DIRECTORY "${WORK}")
set(out "${WORK}/report.json")
file(WRITE "${out}" "previous good report\n")

function(no_temporaries where)
  file(GLOB left RELATIVE "${WORK}" "${WORK}/.*" "${WORK}/*.tmp*")
  if(left)
    message(FATAL_ERROR "${where}: temporary files left behind: ${left}")
  endif()
endfunction()

execute_process(COMMAND "${COMMAND}" design "${BAD}" --json --out "${out}"
  RESULT_VARIABLE rc OUTPUT_VARIABLE o ERROR_VARIABLE e)
if(NOT rc EQUAL 2)
  message(FATAL_ERROR "bad input: exit ${rc}, expected 2\n${e}")
endif()
file(READ "${out}" content)
if(NOT content STREQUAL "previous good report\n")
  message(FATAL_ERROR "bad input: the existing output was changed:\n${content}")
endif()
no_temporaries("bad input")

file(MAKE_DIRECTORY "${WORK}/taken")
file(WRITE "${WORK}/taken/keep.txt" "keep\n")
execute_process(COMMAND "${COMMAND}" design "${GOOD}" --json --out "${WORK}/taken"
  RESULT_VARIABLE rc OUTPUT_VARIABLE o ERROR_VARIABLE e)
if(NOT rc EQUAL 1)
  message(FATAL_ERROR "--out naming a directory: exit ${rc}, expected 1\n${e}")
endif()
if(NOT e MATCHES "^counterflux: error: cannot write")
  message(FATAL_ERROR "--out naming a directory: unexpected message:\n${e}")
endif()
if(NOT EXISTS "${WORK}/taken/keep.txt")
  message(FATAL_ERROR "--out naming a directory: the directory was disturbed")
endif()
no_temporaries("write failure")

execute_process(COMMAND "${COMMAND}" design "${GOOD}" --json --out "${out}"
  RESULT_VARIABLE rc OUTPUT_VARIABLE o ERROR_VARIABLE e)
if(NOT rc EQUAL 0)
  message(FATAL_ERROR "good run: exit ${rc}\n${e}")
endif()
if(NOT o STREQUAL "")
  message(FATAL_ERROR "good run with --out also printed to standard output:\n${o}")
endif()
file(READ "${out}" content)
string(JSON current ERROR_VARIABLE je GET "${content}" current_A)
if(je)
  message(FATAL_ERROR "good run: the output is not the complete JSON report (${je}):\n${content}")
endif()
no_temporaries("good run")
message(STATUS "ok: atomic output")
