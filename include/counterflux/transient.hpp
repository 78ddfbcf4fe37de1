// counterflux/transient.hpp - step response of the diffusion chain of a sensor
// (docs/models.md, "Step response").
//
// Dilute, linear regime. The chain runs from the sample gas to the electrode:
// an optional flushed volume (V, sample flow Q), diffusion layers (D, A, L and
// the partition coefficient K = c_inside / c_gas at equilibrium: 1 for a
// capillary, the porosity for a porous element, Pi R T / D for a membrane),
// lumped gas volumes (V), and the sink: perfect, or first order with a rate k
// (m/s) over the electrode area. Inside a layer dc/dt = D d2c/dx2; at an
// interface the flux is continuous and the concentration jumps by K.
//
// Written in the gas-equivalent concentration u = c / K, which is continuous
// across every interface, the chain is a ladder of capacities (K A h per cell,
// V per volume, mol per mol/m3) and conductances (D K A / h between cell
// centres, harmonic at interfaces: the finite-volume scheme of Patankar,
// Numerical Heat Transfer and Fluid Flow, 1980, ch. 4 (sections from memory), exact in
// the steady state). Each layer has Cells cells (a compile-time count); every
// volume is one node. Time stepping: Crank-Nicolson (Crank & Nicolson, Proc.
// Camb. Phil. Soc. 43, 1947) with a damped start: the first step after the
// concentration step is taken as four backward-Euler quarter steps (Rannacher,
// Numer. Math. 43, 1984), which damps the stiff modes the discontinuity excites
// and keeps second order. The tridiagonal systems are solved by the Thomas
// algorithm, factorised once per run. No allocation: all storage is in the
// solver object (eleven arrays of Cells x Parts values).
//
// The rise (step from zero outside to 1) and the fall (from the steady state,
// outside to 0) run side by side on the same matrices. Times t10, t50, t90 and
// the fall times come from linear interpolation between steps. The discrete
// mass balance (what entered = what is held + what the sink consumed) holds to
// rounding every step and is reported. step_response_estimate repeats the run
// with half the cells and twice the time step: the change of t90 is its error
// estimate (an upper bound for a second-order scheme in its asymptotic range,
// where the true error is about a third of it).
//
// Analytic checks (tests/unit/test_transient.cpp): Crank, The Mathematics of
// Diffusion, 2nd ed., 1975, ch. 4; the time lag L^2/(6 D) of Daynes, Proc. R.
// Soc. A 97, 1920; first-order volumes tau = V/Q and V/(G D).
#ifndef COUNTERFLUX_TRANSIENT_HPP
#define COUNTERFLUX_TRANSIENT_HPP

#include <array>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>

#include "barrier.hpp"
#include "constants.hpp"
#include "detail/checked.hpp"
#include "detail/math.hpp"
#include "series.hpp"
#include "signal.hpp"
#include "status.hpp"

