# Runs COMMAND (arguments separated by |) and fails unless it exits with EXPECTED and, when MATCH is
# set, its output contains MATCH.   cmake -DCOMMAND=... -DEXPECTED=n [-DMATCH=text] -P
string(REPLACE "|" ";" COMMAND "${COMMAND}")
execute_process(COMMAND ${COMMAND} RESULT_VARIABLE status OUTPUT_VARIABLE out ERROR_VARIABLE err
                TIMEOUT 60)
message("${out}${err}")
if(NOT status STREQUAL "${EXPECTED}")
  message(FATAL_ERROR "exit status ${status}, expected ${EXPECTED}")
endif()
if(DEFINED MATCH AND NOT "${out}${err}" MATCHES "${MATCH}")
  message(FATAL_ERROR "output does not contain '${MATCH}'")
endif()
