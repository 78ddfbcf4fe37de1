# Emulated-MCU images for the arm-none-eabi presets: start-up code, linker script per
# board, semihosting glue, and the QEMU command line that runs an image.
#
#   include(${PROJECT_SOURCE_DIR}/cmake/mcu/CounterfluxMcu.cmake)   (directory scope)
#   counterflux_mcu_image(<target> [STDIO] [NO_HEAP])
#       links <target> (an executable) for COUNTERFLUX_MCU_BOARD: -nostartfiles with
#       cmake/mcu/startup.c, the board's linker script, newlib-nano and semihosting
#       (rdimon; the toolchain file adds --specs=nano.specs), a map file <target>.map and -fstack-usage. STDIO opens newlib's
#       semihosting standard streams at reset (printf, doctest). NO_HEAP wraps every
#       allocation entry point so that any call to one fails the link and names the
#       caller.
#   COUNTERFLUX_MCU_QEMU: the command that runs an image (append the .elf path).
#
# Boards: mps2-an386 (Cortex-M4F) and microbit (Cortex-M0; the Cortex-M0+ builds run
# there, same ARMv6-M instruction set). The toolchain file sets COUNTERFLUX_ARM_CPU.
include_guard(DIRECTORY)
enable_language(C)

set(COUNTERFLUX_MCU_DIR "${CMAKE_CURRENT_LIST_DIR}")

if(COUNTERFLUX_ARM_CPU STREQUAL "cortex-m4f")
  set(_cf_board mps2-an386)
  set(_cf_qemu_machine -M mps2-an386 -cpu cortex-m4)
elseif(COUNTERFLUX_ARM_CPU STREQUAL "cortex-m0plus")
  set(_cf_board microbit)
  set(_cf_qemu_machine -M microbit)
else()
  message(FATAL_ERROR "counterflux mcu: no board for COUNTERFLUX_ARM_CPU='${COUNTERFLUX_ARM_CPU}'")
endif()
set(COUNTERFLUX_MCU_BOARD "${_cf_board}" CACHE STRING "Emulated board the MCU images are linked for")

find_program(COUNTERFLUX_QEMU_ARM qemu-system-arm NO_CMAKE_FIND_ROOT_PATH)
set(COUNTERFLUX_MCU_QEMU_TIMEOUT 300 CACHE STRING "Seconds before a QEMU run is killed")
set(COUNTERFLUX_MCU_QEMU
    "${COUNTERFLUX_QEMU_ARM}" ${_cf_qemu_machine} -nographic -monitor none -serial none
    -semihosting-config enable=on,target=native -kernel)

# The allocation entry points the NO_HEAP images must never reach.
set(COUNTERFLUX_HEAP_SYMBOLS
    malloc calloc realloc free _malloc_r _calloc_r _realloc_r _free_r _sbrk _sbrk_r
    _Znwj _Znaj _ZnwjRKSt9nothrow_t _ZnajRKSt9nothrow_t
    _ZdlPv _ZdaPv _ZdlPvj _ZdaPvj _ZdlPvRKSt9nothrow_t _ZdaPvRKSt9nothrow_t)

if(NOT TARGET counterflux_mcu_startup)
  add_library(counterflux_mcu_startup OBJECT
    "${COUNTERFLUX_MCU_DIR}/startup.c" "${COUNTERFLUX_MCU_DIR}/semihosting.c")
  target_compile_options(counterflux_mcu_startup PRIVATE -Os -Wall -Wextra -Werror -std=c99)
  add_library(counterflux_mcu_startup_stdio OBJECT "${COUNTERFLUX_MCU_DIR}/startup.c")
  target_compile_options(counterflux_mcu_startup_stdio PRIVATE -Os -Wall -Wextra -Werror -std=c99)
  target_compile_definitions(counterflux_mcu_startup_stdio PRIVATE COUNTERFLUX_MCU_STDIO)
  add_library(counterflux_mcu_semihosting OBJECT "${COUNTERFLUX_MCU_DIR}/semihosting.c")
  target_compile_options(counterflux_mcu_semihosting PRIVATE -Os -Wall -Wextra -Werror -std=c99)
endif()

function(counterflux_mcu_image target)
  cmake_parse_arguments(PARSE_ARGV 1 ARG "STDIO;NO_HEAP" "" "")
  if(ARG_STDIO)
    target_sources(${target} PRIVATE $<TARGET_OBJECTS:counterflux_mcu_startup_stdio>
                                     $<TARGET_OBJECTS:counterflux_mcu_semihosting>)
  else()
    target_sources(${target} PRIVATE $<TARGET_OBJECTS:counterflux_mcu_startup>)
  endif()
  target_include_directories(${target} PRIVATE "${COUNTERFLUX_MCU_DIR}")
  target_compile_options(${target} PRIVATE -fstack-usage)
  set(_map "${CMAKE_CURRENT_BINARY_DIR}/${target}.map")
  target_link_options(${target} PRIVATE
    -nostartfiles --specs=rdimon.specs
    "-L${COUNTERFLUX_MCU_DIR}" "-T${COUNTERFLUX_MCU_DIR}/${COUNTERFLUX_MCU_BOARD}.ld"
    "-Wl,-Map=${_map}" -Wl,--gc-sections)
  if(ARG_NO_HEAP)
    foreach(_sym IN LISTS COUNTERFLUX_HEAP_SYMBOLS)
      target_link_options(${target} PRIVATE "-Wl,--wrap=${_sym}")
    endforeach()
  endif()
  set_target_properties(${target} PROPERTIES SUFFIX ".elf"
    LINK_DEPENDS "${COUNTERFLUX_MCU_DIR}/${COUNTERFLUX_MCU_BOARD}.ld;${COUNTERFLUX_MCU_DIR}/sections.ld")
  if(CMAKE_SIZE)
    add_custom_command(TARGET ${target} POST_BUILD
      COMMAND "${CMAKE_SIZE}" "$<TARGET_FILE:${target}>" VERBATIM)
  endif()
endfunction()