namespace counterflux {

/// The kinds of part of a step-response chain.
enum class chain_part_kind : std::uint8_t {
    flushed_volume,  ///< a volume swept by the sample flow (housing front volume)
    layer,           ///< a diffusion layer (capillary, porous element, membrane)
    lumped_volume,   ///< a well-mixed gas volume (cavity above the electrode)
};

/// One part of the chain; the fields a kind does not use are zero.
template <class T>
struct chain_part {
    chain_part_kind kind;  ///< which kind of part
    T volume_m3;           ///< flushed / lumped volume, m3
    T flow_m3_s;           ///< flushed volume: sample flow through it, m3/s
    T diffusivity_m2_s;    ///< layer: diffusivity inside the layer, m2/s
    T area_m2;             ///< layer: cross-section, m2
    T length_m;            ///< layer: (effective) length, m
    T partition;           ///< layer: K = c inside / c in the gas at equilibrium, 1
};

/// A flushed volume V (m3) with sample flow Q (m3/s).
template <class T>
constexpr chain_part<T> make_flushed_volume(T volume_m3, T flow_m3_s) noexcept {
    return chain_part<T>{chain_part_kind::flushed_volume, volume_m3, flow_m3_s, T(0), T(0), T(0), T(0)};
}

/// A diffusion layer: diffusivity (m2/s), area (m2), length (m), partition coefficient K (1).
template <class T>
constexpr chain_part<T> make_layer(T diffusivity_m2_s, T area_m2, T length_m, T partition = T(1)) noexcept {
    return chain_part<T>{chain_part_kind::layer, T(0), T(0), diffusivity_m2_s, area_m2, length_m, partition};
}

/// A lumped (well-mixed) gas volume V (m3).
template <class T>
constexpr chain_part<T> make_lumped_volume(T volume_m3) noexcept {
    return chain_part<T>{chain_part_kind::lumped_volume, volume_m3, T(0), T(0), T(0), T(0), T(0)};
}

/// Up to Parts parts from the outside in, and the sink at the electrode.
template <class T, std::size_t Parts>
struct transient_chain {
    static_assert(Parts >= 1, "a chain holds at least one part");
    std::array<chain_part<T>, Parts> parts;  ///< parts[0] faces the sample gas
    std::size_t count;                       ///< parts in use
    T sink_rate_m_s;                         ///< first-order electrode rate k, m/s; +inf: perfect sink
    T electrode_area_m2;                     ///< area the rate acts on, m2 (unused for a perfect sink)
};

/// An empty chain ending in a perfect sink.
template <class T, std::size_t Parts>
constexpr transient_chain<T, Parts> make_chain() noexcept {
    return transient_chain<T, Parts>{{}, 0, std::numeric_limits<T>::infinity(), T(0)};
}

/// Appends p to c; out_of_domain (c unchanged) when c is full.
template <class T, std::size_t Parts>
constexpr status push(transient_chain<T, Parts>& c, const chain_part<T>& p) noexcept {
    if (c.count >= Parts) return status::out_of_domain;
    c.parts[c.count] = p;
    ++c.count;
    return status::ok;
}

namespace detail {

/// A positive finite value: ok; non-finite: not_finite; else out_of_domain.
template <class T>
constexpr status check_positive_finite(T x) noexcept {
    if (!finite(x)) return status::not_finite;
    return x > T(0) ? status::ok : status::out_of_domain;
}

/// Status of one part's data.
template <class T>
constexpr status check_part(const chain_part<T>& p) noexcept {
    switch (p.kind) {
        case chain_part_kind::flushed_volume:
            return check_positive_finite(p.volume_m3) | check_positive_finite(p.flow_m3_s);
        case chain_part_kind::layer:
            return check_positive_finite(p.diffusivity_m2_s) | check_positive_finite(p.area_m2) |
                   check_positive_finite(p.length_m) | check_positive_finite(p.partition);
        case chain_part_kind::lumped_volume:
        default:
            return check_positive_finite(p.volume_m3);
    }
}

/// True for the two volume kinds (one node, no resistance of their own).
template <class T>
constexpr bool is_volume(const chain_part<T>& p) noexcept {
    return p.kind != chain_part_kind::layer;
}

/// Steady resistance of a layer, L / (D K A), s/m3 (per mol/s and mol/m3).
template <class T>
constexpr T layer_resistance(const chain_part<T>& p) noexcept {
    return p.length_m / (p.diffusivity_m2_s * p.partition * p.area_m2);
}

/// Resistance of the sink, 1 / (k A_e), s/m3; 0 for a perfect sink.
template <class T, std::size_t Parts>
constexpr T sink_resistance(const transient_chain<T, Parts>& c) noexcept {
    return finite(c.sink_rate_m_s) ? T(1) / (c.sink_rate_m_s * c.electrode_area_m2) : T(0);
}

/// Number of parts the solver uses: a lumped volume at a perfect sink is held
/// at zero and plays no part, so it is dropped.
template <class T, std::size_t Parts>
constexpr std::size_t active_parts(const transient_chain<T, Parts>& c) noexcept {
    std::size_t n = c.count;
    while (n > 0 && !finite(c.sink_rate_m_s) && c.parts[n - 1].kind == chain_part_kind::lumped_volume) --n;
    return n;
}

}  // namespace detail

/// status::ok when the chain can be simulated: 1..Parts valid parts, no two
/// volumes side by side, a lumped volume never first (it needs a flushed
/// volume or a layer between it and the sample), a sink rate > 0 (finite with
/// an electrode area > 0, or +inf), and something left once a lumped volume at
/// a perfect sink is dropped. out_of_domain or not_finite otherwise.
template <class T, std::size_t Parts>
constexpr status validate(const transient_chain<T, Parts>& c) noexcept {
    if (c.count < 1 || c.count > Parts) return status::out_of_domain;
    status s = status::ok;
    if (c.sink_rate_m_s != c.sink_rate_m_s) return status::not_finite;
    if (!(c.sink_rate_m_s > T(0))) s |= status::out_of_domain;
    if (detail::finite(c.sink_rate_m_s)) s |= detail::check_positive_finite(c.electrode_area_m2);
    for (std::size_t i = 0; i < c.count; ++i) {
        s |= detail::check_part(c.parts[i]);
        if (i > 0 && detail::is_volume(c.parts[i]) && detail::is_volume(c.parts[i - 1])) s |= status::out_of_domain;
        if (i > 0 && c.parts[i].kind == chain_part_kind::flushed_volume) s |= status::out_of_domain;
    }
    if (c.parts[0].kind == chain_part_kind::lumped_volume) s |= status::out_of_domain;
    const std::size_t n = detail::active_parts(c);
    // A flushed volume alone at a perfect sink is held at zero: nothing to simulate.
    if (n == 0 || (n == 1 && c.parts[0].kind == chain_part_kind::flushed_volume && !detail::finite(c.sink_rate_m_s)))
        s |= status::out_of_domain;
    return s;
}

/// Steady resistance of the whole chain from the sample to the electrode,
/// 1/Q + sum L/(D K A) + 1/(k A_e), in s/m3: the sample concentration
/// (mol/m3) over the steady molar flow into the sink (mol/s). 0 with the flags
/// of validate when the chain is invalid.
template <class T, std::size_t Parts>
constexpr result<T> steady_resistance_s_m3(const transient_chain<T, Parts>& c) noexcept {
    const status s = validate(c);
    if (s != status::ok) return {T(0), s};
    T r = detail::sink_resistance(c);
    for (std::size_t i = 0; i < c.count; ++i) {
        const chain_part<T>& p = c.parts[i];
        if (p.kind == chain_part_kind::layer) r += detail::layer_resistance(p);
        if (p.kind == chain_part_kind::flushed_volume) r += T(1) / p.flow_m3_s;
    }
    return detail::checked(r);
}

/// t90 of a single layer between a step and a perfect sink, in units of L^2/D:
/// 0.30352 (Crank, The Mathematics of Diffusion, 2nd ed., 1975, ch. 4 series).
template <class T>
inline constexpr T layer_t90_per_l2_over_d = T(0.30352);

/// The rise time t90 that part i alone would give in its place in the
/// chain, s, every other capacity neglected. A volume V fills first order
/// through the steady conductances of the rest of the chain towards the sample
/// (G_up) and towards the sink (G_down): ln(10) V / (G_up + G_down), 0 when
/// either side has no resistance (the sample, or a perfect sink, at the
/// volume). A layer gives its own diffusion time 0.30352 L^2/D (Crank's t90,
/// exact between the sample and a perfect sink) plus the delay the resistances
/// around it add to filling its capacity K A L (lumped at its middle).
/// out_of_domain (value 0) for an invalid chain or index; a lumped volume
/// dropped at a perfect sink gives 0 with status ok.
template <class T, std::size_t Parts>
inline result<T> part_t90_s(const transient_chain<T, Parts>& c, std::size_t i) noexcept {
    status s = validate(c);
    if (i >= c.count || i >= Parts) s |= status::out_of_domain;
    if (s != status::ok) return {T(0), s};
    const chain_part<T> p = c.parts[i];  // a copy: GCC 12 merges split-off tails of different Parts and then
                                         // warns of array bounds (-Warray-bounds) through a reference
    if (i >= detail::active_parts(c)) return {T(0), status::ok};
    T up = T(0);  // resistance towards the sample
    for (std::size_t j = 0; j < i; ++j) {
        if (c.parts[j].kind == chain_part_kind::layer) up += detail::layer_resistance(c.parts[j]);
        if (c.parts[j].kind == chain_part_kind::flushed_volume) up += T(1) / c.parts[j].flow_m3_s;
    }
    if (p.kind == chain_part_kind::flushed_volume) up += T(1) / p.flow_m3_s;
    T down = detail::sink_resistance(c);
    for (std::size_t j = i + 1; j < c.count; ++j)
        if (c.parts[j].kind == chain_part_kind::layer) down += detail::layer_resistance(c.parts[j]);
    // A side with no resistance (the sample or a perfect sink right at the
    // part) fills or empties it at once: nothing lumped to wait for.
    const bool both_sides = up > T(0) && down > T(0);
    const T g = both_sides ? T(1) / up + T(1) / down : T(0);
    const T ln10 = T(2.302585092994046);
    if (p.kind == chain_part_kind::layer) {
        // Its own diffusion time, plus what the resistances around it add to
        // filling its capacity C = K A L, seen from its middle: ln(10) C times
        // 1/(1/(R_up + R/2) + 1/(R_down + R/2)) less the same with R_up = R_down = 0 (R/4).
        const T own = layer_t90_per_l2_over_d<T> * p.length_m * p.length_m / p.diffusivity_m2_s;
        const T r = detail::layer_resistance(p);
        const T in_place = T(1) / (T(1) / (up + r / T(2)) + T(1) / (down + r / T(2)));
        const T extra = ln10 * p.partition * p.area_m2 * p.length_m * (in_place - r / T(4));
        return detail::checked(extra > T(0) ? own + extra : own);
    }
    if (!both_sides) return {T(0), status::ok};
    return detail::checked(ln10 * p.volume_m3 / g);
}

/// A scale for the response time, s: the sum of part_t90_s over the parts
/// (the parts one after the other). Used to choose a time step and a duration.
template <class T, std::size_t Parts>
inline result<T> estimated_t90_s(const transient_chain<T, Parts>& c) noexcept {
    const status s = validate(c);
    if (s != status::ok) return {T(0), s};
    T sum = T(0);
    status code = status::ok;
    for (std::size_t i = 0; i < c.count; ++i) {
        const result<T> t = part_t90_s(c, i);
        sum += t.value;
        code |= t.code;
    }
    return detail::checked(sum, code);
}

/// Times of a step response, s, and what the run found.
template <class T>
struct step_times {
    T t10_s;                    ///< rise to 10 % of the final current, s
    T t50_s;                    ///< rise to 50 %, s
    T t90_s;                    ///< rise to 90 %, s
    T fall_t10_s;               ///< fall by 10 % (to 90 % of the initial current), s
    T fall_t50_s;               ///< fall by 50 %, s
    T fall_t90_s;               ///< fall by 90 % (to 10 %), s
    T t90_error_s;              ///< estimated discretisation error of t90, s (0 from step_response)
    T steady_flow_per_conc;     ///< steady sink flow per sample concentration, mol/s per mol/m3 (= m3/s)
    T final_rise;               ///< rise signal at the end of the run, I/I_ss
    T final_fall;               ///< fall signal at the end of the run, I/I_ss
    T max_mass_balance_error;   ///< largest |entered - held - consumed| / scale over the run, 1
    std::size_t nodes;          ///< unknowns of the discretised chain
    std::size_t steps;          ///< time steps taken
};

/// One sample of the response, passed to an observer after every step.
template <class T>
struct step_sample {
    T time_s;              ///< time since the concentration step, s
    T rise;                ///< I/I_ss after a step up from zero
    T fall;                ///< I/I_ss after a step down from the steady state
    T rise_consumed;       ///< what the sink consumed since the step up, mol per mol/m3 of step (m3)
    T mass_balance_error;  ///< |entered - held - consumed| / scale this step, rise and fall, 1
};

/// An observer that ignores every sample.
struct no_observer {
    /// Does nothing.
    template <class Sample>
    constexpr void operator()(const Sample&) const noexcept {}
};

/// Most time steps one run takes.
inline constexpr std::size_t step_max_steps = std::size_t(1) << 24;

namespace detail {

/// The interpolated time where a sampled signal first crosses level.
template <class T>
struct crossing {
    T level;
    bool rising;
    bool found;
    T time;
    constexpr void see(T t0, T y0, T t1, T y1) noexcept {
        if (found) return;
        const bool hit = rising ? (y1 >= level) : (y1 <= level);
        if (!hit) return;
        found = true;
        const T dy = y1 - y0;
        time = (dy != T(0)) ? t0 + (t1 - t0) * ((level - y0) / dy) : t1;
        if (time < t0) time = t0;
        if (time > t1) time = t1;
    }
};

}  // namespace detail

/// Discretised step-response solver of a chain with Cells cells in every
/// layer (each volume is one node). All storage is inside the object (about
/// 11 Cells Parts values of T): give it static storage on a small stack.
template <class T, std::size_t Cells, std::size_t Parts>
class step_solver {
    static_assert(Cells >= 1, "a layer needs at least one cell");

public:
    /// Largest number of unknowns.
    static constexpr std::size_t max_nodes = Cells * Parts;

