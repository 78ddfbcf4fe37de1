// A minimal stand-in for doctest's interface, for MCU test images too small for
// doctest itself (doctest reports through std::ostream, whose locale machinery alone
// outgrows the 256 KiB of QEMU's microbit). Only what tests/unit uses:
//   TEST_CASE, TEST_CASE_TEMPLATE, SUBCASE (doctest's re-run semantics, nested too),
//   CHECK, CHECK_FALSE, REQUIRE, REQUIRE_FALSE, the binary CHECK_EQ .. REQUIRE_GE,
//   *_MESSAGE, FAIL, FAIL_CHECK, INFO, CAPTURE, MESSAGE, doctest::Approx (WARN does nothing)
// and main() under DOCTEST_CONFIG_IMPLEMENT_WITH_MAIN. A failure prints the file, the
// line, the expression as written (not its decomposed values) and the active INFO
// lines; REQUIRE ends the test case with longjmp (no exceptions). Output goes through
// semihosting (cmake/mcu/counterflux_mcu.h); no heap, no stdio.
#ifndef COUNTERFLUX_MCU_MINI_DOCTEST_H
#define COUNTERFLUX_MCU_MINI_DOCTEST_H

#include <cmath>
#include <csetjmp>
#include <cstddef>
#include <cstdint>
#include <type_traits>

#include "counterflux_mcu.h"

namespace doctest {

// |lhs - value| < epsilon (scale + max(|lhs|, |value|)), as doctest's Approx.
class Approx {
public:
    explicit Approx(double value) : value_(value) {}
    Approx& epsilon(double e) { epsilon_ = e; return *this; }
    Approx& scale(double s) { scale_ = s; return *this; }
    friend bool operator==(double lhs, const Approx& rhs) {
        const double m = std::fabs(lhs) > std::fabs(rhs.value_) ? std::fabs(lhs) : std::fabs(rhs.value_);
        return std::fabs(lhs - rhs.value_) < rhs.epsilon_ * (rhs.scale_ + m);
    }
    friend bool operator==(const Approx& lhs, double rhs) { return rhs == lhs; }
    friend bool operator!=(double lhs, const Approx& rhs) { return !(lhs == rhs); }
    friend bool operator!=(const Approx& lhs, double rhs) { return !(rhs == lhs); }

private:
    double value_;
    double epsilon_ = 1.1920929e-05;   // doctest's default: 100 float epsilons
    double scale_ = 1.0;
};

namespace mini {

// Text sink for INFO and MESSAGE: strings, integers, reals (7 significant digits).
struct ostream {
    ostream& operator<<(const char* s) { cf_mcu_write(s != nullptr ? s : "(null)"); return *this; }
    ostream& operator<<(char* s) { return *this << static_cast<const char*>(s); }
    ostream& operator<<(char c) { const char t[2] = {c, '\0'}; cf_mcu_write(t); return *this; }
    ostream& operator<<(bool b) { return *this << (b ? "true" : "false"); }
    template <class S>
    auto operator<<(const S& s) -> decltype(s.c_str(), *this) { return *this << s.c_str(); }
    template <class I, typename std::enable_if<std::is_integral<I>::value || std::is_enum<I>::value, int>::type = 0>
    ostream& operator<<(I i) {
        const long long v = static_cast<long long>(i);
        if (v < 0) cf_mcu_write("-");
        unsigned long long m = v < 0 ? 0ull - static_cast<unsigned long long>(v) : static_cast<unsigned long long>(v);
        char d[24];
        int n = 23;
        d[n] = '\0';
        do { d[--n] = static_cast<char>('0' + m % 10u); m /= 10u; } while (m != 0u && n > 0);
        cf_mcu_write(&d[n]);
        return *this;
    }
    ostream& operator<<(float x) { return real(static_cast<double>(x)); }
    ostream& operator<<(double x) { return real(x); }
    ostream& operator<<(long double x) { return real(static_cast<double>(x)); }

