//! Gas and steam lines: the isothermal compressible-flow equation with the
//! Darcy friction factor,
//!
//! p₁² − p₂² = G² (p₁/ρ₁) [K + 2 ln(p₁/p₂)],  K = f (L + L_eq)/D + ΣK,
//!
//! where G = ṁ/A is the mass flux and p/ρ stays p₁/ρ₁ along the line (the
//! isothermal assumption, Z constant). Crane Co., *Flow of Fluids Through
//! Valves, Fittings, and Pipe* (TP-410), chapter 1, "compressible flow",
//! and any gas-dynamics text (e.g. Shapiro 1953, ch. 6; the `fluids`
//! package's `isothermal_gas` states the same form).
//!
//! The line chokes when the outlet reaches the isothermal limiting
//! velocity V₂ = √(p₂/ρ₂), i.e. p₂* = √(G² p₁/ρ₁): with x = (p₂*/p₁)², a
//! solution exists only while 1 − x(1 + K) + x ln x ≥ 0. Past that the
//! line cannot pass the flow at all and the size is refused.

/// What the isothermal equation gives for one line at one size.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Isothermal {
    /// Outlet pressure, Pa absolute (the sonic state's when choked).
    pub outlet_pressure: f64,
    /// G / G_max: how near the flow is to choking (1 chokes).
    pub choke_ratio: f64,
    /// The flow cannot pass: the outlet would be sonic before the end.
    pub choked: bool,
}

/// x* = (p₂*/p₁)² at which a line of resistance `k` just chokes: the root
/// of g(x) = 1 − x(1 + K) + x ln x = 0 in (0, 1]. g falls from 1 at x = 0
/// to −K at x = 1 and is convex (g″ = 1/x), so Newton's method from the
/// left never overshoots the root: it climbs to it monotonically, here to
/// a relative step of 1e-14 (a bisection guard keeps it inside (0, 1)).
pub fn choking_x(k: f64) -> f64 {
    if k <= 0.0 {
        return 1.0;
    }
    let g = |x: f64| 1.0 - x * (1.0 + k) + x * x.ln();
    // The first Newton step from x → 0: g ≈ 1, g′ ≈ ln x − K.
    let mut x = 1.0 / (1.0 + k + (1.0 + k).ln());
    for _ in 0..100 {
        let step = g(x) / (k - x.ln());
        let next = x + step;
        let next = if next.is_finite() && next > 0.0 && next < 1.0 { next } else { 0.5 * (x + 1.0) };
        let done = (next - x).abs() <= 1e-14 * x;
        x = next;
        if done {
            break;
        }
    }
    x
}

/// The largest mass flux, kg/(m²·s), a line of resistance `k` can pass
/// from `p1` (Pa) at inlet density `rho1` (kg/m³): G_max = √(x* p₁ ρ₁).
pub fn max_mass_flux(p1: f64, rho1: f64, k: f64) -> f64 {
    (choking_x(k) * p1 * rho1).sqrt()
}