    /// Sets up the ladder of chain c; the flags of validate (and not_finite
    /// when the capacities or conductances overflow) when it cannot.
    constexpr status setup(const transient_chain<T, Parts>& c) noexcept {
        nodes_ = 0;
        status s = validate(c);
        if (s != status::ok) return s;
        const std::size_t n_parts = detail::active_parts(c);
        // Node by node: its capacity, and the conductance to the node before it
        // through the right half of that node and the left half of this one
        // (a cell's half is h / (2 D K A), a volume has none).
        T previous_right = T(0);
        T first_left = T(0);
        for (std::size_t i = 0; i < n_parts; ++i) {
            const chain_part<T>& p = c.parts[i];
            const bool layer = p.kind == chain_part_kind::layer;
            const std::size_t count = layer ? Cells : 1;
            const T h = layer ? p.length_m / static_cast<T>(Cells) : T(0);
            const T half = layer ? h / (T(2) * p.diffusivity_m2_s * p.partition * p.area_m2) : T(0);
            const T cap = layer ? p.partition * p.area_m2 * h : p.volume_m3;
            for (std::size_t k = 0; k < count; ++k) {
                capacity_[nodes_] = cap;
                if (nodes_ == 0) first_left = half;
                else g_[nodes_ - 1] = T(1) / (previous_right + half);
                previous_right = half;
                ++nodes_;
            }
        }
        const chain_part<T>& first = c.parts[0];
        const T r_src = first_left + (first.kind == chain_part_kind::flushed_volume ? T(1) / first.flow_m3_s : T(0));
        source_g_ = T(1) / r_src;
        sink_g_ = T(1) / (previous_right + detail::sink_resistance(c));
        bool ok = detail::finite(source_g_) && detail::finite(sink_g_) && source_g_ > T(0) && sink_g_ > T(0);
        for (std::size_t i = 0; i < nodes_; ++i) ok = ok && detail::finite(capacity_[i]) && capacity_[i] > T(0);
        for (std::size_t i = 0; i + 1 < nodes_; ++i) ok = ok && detail::finite(g_[i]) && g_[i] > T(0);
        if (!ok) {
            nodes_ = 0;
            return status::not_finite;
        }
        return status::ok;
    }