    ostream& real(double x) {
        if (std::isnan(x)) return *this << "nan";
        if (x < 0.0) { cf_mcu_write("-"); x = -x; }
        if (std::isinf(x)) return *this << "inf";
        if (x == 0.0) return *this << "0";
        int e = static_cast<int>(std::floor(std::log10(x)));
        double m = x / std::pow(10.0, e);
        long long digits = static_cast<long long>(m * 1e6 + 0.5);
        if (digits >= 10000000) { digits /= 10; ++e; }
        char t[10];
        t[0] = static_cast<char>('0' + digits / 1000000);
        t[1] = '.';
        for (int i = 7; i >= 2; --i) { t[i] = static_cast<char>('0' + digits % 10); digits /= 10; }
        t[8] = '\0';
        cf_mcu_write(t);
        if (e != 0) { *this << "e" << e; }
        return *this;
    }
};

using test_fn = void (*)();
struct test_case { const char* name; const char* type; const char* file; int line; test_fn fn; test_case* next; };
struct info_node { void (*print)(const info_node*, ostream&); const info_node* prev; };

struct state {
    test_case* first = nullptr;
    test_case* last = nullptr;
    const info_node* infos = nullptr;
    std::jmp_buf abort_case;
    unsigned failed_checks = 0;
    unsigned checks = 0;
    bool case_failed = false;
    // SUBCASE bookkeeping for one test case (doctest's rule: each run enters the first
    // subcase at each level not yet finished; the case re-runs until all are).
    static constexpr int max_depth = 8;
    static constexpr int max_done = 64;
    std::uint32_t done[max_done] = {};
    int done_count = 0;
    std::uint32_t path[max_depth + 1] = {};
    bool entered[max_depth + 1] = {};
    bool pending[max_depth + 1] = {};
    int depth = 0;
    bool rerun = false;
};

inline state& global() {
    static state s;
    return s;
}

inline int add(test_case* c) {
    state& s = global();
    if (s.last != nullptr) s.last->next = c; else s.first = c;
    s.last = c;
    return 0;
}

template <class T> constexpr const char* type_name() {
    return std::is_same<T, float>::value ? "float" : std::is_same<T, double>::value ? "double"
         : std::is_same<T, long double>::value ? "long double" : "T";
}

template <class R, class... Ts>
int add_template(const char* name, const char* file, int line) {
    static test_case cases[sizeof...(Ts)] = {{name, type_name<Ts>(), file, line, &R::template run<Ts>, nullptr}...};
    for (test_case& c : cases) add(&c);
    return 0;
}

inline void report(const char* file, int line, const char* kind, const char* expr) {
    state& s = global();
    ostream o;
    o << file << ":" << line << ": ERROR: " << kind << "( " << expr << " ) is NOT correct!\n";
    for (const info_node* n = s.infos; n != nullptr; n = n->prev) {
        o << "  logged: ";
        n->print(n, o);
        o << "\n";
    }
    ++s.failed_checks;
    s.case_failed = true;
}

inline void check(bool ok, const char* file, int line, const char* kind, const char* expr, bool require) {
    state& s = global();
    ++s.checks;
    if (ok) return;
    report(file, line, kind, expr);
    if (require) std::longjmp(s.abort_case, 1);
}

template <class F>
struct info_scope : info_node {
    explicit info_scope(F f) : info_node{&info_scope::call, global().infos}, fn(f) { global().infos = this; }
    ~info_scope() { global().infos = prev; }
    info_scope(const info_scope&) = delete;
    info_scope& operator=(const info_scope&) = delete;
    static void call(const info_node* n, ostream& o) { static_cast<const info_scope*>(n)->fn(o); }
    F fn;
};

struct subcase {
    subcase(int line) {
        state& s = global();
        const int d = s.depth;
        const std::uint32_t h = (s.path[d] ^ static_cast<std::uint32_t>(line)) * 16777619u + 2166136261u;
        bool finished = false;
        for (int i = 0; i < s.done_count; ++i) finished = finished || s.done[i] == h;
        if (finished || d >= state::max_depth) return;
        if (s.entered[d]) { s.pending[d] = true; s.rerun = true; return; }
        s.entered[d] = true;
        s.depth = d + 1;
        s.path[d + 1] = h;
        s.entered[d + 1] = false;
        s.pending[d + 1] = false;
        active = true;
    }
    ~subcase() {
        if (!active) return;
        state& s = global();
        const int inner = s.depth;
        if (!s.pending[inner] && s.done_count < state::max_done) s.done[s.done_count++] = s.path[inner];
        s.depth = inner - 1;
    }
    subcase(const subcase&) = delete;
    subcase& operator=(const subcase&) = delete;
    explicit operator bool() const { return active; }
    bool active = false;
};

inline int run_all() {
    state& s = global();
    ostream o;
    unsigned cases = 0, failed_cases = 0;
    for (test_case* c = s.first; c != nullptr; c = c->next) {
        ++cases;
        s.case_failed = false;
        s.done_count = 0;
        for (int run = 0; run < 256; ++run) {
            s.depth = 0;
            s.path[0] = 0u;
            s.entered[0] = false;
            s.pending[0] = false;
            s.rerun = false;
            s.infos = nullptr;
            if (setjmp(s.abort_case) == 0) {
                c->fn();
            } else {
                s.rerun = false;   // a REQUIRE failed: the case is over
            }
            if (!s.rerun) break;
        }
        if (s.case_failed) {
            ++failed_cases;
            o << "  in TEST CASE: " << c->name;
            if (c->type != nullptr) o << "<" << c->type << ">";
            o << " (" << c->file << ":" << c->line << ")\n";
        }
    }
    o << "[mini-doctest] test cases: " << cases << " | " << (cases - failed_cases) << " passed | "
      << failed_cases << " failed\n";
    o << "[mini-doctest] assertions: " << s.checks << " | " << (s.checks - s.failed_checks) << " passed | "
      << s.failed_checks << " failed\n";
    o << "[mini-doctest] Status: " << (failed_cases == 0 ? "SUCCESS!" : "FAILURE!") << "\n";
    return failed_cases == 0 ? 0 : 1;
}

}  // namespace mini
}  // namespace doctest

