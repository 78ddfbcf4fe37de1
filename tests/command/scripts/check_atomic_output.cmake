# The atomic writer seen from the command line:
#  1. a run that fails on bad input leaves an existing --out file as it was;
#  2. a run whose --out names a directory, or a FIFO, is refused as bad input
#     (exit 2), leaves that directory or FIFO alone and no temporary file;
#  2a. an empty --out is bad input (exit 2);
#  2b. a run whose --out is a symbolic link writes through it: the link stays;
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

# An empty --out is bad input (exit 2), named as the flag, and writes nothing.
execute_process(COMMAND "${COMMAND}" design "${GOOD}" --json --out ""
  RESULT_VARIABLE rc OUTPUT_VARIABLE o ERROR_VARIABLE e)
if(NOT rc EQUAL 2 OR NOT e MATCHES "^counterflux: error: --out: the path is empty; expected a file name\n$" OR
   NOT o STREQUAL "")
  message(FATAL_ERROR "--out \"\": exit ${rc}, expected 2\nstdout:\n${o}\nstderr:\n${e}")
endif()
no_temporaries("empty --out")

file(MAKE_DIRECTORY "${WORK}/taken")
file(WRITE "${WORK}/taken/keep.txt" "keep\n")
execute_process(COMMAND "${COMMAND}" design "${GOOD}" --json --out "${WORK}/taken"
  RESULT_VARIABLE rc OUTPUT_VARIABLE o ERROR_VARIABLE e)
if(NOT rc EQUAL 2)
  message(FATAL_ERROR "--out naming a directory: exit ${rc}, expected 2\n${e}")
endif()
if(NOT e MATCHES "^counterflux: error: cannot write '[^']*taken': it is a directory")
  message(FATAL_ERROR "--out naming a directory: unexpected message:\n${e}")
endif()
if(NOT EXISTS "${WORK}/taken/keep.txt")
  message(FATAL_ERROR "--out naming a directory: the directory was disturbed")
endif()
no_temporaries("write failure")

find_program(MKFIFO mkfifo)
if(MKFIFO)
  execute_process(COMMAND "${MKFIFO}" "${WORK}/pipe" RESULT_VARIABLE made)
  if(made EQUAL 0)
    execute_process(COMMAND "${COMMAND}" design "${GOOD}" --json --out "${WORK}/pipe"
      RESULT_VARIABLE rc OUTPUT_VARIABLE o ERROR_VARIABLE e)
    if(NOT rc EQUAL 2 OR NOT e MATCHES "is a FIFO")
      message(FATAL_ERROR "--out naming a FIFO: exit ${rc}, expected 2\n${e}")
    endif()
    execute_process(COMMAND test -p "${WORK}/pipe" RESULT_VARIABLE still_fifo)
    if(NOT still_fifo EQUAL 0)
      message(FATAL_ERROR "--out naming a FIFO: the FIFO was replaced")
    endif()
    file(REMOVE "${WORK}/pipe")
    no_temporaries("FIFO")
  endif()
endif()

file(MAKE_DIRECTORY "${WORK}/real")
file(WRITE "${WORK}/real/target.json" "old\n")
file(CREATE_LINK "real/target.json" "${WORK}/link.json" SYMBOLIC)
execute_process(COMMAND "${COMMAND}" design "${GOOD}" --json --out "${WORK}/link.json"
  RESULT_VARIABLE rc OUTPUT_VARIABLE o ERROR_VARIABLE e)
if(NOT rc EQUAL 0)
  message(FATAL_ERROR "--out naming a symbolic link: exit ${rc}\n${e}")
endif()
if(NOT IS_SYMLINK "${WORK}/link.json")
  message(FATAL_ERROR "--out naming a symbolic link: the link was replaced by a file")
endif()
file(READ "${WORK}/real/target.json" content)
string(JSON current ERROR_VARIABLE je GET "${content}" current_A)
if(je)
  message(FATAL_ERROR "--out naming a symbolic link: the file it leads to is not the report (${je}):\n${content}")
endif()
file(GLOB left RELATIVE "${WORK}/real" "${WORK}/real/.*")
if(left)
  message(FATAL_ERROR "--out naming a symbolic link: temporary files left behind: ${left}")
endif()
file(REMOVE "${WORK}/link.json")
file(REMOVE_RECURSE "${WORK}/real")

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