    /// Unknowns in use (0 before a successful setup).
    constexpr std::size_t nodes() const noexcept { return nodes_; }

    /// Simulates the rise and the fall over duration_s in steps equal steps,
    /// calling observe(step_sample) after each (and once at t = 0); this function
    /// is noexcept, so an exception escaping observe would end the program.
    /// Status: the flags of setup;
    /// out_of_domain for a duration that is not finite and positive or steps
    /// outside 1..step_max_steps; above_range when a rise or fall time was not
    /// reached by the end (that time is then the duration); not_finite if the
    /// solution overflowed (times 0).
    template <class Observer>
    result<step_times<T>> run(T duration_s, std::size_t steps, Observer&& observe) noexcept {
        step_times<T> out{T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), nodes_, 0};
        if (nodes_ == 0) return {out, status::out_of_domain};
        if (!detail::finite(duration_s)) return {out, status::not_finite};
        if (!(duration_s > T(0)) || steps < 1 || steps > step_max_steps) return {out, status::out_of_domain};
        const std::size_t n = nodes_;
        const T dt = duration_s / static_cast<T>(steps);

        // Steady state (outside = 1): G u = b, by the same Thomas algorithm.
        factor(T(0), T(1), ss_cp_, ss_im_);
        for (std::size_t i = 0; i < n; ++i) rhs_[i] = T(0);
        rhs_[0] = source_g_;
        solve(ss_cp_, ss_im_, T(1), rise_);  // rise_ holds the steady state for now
        const T u_ss_last = rise_[n - 1];
        const T flow_ss = sink_g_ * u_ss_last;
        if (!(detail::finite(flow_ss) && flow_ss > T(0))) return {out, status::not_finite};
        for (std::size_t i = 0; i < n; ++i) {
            fall_[i] = rise_[i];
            rise_[i] = T(0);
        }
        out.steady_flow_per_conc = flow_ss;

