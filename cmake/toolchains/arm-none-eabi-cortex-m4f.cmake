# Cortex-M4F (single-precision FPU, hard-float ABI), bare metal, newlib-nano.
#   cmake --preset arm-m4f     or     -DCMAKE_TOOLCHAIN_FILE=<this file>
set(COUNTERFLUX_ARM_CPU cortex-m4f)
set(COUNTERFLUX_ARM_FLAGS "-mcpu=cortex-m4 -mthumb -mfloat-abi=hard -mfpu=fpv4-sp-d16")
include("${CMAKE_CURRENT_LIST_DIR}/arm-none-eabi-common.cmake")