/// Solves the isothermal equation for the outlet pressure.
///
/// `p1` inlet pressure (Pa absolute), `rho1` inlet density (kg/m³), `g`
/// mass flux (kg/(m²·s)), `k` the line's total resistance f L/D + ΣK.
/// Newton's method on p₂ ∈ [p₂*, p₁] with a bisection guard, to a
/// relative change of 1e-13.
pub fn isothermal(p1: f64, rho1: f64, g: f64, k: f64) -> Isothermal {
    // No flow, no drop (whatever K, which is unbounded at Re → 0).
    if g <= 0.0 {
        return Isothermal { outlet_pressure: p1, choke_ratio: 0.0, choked: false };
    }
    let c = g * g * p1 / rho1;
    let p_star = c.sqrt();
    let g_max = max_mass_flux(p1, rho1, k);
    let choke_ratio = if g_max > 0.0 { g / g_max } else { f64::INFINITY };
    if choke_ratio > 1.0 || k <= 0.0 {
        return Isothermal {
            outlet_pressure: if k <= 0.0 { p1 } else { p_star.min(p1) },
            choke_ratio: if k <= 0.0 { 0.0 } else { choke_ratio },
            choked: k > 0.0,
        };
    }
    // F(p₂) = p₁² − p₂² − c (K + 2 ln(p₁/p₂)); F(p₁) = −cK < 0 ≤ F(p₂*),
    // and F falls on [p₂*, p₁].
    let f = |p2: f64| p1 * p1 - p2 * p2 - c * (k + 2.0 * (p1 / p2).ln());
    let df = |p2: f64| -2.0 * p2 + 2.0 * c / p2;
    let (mut lo, mut hi) = (p_star, p1);
    let mut p2 = crate::hydraulics::digits::clamp((p1 * p1 - c * k).max(c).sqrt(), lo, hi);
    for _ in 0..100 {
        let fx = f(p2);
        if fx > 0.0 {
            lo = p2;
        } else {
            hi = p2;
        }
        let d = df(p2);
        let mut next = p2 - fx / d;
        if !(next.is_finite() && next > lo && next < hi) {
            next = 0.5 * (lo + hi);
        }
        let done = (next - p2).abs() <= 1e-13 * p1;
        p2 = next;
        if done {
            break;
        }
    }
    Isothermal { outlet_pressure: p2, choke_ratio, choked: false }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_outlet_pressure_satisfies_the_equation() {
        let (p1, rho1, k) = (8e5, 9.4, 40.0);
        for g in [5.0, 50.0, 200.0] {
            let r = isothermal(p1, rho1, g, k);
            assert!(!r.choked);
            let p2 = r.outlet_pressure;
            let lhs = p1 * p1 - p2 * p2;
            let rhs = g * g * p1 / rho1 * (k + 2.0 * (p1 / p2).ln());
            // p₁² − p₂² is a difference of large squares: held to 1e-8.
            assert!(((lhs - rhs) / lhs).abs() < 1e-8, "{g}: {lhs} vs {rhs}");
        }
    }

    #[test]
    fn a_small_drop_agrees_with_darcy_at_inlet_density() {
        // Δp ≪ p₁: p₁² − p₂² ≈ 2 p₁ Δp and the log term vanishes, so
        // Δp → K G²/(2 ρ₁) = K ρ₁ V²/2.
        let (p1, rho1, k, g) = (8e5, 9.4, 10.0, 5.0);
        let dp = p1 - isothermal(p1, rho1, g, k).outlet_pressure;
        let darcy = k * g * g / (2.0 * rho1);
        assert!(((dp - darcy) / darcy).abs() < 2e-3, "{dp} vs {darcy}");
    }

    #[test]
    fn the_choking_root_solves_its_equation_for_any_resistance() {
        for k in [1e-3, 0.1, 1.0, 10.0, 100.0, 1e4, 1e7] {
            let x = choking_x(k);
            let g = 1.0 - x * (1.0 + k) + x * x.ln();
            assert!(x > 0.0 && x < 1.0 && g.abs() < 1e-12, "K {k}: x {x}, g {g}");
        }
    }

    #[test]
    fn past_the_limiting_flux_the_line_chokes() {
        let (p1, rho1, k) = (2e5, 2.3, 100.0);
        let gmax = max_mass_flux(p1, rho1, k);
        assert!(!isothermal(p1, rho1, 0.99 * gmax, k).choked);
        assert!(isothermal(p1, rho1, 1.01 * gmax, k).choked);
        // At the limit the outlet is at p₂* = G √(p₁/ρ₁).
        // F has its maximum at p₂*, so p₂ − p₂* grows as the square root
        // of how far below the limit the flow is: take it very close.
        let near = 1.0 - 1e-12;
        let r = isothermal(p1, rho1, near * gmax, k);
        let p_star = near * gmax * (p1 / rho1).sqrt();
        assert!(((r.outlet_pressure - p_star) / p_star).abs() < 1e-3, "{} vs {p_star}", r.outlet_pressure);
    }
}