        // Crank-Nicolson matrix C/dt + G/2, and backward Euler C/(dt/4) + G.
        factor(T(1) / dt, T(0.5), cn_cp_, cn_im_);
        factor(T(4) / dt, T(1), be_cp_, be_im_);

        // Bookkeeping for the mass balance: entered, consumed, held (rise and fall).
        T rise_in = T(0), rise_out = T(0), fall_in = T(0), fall_out = T(0);
        const T fall_held0 = held(fall_);
        detail::crossing<T> r10{T(0.1), true, false, T(0)}, r50{T(0.5), true, false, T(0)},
            r90{T(0.9), true, false, T(0)};
        detail::crossing<T> f10{T(0.9), false, false, T(0)}, f50{T(0.5), false, false, T(0)},
            f90{T(0.1), false, false, T(0)};
        T t_prev = T(0), y_rise_prev = T(0), y_fall_prev = T(1);
        T worst = T(0);
        bool lost = false;
        observe(step_sample<T>{T(0), T(0), T(1), T(0), T(0)});
        for (std::size_t k = 1; k <= steps; ++k) {
            if (k == 1) {  // damped start: four backward-Euler quarter steps
                for (int q = 0; q < 4; ++q) {
                    advance(dt / T(4), T(4) / dt, T(1), be_cp_, be_im_, rise_, T(1), rise_in, rise_out);
                    advance(dt / T(4), T(4) / dt, T(1), be_cp_, be_im_, fall_, T(0), fall_in, fall_out);
                }
            } else {
                advance(dt, T(1) / dt, T(0.5), cn_cp_, cn_im_, rise_, T(1), rise_in, rise_out);
                advance(dt, T(1) / dt, T(0.5), cn_cp_, cn_im_, fall_, T(0), fall_in, fall_out);
            }
            const T t = dt * static_cast<T>(k);
            const T y_rise = rise_[n - 1] / u_ss_last;
            const T y_fall = fall_[n - 1] / u_ss_last;
            // Mass balance, relative to the largest amount in the account.
            const T rise_held = held(rise_);
            const T fall_held = held(fall_);
            const T rise_scale = max3(rise_in, rise_out, rise_held);
            const T fall_scale = max3(fall_held0, fall_out, fall_held);
            T e = T(0);
            if (rise_scale > T(0)) e = std::fabs(rise_in - rise_held - rise_out) / rise_scale;
            if (fall_scale > T(0)) {
                const T ef = std::fabs(fall_in - (fall_held - fall_held0) - fall_out) / fall_scale;
                if (ef > e) e = ef;
            }
            if (e != e) lost = true;  // NaN: reported as not_finite at the end
            else if (e > worst) worst = e;
            r10.see(t_prev, y_rise_prev, t, y_rise);
            r50.see(t_prev, y_rise_prev, t, y_rise);
            r90.see(t_prev, y_rise_prev, t, y_rise);
            f10.see(t_prev, y_fall_prev, t, y_fall);
            f50.see(t_prev, y_fall_prev, t, y_fall);
            f90.see(t_prev, y_fall_prev, t, y_fall);
            observe(step_sample<T>{t, y_rise, y_fall, rise_out, e});
            t_prev = t;
            y_rise_prev = y_rise;
            y_fall_prev = y_fall;
        }
        status s = status::ok;
        const auto time_of = [&](const detail::crossing<T>& c) noexcept {
            if (!c.found) s |= status::above_range;
            return c.found ? c.time : duration_s;
        };
        out.t10_s = time_of(r10);
        out.t50_s = time_of(r50);
        out.t90_s = time_of(r90);
        out.fall_t10_s = time_of(f10);
        out.fall_t50_s = time_of(f50);
        out.fall_t90_s = time_of(f90);
        out.final_rise = y_rise_prev;
        out.final_fall = y_fall_prev;
        out.max_mass_balance_error = worst;
        out.steps = steps;
        if (lost || !(detail::finite(worst) && detail::finite(y_rise_prev) && detail::finite(y_fall_prev))) {
            const std::size_t nn = nodes_;
            out = step_times<T>{T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), nn, steps};
            return {out, status::not_finite};
        }
        return {out, s};
    }

    /// The slowest time constant of the chain, s: the largest eigenvalue of
    /// G^-1 C (the decay time of the last mode of a step response), by inverse
    /// iteration (at most iterations solves; not_converged if the Rayleigh
    /// quotient has not settled to 1e-10 relative (1e-5 in float) by then).
    /// Uses the state arrays as scratch: call it after setup, not during a run.
    result<T> slowest_time_constant_s(int iterations = 500) noexcept {
        if (nodes_ == 0) return {T(0), status::out_of_domain};
        const std::size_t n = nodes_;
        factor(T(0), T(1), ss_cp_, ss_im_);
        for (std::size_t i = 0; i < n; ++i) fall_[i] = T(1);
        T lambda = T(0);
        const T tol = std::numeric_limits<T>::epsilon() > T(1e-10) ? T(1e-5) : T(1e-10);
        for (int it = 0; it < iterations; ++it) {
            for (std::size_t i = 0; i < n; ++i) rhs_[i] = capacity_[i] * fall_[i];
            solve(ss_cp_, ss_im_, T(1), rise_);  // x = G^-1 C v
            // Rayleigh quotient in the C inner product: (v, C x) / (v, C v).
            T num = T(0), den = T(0), norm = T(0);
            for (std::size_t i = 0; i < n; ++i) {
                num += fall_[i] * capacity_[i] * rise_[i];
                den += fall_[i] * capacity_[i] * fall_[i];
                if (std::fabs(rise_[i]) > norm) norm = std::fabs(rise_[i]);
            }
            if (!(norm > T(0)) || !detail::finite(norm)) return {T(0), status::not_finite};
            const T next = num / den;
            for (std::size_t i = 0; i < n; ++i) fall_[i] = rise_[i] / norm;
            if (it > 2 && std::fabs(next - lambda) <= tol * std::fabs(next)) return detail::checked(next);
            lambda = next;
        }
        return detail::checked(lambda, status::not_converged);
    }

