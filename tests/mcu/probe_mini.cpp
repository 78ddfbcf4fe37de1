// Probe of tests/mcu/mini/doctest/doctest.h: subcases run once each with doctest's
// re-run rule (a case with two leaf subcases under one parent runs three times: a,
// b/1, b/2), a failing CHECK and a failing REQUIRE fail their cases, the summary
// counts them. Expected exit status: 1, with "2 failed" in the summary.
#define DOCTEST_CONFIG_IMPLEMENT_WITH_MAIN
#include <doctest/doctest.h>

namespace {
int runs = 0, a = 0, b = 0, b1 = 0, b2 = 0;
}

TEST_CASE("mini: subcases") {
    ++runs;
    SUBCASE("a") { ++a; }
    SUBCASE("b") {
        ++b;
        SUBCASE("b/1") { ++b1; }
        SUBCASE("b/2") { ++b2; }
    }
}

TEST_CASE("mini: subcase counts") {
    INFO("runs " << runs << " a " << a << " b " << b << " b1 " << b1 << " b2 " << b2);
    CHECK(runs == 3);
    CHECK(a == 1);
    CHECK(b == 2);
    CHECK(b1 == 1);
    CHECK(b2 == 1);
    CHECK(0.1 + 0.2 == doctest::Approx(0.3));
    CHECK_FALSE(1.0 == doctest::Approx(1.001));
}

TEST_CASE_TEMPLATE("mini: a failing CHECK fails the case", T, float) {
    CHECK(T(1) == T(2));
}

TEST_CASE("mini: a failing REQUIRE ends the case") {
    REQUIRE(false);
    CHECK(false);  // not reached: one failed assertion in this case
}