#define DOCTEST_MINI_CAT2(a, b) a##b
#define DOCTEST_MINI_CAT(a, b) DOCTEST_MINI_CAT2(a, b)
#define DOCTEST_MINI_NAME(p) DOCTEST_MINI_CAT(p, __LINE__)

#define DOCTEST_MINI_CASE(f, name)                                                              \
    static void f();                                                                            \
    namespace {                                                                                 \
    ::doctest::mini::test_case DOCTEST_MINI_CAT(f, _case){name, nullptr, __FILE__, __LINE__, &f, \
                                                          nullptr};                             \
    const int DOCTEST_MINI_CAT(f, _reg) = ::doctest::mini::add(&DOCTEST_MINI_CAT(f, _case));   \
    }                                                                                           \
    static void f()
#define TEST_CASE(name) DOCTEST_MINI_CASE(DOCTEST_MINI_NAME(doctest_mini_case_), name)

#define DOCTEST_MINI_TEMPLATE(f, name, T, ...)                                                  \
    template <class T> static void f();                                                         \
    namespace {                                                                                 \
    struct DOCTEST_MINI_CAT(f, _runner) {                                                       \
        template <class T> static void run() { f<T>(); }                                        \
    };                                                                                          \
    const int DOCTEST_MINI_CAT(f, _reg) =                                                       \
        ::doctest::mini::add_template<DOCTEST_MINI_CAT(f, _runner), __VA_ARGS__>(name, __FILE__, \
                                                                                 __LINE__);     \
    }                                                                                           \
    template <class T> static void f()
#define TEST_CASE_TEMPLATE(name, T, ...) \
    DOCTEST_MINI_TEMPLATE(DOCTEST_MINI_NAME(doctest_mini_template_), name, T, __VA_ARGS__)

#define SUBCASE(name) \
    if (const ::doctest::mini::subcase DOCTEST_MINI_NAME(doctest_mini_subcase_){__LINE__}; \
        DOCTEST_MINI_NAME(doctest_mini_subcase_))

