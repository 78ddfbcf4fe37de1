// The single main() of counterflux_unit_tests. Other tests/unit/*.cpp files only
// include <doctest/doctest.h> and never define DOCTEST_CONFIG_IMPLEMENT*.
#define DOCTEST_CONFIG_IMPLEMENT_WITH_MAIN
#include <doctest/doctest.h>
