# Cortex-M0+ (no FPU: float is done in software), bare metal, newlib-nano.
#   cmake --preset arm-m0plus  or     -DCMAKE_TOOLCHAIN_FILE=<this file>
set(COUNTERFLUX_ARM_CPU cortex-m0plus)
set(COUNTERFLUX_ARM_FLAGS "-mcpu=cortex-m0plus -mthumb -mfloat-abi=soft")
include("${CMAKE_CURRENT_LIST_DIR}/arm-none-eabi-common.cmake")