private:
    static T max3(T a, T b, T c) noexcept {
        T m = std::fabs(a);
        if (std::fabs(b) > m) m = std::fabs(b);
        if (std::fabs(c) > m) m = std::fabs(c);
        return m;
    }

    constexpr T held(const std::array<T, max_nodes>& u) const noexcept {
        T sum = T(0);
        for (std::size_t i = 0; i < nodes_; ++i) sum += capacity_[i] * u[i];
        return sum;
    }

    // Thomas factors of the tridiagonal matrix inv_dt C + theta G (G the
    // symmetric conductance matrix with the source and sink conductances on
    // its diagonal): cp the modified super-diagonal, im the reciprocal pivots.
    constexpr void factor(T inv_dt, T theta, std::array<T, max_nodes>& cp, std::array<T, max_nodes>& im) const noexcept {
        const std::size_t n = nodes_;
        T prev_cp = T(0);
        for (std::size_t i = 0; i < n; ++i) {
            const T gl = i > 0 ? g_[i - 1] : source_g_;
            const T gr = i + 1 < n ? g_[i] : sink_g_;
            const T sub = i > 0 ? -theta * g_[i - 1] : T(0);
            const T diag = inv_dt * capacity_[i] + theta * (gl + gr);
            const T pivot = diag - sub * prev_cp;
            im[i] = T(1) / pivot;
            const T sup = i + 1 < n ? -theta * g_[i] : T(0);
            cp[i] = sup * im[i];
            prev_cp = cp[i];
        }
    }

    // Solves the system factored by factor(., theta, cp, im) for rhs_ into x:
    // forward y_i = (r_i - a_i y_{i-1}) im_i with the sub-diagonal a_i = -theta g_{i-1},
    // then back x_i = y_i - cp_i x_{i+1}.
    constexpr void solve(const std::array<T, max_nodes>& cp, const std::array<T, max_nodes>& im, T theta,
                         std::array<T, max_nodes>& x) const noexcept {
        const std::size_t n = nodes_;
        x[0] = rhs_[0] * im[0];
        for (std::size_t i = 1; i < n; ++i) x[i] = (rhs_[i] + theta * g_[i - 1] * x[i - 1]) * im[i];
        for (std::size_t i = n - 1; i-- > 0;) x[i] -= cp[i] * x[i + 1];
    }

    // One theta-step of length dt for state u with outside concentration c_out
    // (constant over the step); adds the inflow and the sink flow to in / out.
    constexpr void advance(T dt, T inv_dt, T theta, const std::array<T, max_nodes>& cp,
                           const std::array<T, max_nodes>& im, std::array<T, max_nodes>& u, T c_out, T& in,
                           T& out) noexcept {
        const std::size_t n = nodes_;
        const T explicit_weight = T(1) - theta;
        const T in_old = source_g_ * (c_out - u[0]);
        const T out_old = sink_g_ * u[n - 1];
        for (std::size_t i = 0; i < n; ++i) {
            T r = inv_dt * capacity_[i] * u[i];
            if (explicit_weight != T(0)) {
                // -(G u)_i, with the boundary conductances to 0 (source added below).
                T flux = T(0);
                if (i > 0) flux += g_[i - 1] * (u[i - 1] - u[i]);
                else flux -= source_g_ * u[i];
                if (i + 1 < n) flux += g_[i] * (u[i + 1] - u[i]);
                else flux -= sink_g_ * u[i];
                r += explicit_weight * flux;
            }
            rhs_[i] = r;
        }
        rhs_[0] += source_g_ * c_out;  // theta c_out + (1 - theta) c_out: constant over the step
        solve(cp, im, theta, u);
        const T in_new = source_g_ * (c_out - u[0]);
        const T out_new = sink_g_ * u[n - 1];
        in += dt * (theta * in_new + explicit_weight * in_old);
        out += dt * (theta * out_new + explicit_weight * out_old);
    }

    std::array<T, max_nodes> capacity_{};  // C per node, mol per mol/m3 (m3)
    std::array<T, max_nodes> g_{};         // conductance node i to i+1, m3/s
    std::array<T, max_nodes> cn_cp_{}, cn_im_{}, be_cp_{}, be_im_{}, ss_cp_{}, ss_im_{};
    std::array<T, max_nodes> rise_{}, fall_{}, rhs_{};
    T source_g_ = T(0);  // conductance from the sample to node 0, m3/s
    T sink_g_ = T(0);    // conductance from the last node into the sink, m3/s
    std::size_t nodes_ = 0;
};

