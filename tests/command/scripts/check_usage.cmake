# Usage errors and flag errors exit 2 with one-line messages; --help exits 0.
#   -DCOMMAND= -DGOOD=<sensor file> -DWORK=<scratch dir> -DBAD_DIR=<tests/data/bad>
function(expect rc_wanted pattern)
  execute_process(COMMAND "${COMMAND}" ${ARGN}
    RESULT_VARIABLE rc OUTPUT_VARIABLE o ERROR_VARIABLE e)
  if(NOT rc STREQUAL "${rc_wanted}")
    message(FATAL_ERROR "counterflux ${ARGN}: exit ${rc}, expected ${rc_wanted}\n${o}\n${e}")
  endif()
  if(NOT "${o}${e}" MATCHES "${pattern}")
    message(FATAL_ERROR "counterflux ${ARGN}: output does not match '${pattern}':\n${o}\n${e}")
  endif()
  if("${e}" MATCHES "terminate called|what\\(\\)")
    message(FATAL_ERROR "counterflux ${ARGN}: looks like a crash:\n${e}")
  endif()
endfunction()

expect(0 "Usage" --help)
expect(0 "Usage: counterflux design" design --help)
expect(0 "Usage: counterflux diffusivity" diffusivity --help)
expect(0 "counterflux [0-9]" --version)
expect(2 "^counterflux: error: " )
expect(2 "^counterflux: error: unknown verb 'frobnicate'; known verbs: diffusivity, design" frobnicate)
expect(2 "^counterflux: error: unknown verb 'desing' \\(did you mean 'design'\\?\\)" desing "${GOOD}")
expect(2 "^counterflux: error: no verb given; expected one of: diffusivity, design")
expect(2 "^counterflux: error: unknown option '--frob' before the verb" --frob)
expect(2 "^counterflux: error: FILE is required; run 'counterflux design --help'" design)
expect(2 "^counterflux: error: " design)
expect(2 "^counterflux: error: " design "${GOOD}" --no-such-flag)
expect(2 "^counterflux: error: --temperature: unknown unit 'psi'" design "${GOOD}" --temperature "3 psi")
expect(2 "^counterflux: error: --temperature: .*below absolute zero" design "${GOOD}" --temperature "-300 C")
expect(2 "^counterflux: error: --pressure: .*is a length" design "${GOOD}" --pressure "1 mm")
expect(2 "^counterflux: error: --concentration 120 %: outside 0 .. 100 %" design "${GOOD}" --concentration "120 %")
expect(2 "^counterflux: error: --temperature 1e30 K: outside 100 K .. 1000 K" design "${GOOD}" --temperature "1e30 K")
expect(2 "^counterflux: error: --temperature 50 K: outside 100 K .. 1000 K" design "${GOOD}" --temperature "50 K")
expect(2 "^counterflux: error: --pressure 1e300: outside 100 Pa .. 10000 kPa" design "${GOOD}" --pressure 1e300)
expect(2 "^counterflux: error: --pressure 1 Pa: outside 100 Pa .. 10000 kPa" diffusivity CO air --pressure "1 Pa")
expect(2 "^counterflux: error: --temperature 2: the reduced temperature T\\* = .* = 0.081 is outside the Neufeld fit range 0.3 .. 100"
       diffusivity He H2 --temperature 2 --method chapman-enskog)
expect(2 "^counterflux: error: --temperature 2: outside 100 K .. 1000 K" diffusivity He H2 --temperature 2)
expect(2 "^counterflux: error: --temperature 150 K: the reduced temperature T\\* .* is outside the Neufeld fit range"
       diffusivity H2O NH3 --temperature "150 K" --method chapman-enskog)
expect(0 "m2/s" diffusivity H2O NH3 --temperature "150 K")
expect(2 "^counterflux: error: --concentration: malformed number" design "${GOOD}" --concentration "1.2.3 ppm")
expect(2 "^counterflux: error: --temperature: " diffusivity CO air --temperature nan)
expect(2 "^counterflux: error: --method" diffusivity CO air --method wilke)
expect(2 "^counterflux: error: .*unknown gas 'CO3'.*known formulas" diffusivity CO3 air)
expect(2 "^${WORK}/none.toml: error: cannot open" design "${WORK}/none.toml")
expect(0 "m2/s" diffusivity CO air)
expect(0 "\"diffusivity_m2_s\"" diffusivity N2 O2 --method chapman-enskog --temperature "25 C" --pressure "1 atm" --json)
# A failure of the library at a condition set by flags names those flags, and
# blames the part of the file that cannot be resolved there.
file(MAKE_DIRECTORY "${WORK}")
file(READ "${BAD_DIR}/chapman_enskog_fit_range.toml" text)
string(REPLACE "\"150 K\"" "\"300 K\"" text "${text}")
file(WRITE "${WORK}/h2o_in_nh3.toml" "${text}")
expect(0 "nA/ppm" design "${WORK}/h2o_in_nh3.toml")
expect(2 "^counterflux: error: --temperature 150 K, --pressure 1 bar: cannot compute the current.*\n[^\n]*h2o_in_nh3.toml:15:10: error: the diffusivity of H2O in NH3 \\(chapman-enskog\\).*Neufeld fit range"
       design "${WORK}/h2o_in_nh3.toml" --temperature "150 K" --pressure "1 bar")
file(READ "${BAD_DIR}/stagnant_series_full_range.toml" text)
string(REPLACE "\"100 %\"" "\"50 %\"" text "${text}")
file(WRITE "${WORK}/stagnant_series.toml" "${text}")
expect(0 "nA/ppm" design "${WORK}/stagnant_series.toml")
expect(2 "^counterflux: error: --concentration 100 %: cannot compute the current at 100 %[^\n]*\ncounterflux: error: --concentration 100 %: the stagnant-film log law has no finite current at 100 % \\(singular at y = 1/alpha = 1\\); lower --concentration below 100 %"
       design "${WORK}/stagnant_series.toml" --concentration "100 %")
# With flux_ratio = 10 the log law is singular at y = 1/11: the message names the flux ratio.
file(READ "${BAD_DIR}/flux_ratio_ten_full_scale.toml" text)
string(REPLACE "\"50 %\"" "\"5 %\"" text "${text}")
file(WRITE "${WORK}/flux_ratio_ten.toml" "${text}")
expect(0 "nA/ppm" design "${WORK}/flux_ratio_ten.toml")
expect(2 "\ncounterflux: error: --concentration 10 %: with 'sensor.flux_ratio' = 10 \\(alpha = 1 \\+ N_B/N_A = 11\\) the log law has no finite current at 10 % \\(singular at y = 1/alpha = 1/11 = 9.091 %\\); lower --concentration below 9.091 %"
       design "${WORK}/flux_ratio_ten.toml" --concentration "10 %")

# Help and version printed to a full standard output is a failure (exit 1), not
# a success: the reader of the help never got it.
if(EXISTS /dev/full)
  foreach(args "--help" "design;--help" "--version")
    execute_process(COMMAND "${COMMAND}" ${args} OUTPUT_FILE /dev/full
      RESULT_VARIABLE rc ERROR_VARIABLE e)
    if(NOT rc STREQUAL "1" OR NOT e MATCHES "^counterflux: error: cannot write to standard output")
      message(FATAL_ERROR "counterflux ${args} > /dev/full: exit ${rc}, expected 1\n${e}")
    endif()
  endforeach()
endif()
message(STATUS "ok: usage")