#define CHECK(...) ::doctest::mini::check(static_cast<bool>(__VA_ARGS__), __FILE__, __LINE__, "CHECK", #__VA_ARGS__, false)
#define CHECK_FALSE(...) ::doctest::mini::check(!(__VA_ARGS__), __FILE__, __LINE__, "CHECK_FALSE", #__VA_ARGS__, false)
#define REQUIRE(...) ::doctest::mini::check(static_cast<bool>(__VA_ARGS__), __FILE__, __LINE__, "REQUIRE", #__VA_ARGS__, true)
#define REQUIRE_FALSE(...) ::doctest::mini::check(!(__VA_ARGS__), __FILE__, __LINE__, "REQUIRE_FALSE", #__VA_ARGS__, true)
#define WARN(...) static_cast<void>(__VA_ARGS__)
#define WARN_FALSE(...) static_cast<void>(__VA_ARGS__)
#define DOCTEST_MINI_BINARY(kind, op, require, a, b) \
    ::doctest::mini::check(static_cast<bool>((a)op(b)), __FILE__, __LINE__, kind, #a " " #op " " #b, require)
#define CHECK_EQ(a, b) DOCTEST_MINI_BINARY("CHECK_EQ", ==, false, a, b)
#define CHECK_NE(a, b) DOCTEST_MINI_BINARY("CHECK_NE", !=, false, a, b)
#define CHECK_LT(a, b) DOCTEST_MINI_BINARY("CHECK_LT", <, false, a, b)
#define CHECK_GT(a, b) DOCTEST_MINI_BINARY("CHECK_GT", >, false, a, b)
#define CHECK_LE(a, b) DOCTEST_MINI_BINARY("CHECK_LE", <=, false, a, b)
#define CHECK_GE(a, b) DOCTEST_MINI_BINARY("CHECK_GE", >=, false, a, b)
#define REQUIRE_EQ(a, b) DOCTEST_MINI_BINARY("REQUIRE_EQ", ==, true, a, b)
#define REQUIRE_NE(a, b) DOCTEST_MINI_BINARY("REQUIRE_NE", !=, true, a, b)
#define REQUIRE_LT(a, b) DOCTEST_MINI_BINARY("REQUIRE_LT", <, true, a, b)
#define REQUIRE_GT(a, b) DOCTEST_MINI_BINARY("REQUIRE_GT", >, true, a, b)
#define REQUIRE_LE(a, b) DOCTEST_MINI_BINARY("REQUIRE_LE", <=, true, a, b)
#define REQUIRE_GE(a, b) DOCTEST_MINI_BINARY("REQUIRE_GE", >=, true, a, b)
#define CHECK_MESSAGE(cond, ...) \
    do { INFO(__VA_ARGS__); CHECK(cond); } while (false)
#define REQUIRE_MESSAGE(cond, ...) \
    do { INFO(__VA_ARGS__); REQUIRE(cond); } while (false)
#define FAIL_CHECK(...) \
    do { INFO(__VA_ARGS__); ::doctest::mini::check(false, __FILE__, __LINE__, "FAIL_CHECK", "", false); } while (false)
#define FAIL(...) \
    do { INFO(__VA_ARGS__); ::doctest::mini::check(false, __FILE__, __LINE__, "FAIL", "", true); } while (false)
#define INFO(...)                                                             \
    const ::doctest::mini::info_scope DOCTEST_MINI_NAME(doctest_mini_info_){ \
        [&](::doctest::mini::ostream& doctest_mini_out) { doctest_mini_out << __VA_ARGS__; }}
#define CAPTURE(x) INFO(#x " := " << (x))
#define MESSAGE(...)                                                                        \
    do {                                                                                    \
        ::doctest::mini::ostream doctest_mini_out;                                          \
        doctest_mini_out << __FILE__ << ":" << __LINE__ << ": MESSAGE: " << __VA_ARGS__ << "\n"; \
    } while (false)

#if defined(DOCTEST_CONFIG_IMPLEMENT_WITH_MAIN)
int main() { return ::doctest::mini::run_all(); }
#endif

#endif