/// Step response of chain c with Cells cells per layer over duration_s in
/// steps time steps, calling observe(step_sample) after every step. Status as
/// step_solver::run. The solver lives in this function's frame (about
/// 11 Cells Parts values of T).
template <class T, std::size_t Cells, std::size_t Parts, class Observer = no_observer>
inline result<step_times<T>> step_response(const transient_chain<T, Parts>& c, T duration_s, std::size_t steps,
                                           Observer&& observe = Observer{}) noexcept {
    step_solver<T, Cells, Parts> solver;
    const status s = solver.setup(c);
    if (s != status::ok) {
        step_times<T> none{T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), T(0), 0, 0};
        return {none, s};
    }
    return solver.run(duration_s, steps, static_cast<Observer&&>(observe));
}

/// step_response, and again with Cells/2 cells and steps/2 time steps: the
/// change of t90 is reported as t90_error_s (an upper bound of the error of
/// the fine run while the scheme converges at second order). Cells must be
/// even and steps >= 2. The observer sees the fine run only.
template <class T, std::size_t Cells, std::size_t Parts, class Observer = no_observer>
inline result<step_times<T>> step_response_estimate(const transient_chain<T, Parts>& c, T duration_s,
                                                    std::size_t steps, Observer&& observe = Observer{}) noexcept {
    static_assert(Cells >= 2 && Cells % 2 == 0, "the error estimate halves the cell count");
    result<step_times<T>> fine = step_response<T, Cells, Parts>(c, duration_s, steps, static_cast<Observer&&>(observe));
    if (has(fine.code, status::out_of_domain) || has(fine.code, status::not_finite)) return fine;
    if (steps < 2) return {fine.value, fine.code | status::out_of_domain};
    const result<step_times<T>> coarse = step_response<T, Cells / 2, Parts>(c, duration_s, steps / 2);
    fine.code |= coarse.code;
    fine.value.t90_error_s = detail::finite_or_max(std::fabs(fine.value.t90_s - coarse.value.t90_s));
    return fine;
}

