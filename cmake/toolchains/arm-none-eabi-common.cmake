# Shared part of the arm-none-eabi toolchain files. Include after setting
# COUNTERFLUX_ARM_FLAGS (the -mcpu/-mfpu/-mfloat-abi set for the core).
set(CMAKE_SYSTEM_NAME Generic)
set(CMAKE_SYSTEM_PROCESSOR arm)

# A bare-metal toolchain cannot link a test program without a startup file and a
# linker script: let CMake's compiler checks build a static library instead.
set(CMAKE_TRY_COMPILE_TARGET_TYPE STATIC_LIBRARY)

set(_cf_prefix arm-none-eabi-)
if(DEFINED ENV{ARM_NONE_EABI_ROOT})
  set(_cf_prefix "$ENV{ARM_NONE_EABI_ROOT}/bin/arm-none-eabi-")
endif()

set(CMAKE_C_COMPILER   ${_cf_prefix}gcc)
set(CMAKE_CXX_COMPILER ${_cf_prefix}g++)
set(CMAKE_ASM_COMPILER ${_cf_prefix}gcc)
set(CMAKE_AR           ${_cf_prefix}ar CACHE FILEPATH "archiver")
set(CMAKE_RANLIB       ${_cf_prefix}ranlib CACHE FILEPATH "ranlib")
set(CMAKE_OBJCOPY      ${_cf_prefix}objcopy CACHE FILEPATH "objcopy")
set(CMAKE_SIZE         ${_cf_prefix}size CACHE FILEPATH "size")

set(_cf_common_flags "${COUNTERFLUX_ARM_FLAGS} -ffunction-sections -fdata-sections")
set(CMAKE_C_FLAGS_INIT   "${_cf_common_flags}")
set(CMAKE_CXX_FLAGS_INIT "${_cf_common_flags} -fno-exceptions -fno-rtti -fno-threadsafe-statics")
set(CMAKE_ASM_FLAGS_INIT "${COUNTERFLUX_ARM_FLAGS}")
# newlib-nano; the start-up code, linker script and system calls (semihosting) of
# counterflux's own images come from cmake/mcu/CounterfluxMcu.cmake.
set(CMAKE_EXE_LINKER_FLAGS_INIT
    "${COUNTERFLUX_ARM_FLAGS} --specs=nano.specs -Wl,--gc-sections")

# Search the toolchain's sysroot for libraries and headers, the host for programs.
set(CMAKE_FIND_ROOT_PATH_MODE_PROGRAM NEVER)
set(CMAKE_FIND_ROOT_PATH_MODE_LIBRARY ONLY)
set(CMAKE_FIND_ROOT_PATH_MODE_INCLUDE ONLY)
set(CMAKE_FIND_ROOT_PATH_MODE_PACKAGE ONLY)
