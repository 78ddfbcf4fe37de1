# Strict warning set used for counterflux's own targets.
#
#   counterflux_strict_warnings(<target> [INTERFACE|PUBLIC|PRIVATE])
#       -Wall -Wextra -Wpedantic -Wconversion -Wdouble-promotion -Wshadow
#       (+ -Werror when COUNTERFLUX_WERROR is ON)
#   counterflux_freestanding_flags(<target> [scope])
#       -fno-exceptions -fno-rtti, the way firmware compiles the library
include_guard(GLOBAL)

set(COUNTERFLUX_STRICT_WARNINGS
    -Wall -Wextra -Wpedantic -Wconversion -Wdouble-promotion -Wshadow)

function(counterflux_strict_warnings target)
  set(scope PRIVATE)
  if(ARGC GREATER 1)
    set(scope ${ARGV1})
  endif()
  if(CMAKE_CXX_COMPILER_ID MATCHES "GNU|Clang")
    target_compile_options(${target} ${scope} ${COUNTERFLUX_STRICT_WARNINGS})
    if(COUNTERFLUX_WERROR)
      target_compile_options(${target} ${scope} -Werror)
    endif()
  elseif(MSVC)
    target_compile_options(${target} ${scope} /W4 /permissive-)
    if(COUNTERFLUX_WERROR)
      target_compile_options(${target} ${scope} /WX)
    endif()
  endif()
endfunction()

function(counterflux_freestanding_flags target)
  set(scope PRIVATE)
  if(ARGC GREATER 1)
    set(scope ${ARGV1})
  endif()
  if(CMAKE_CXX_COMPILER_ID MATCHES "GNU|Clang")
    target_compile_options(${target} ${scope} -fno-exceptions -fno-rtti)
  endif()
endfunction()