/// Final value of a rising first-order tail from two samples interval_s
/// apart and the slowest time constant tau_s of the chain (firmware: read the
/// final concentration after a few time constants instead of waiting for it):
/// y_inf = y_later + (y_later - y_earlier) / expm1(interval / tau), in the unit
/// of the samples. out_of_domain (value y_later) for an interval or tau that is
/// not positive; not_finite for a non-finite input.
template <class T>
inline result<T> predict_final_value(T y_earlier, T y_later, T interval_s, T tau_s) noexcept {
    if (!detail::finite(y_earlier) || !detail::finite(y_later) || !detail::finite(interval_s) ||
        !detail::finite(tau_s))
        return {detail::finite(y_later) ? y_later : T(0), status::not_finite};
    if (!(interval_s > T(0)) || !(tau_s > T(0))) return {y_later, status::out_of_domain};
    const T x = interval_s / tau_s;
    if (x > detail::max_exponent<T>()) return {y_later, status::ok};  // the tail has long died out
    return detail::checked(y_later + (y_later - y_earlier) / std::expm1(x));
}

/// The parts of the [response] of a sensor that are not barrier elements.
template <class T>
struct response_setup {
    T front_volume_m3;     ///< flushed volume ahead of the barrier, m3 (0: none)
    T sample_flow_m3_s;    ///< sample flow through it, m3/s
    T cavity_volume_m3;    ///< gas space between barrier and electrode, m3 (0: none)
    T electrode_rate_m_s;  ///< first-order electrode rate, m/s; +inf: perfect sink
    T electrode_area_m2;   ///< area the rate acts on, m2 (0: that of the innermost element)
};

/// The step-response chain of sensor m at (T, P), outside in: the flushed
/// front volume (if any), one layer per barrier element, the cavity (if any)
/// and the sink. Each element's layer has the element's area and effective
/// length and a steady resistance equal to the library's dilute resistance
/// (L (r_m + r_l)/A per unit concentration): capillary D = 1/(r_m + r_l) (the
/// Bosanquet combination of resolve), K = 1; porous K = eps, D = 1/(eps (r_m +
/// r_l)) (the pore diffusivity); membrane D = its film diffusivity, K = Pi(T) R T / D.
/// out_of_domain when a membrane has no diffusivity (the value's count is then
/// the index of that element + 1 and the chain is empty) or the response setup
/// is not physical; the flags of transport_at when the model cannot be resolved.
template <class T, std::size_t N>
inline result<transient_chain<T, N + 2>> chain_from_sensor(const sensor_model<T, N>& m, const response_setup<T>& r,
                                                           T temperature_K, T pressure_Pa) noexcept {
    transient_chain<T, N + 2> c = make_chain<T, N + 2>();
    const result<series_transport<T, N>> st = transport_at(m, temperature_K, pressure_Pa);
    if (st.value.count == 0) return {c, st.code | status::out_of_domain};
    status s = st.code;
    if (!detail::finite(r.front_volume_m3) || !detail::finite(r.sample_flow_m3_s) ||
        !detail::finite(r.cavity_volume_m3) || !detail::finite(r.electrode_area_m2) ||
        r.electrode_rate_m_s != r.electrode_rate_m_s)
        return {c, s | status::not_finite};
    if (r.front_volume_m3 < T(0) || r.cavity_volume_m3 < T(0) || r.electrode_area_m2 < T(0) ||
        !(r.electrode_rate_m_s > T(0)) || (r.front_volume_m3 > T(0) && !(r.sample_flow_m3_s > T(0))))
        return {c, s | status::out_of_domain};
    if (r.front_volume_m3 > T(0)) push(c, make_flushed_volume(r.front_volume_m3, r.sample_flow_m3_s));
    for (std::size_t i = 0; i < st.value.count; ++i) {
        const element_transport<T>& e = st.value.elements[i];
        const barrier<T>& b = m.barriers.elements[i];
        const T inv = e.inv_molecular_s_m2 + e.inv_linear_s_m2;  // 1 / (D K)
        T d = T(1) / inv;
        T k = T(1);
        if (b.kind == barrier_kind::porous) {
            k = b.porosity;
            d = T(1) / (b.porosity * inv);
        } else if (b.kind == barrier_kind::membrane) {
            if (!(b.membrane_diffusivity_m2_s > T(0))) {
                transient_chain<T, N + 2> none = make_chain<T, N + 2>();
                none.count = i + 1;
                return {none, s | status::out_of_domain};
            }
            d = b.membrane_diffusivity_m2_s;
            k = T(1) / (inv * d);
        }
        push(c, make_layer(d, e.area_m2, e.length_m, k));
    }
    if (r.cavity_volume_m3 > T(0)) push(c, make_lumped_volume(r.cavity_volume_m3));
    c.sink_rate_m_s = r.electrode_rate_m_s;
    c.electrode_area_m2 = r.electrode_area_m2 > T(0) ? r.electrode_area_m2 : st.value.elements[st.value.count - 1].area_m2;
    s |= validate(c);
    return {c, s};
}

}  // namespace counterflux

#endif  // COUNTERFLUX_TRANSIENT_HPP
