# `counterflux design FILE --json` succeeds, prints one JSON object with every
# contract key, numbers where numbers belong and one Knudsen number per
# [[barrier]]; the human report succeeds too.   -DCOMMAND= -DFILE=
execute_process(COMMAND "${COMMAND}" design "${FILE}" --json
  RESULT_VARIABLE rc OUTPUT_VARIABLE out ERROR_VARIABLE err)
if(NOT rc EQUAL 0)
  message(FATAL_ERROR "design --json ${FILE}: exit ${rc}\n${err}")
endif()
string(JSON type ERROR_VARIABLE json_error TYPE "${out}")
if(json_error OR NOT type STREQUAL "OBJECT")
  message(FATAL_ERROR "design --json ${FILE}: not a JSON object (${json_error}):\n${out}")
endif()
foreach(key current_A sensitivity_A_per_mol_per_mol temperature_coefficient_per_K
            pressure_coefficient_per_Pa linearity_ratio span_factor temperature_K pressure_Pa
            concentration_mol_mol)
  string(JSON t ERROR_VARIABLE e TYPE "${out}" ${key})
  if(e OR NOT t STREQUAL "NUMBER")
    message(FATAL_ERROR "design --json ${FILE}: key '${key}' missing or not a number (${e})")
  endif()
endforeach()
foreach(key knudsen_numbers resistance_shares)
  string(JSON t ERROR_VARIABLE e TYPE "${out}" ${key})
  if(e OR NOT t STREQUAL "ARRAY")
    message(FATAL_ERROR "design --json ${FILE}: key '${key}' missing or not an array (${e})")
  endif()
endforeach()
string(JSON t ERROR_VARIABLE e TYPE "${out}" limiting_element)
if(e OR NOT t STREQUAL "NUMBER")
  message(FATAL_ERROR "design --json ${FILE}: key 'limiting_element' missing (${e})")
endif()

file(STRINGS "${FILE}" barrier_headers REGEX "^[ \t]*\\[\\[barrier\\]\\]")
list(LENGTH barrier_headers barriers)
string(JSON kn LENGTH "${out}" knudsen_numbers)
if(NOT kn EQUAL barriers)
  message(FATAL_ERROR "design --json ${FILE}: ${kn} Knudsen numbers for ${barriers} barrier elements")
endif()
string(JSON current GET "${out}" current_A)
if(NOT current GREATER 0)
  message(FATAL_ERROR "design --json ${FILE}: current_A = ${current}, expected > 0")
endif()

execute_process(COMMAND "${COMMAND}" design "${FILE}"
  RESULT_VARIABLE rc OUTPUT_VARIABLE text ERROR_VARIABLE err)
if(NOT rc EQUAL 0 OR NOT text MATCHES "nA/ppm" OR NOT text MATCHES "limiting element")
  message(FATAL_ERROR "design ${FILE} (human report): exit ${rc}\n${text}\n${err}")
endif()
message(STATUS "ok: ${FILE}: ${kn} elements, current ${current} A")
