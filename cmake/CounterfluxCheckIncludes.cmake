# cmake -DINCLUDE_ROOT=<dir> [-DSTAMP=<file>] -P CounterfluxCheckIncludes.cmake
#
# Fails when a header under INCLUDE_ROOT/counterflux includes anything other than
# another counterflux header or one of the standard headers the firmware rules allow.
cmake_minimum_required(VERSION 3.20)

if(NOT DEFINED INCLUDE_ROOT)
  message(FATAL_ERROR "INCLUDE_ROOT is not set")
endif()

set(allowed cstdint cstddef cmath limits type_traits array utility)

file(GLOB_RECURSE headers "${INCLUDE_ROOT}/counterflux/*.hpp" "${INCLUDE_ROOT}/counterflux/*.h")
set(bad "")
foreach(header IN LISTS headers)
  file(STRINGS "${header}" lines REGEX "^[ \t]*#[ \t]*include")
  file(RELATIVE_PATH rel "${INCLUDE_ROOT}" "${header}")
  foreach(line IN LISTS lines)
    if(line MATCHES "#[ \t]*include[ \t]*<([^>]+)>")
      set(name "${CMAKE_MATCH_1}")
      if(name MATCHES "^counterflux/")
        continue()
      endif()
      list(FIND allowed "${name}" index)
      if(index EQUAL -1)
        list(APPEND bad "${rel}: <${name}> is not an allowed include")
      endif()
    elseif(line MATCHES "#[ \t]*include[ \t]*\"([^\"]+)\"")
      # Quoted includes must stay inside the library.
      get_filename_component(dir "${header}" DIRECTORY)
      get_filename_component(target "${dir}/${CMAKE_MATCH_1}" ABSOLUTE)
      string(FIND "${target}" "${INCLUDE_ROOT}/counterflux/" pos)
      if(NOT pos EQUAL 0 OR NOT EXISTS "${target}")
        list(APPEND bad "${rel}: \"${CMAKE_MATCH_1}\" is not a counterflux header")
      endif()
    endif()
  endforeach()
endforeach()

if(bad)
  list(JOIN bad "\n  " text)
  message(FATAL_ERROR "counterflux include check failed:\n  ${text}\n"
                      "allowed standard headers: ${allowed}")
endif()

if(DEFINED STAMP)
  file(TOUCH "${STAMP}")
endif()
