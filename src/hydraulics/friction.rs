//! Darcy friction factor: laminar, Colebrook–White (exact) and the explicit
//! approximations practitioners compare against.
//!
//! Design choice: the friction factor is a function of the two
//! dimensionless groups only, f = φ(Re, ε/D), so everything here takes plain
//! `f64` Reynolds number and relative roughness. Dimensions end at the
//! caller, which forms the groups from quantities.
//!
//! - Laminar below [`RE_LAMINAR_MAX`]: f = 64/Re (Hagen–Poiseuille).
//! - Turbulent from [`RE_TURBULENT_MIN`]: Colebrook–White, solved by Newton's
//!   method on x = 1/√f to a relative residual of 1e-12 or better.
//! - Between them (the transition zone) no correlation is reliable. Our stated
//!   rule: take the Colebrook–White value, which there exceeds 64/Re and so
//!   over-predicts drop (the safe side for sizing), and flag the result
//!   [`Regime::Transition`] so the page can say it is uncertain.
//!   This is common practice, not a single published rule.

/// Highest Reynolds number treated as laminar. Common practice (2000–2300 are
/// both in use); 2000 is the cautious end.
pub const RE_LAMINAR_MAX: f64 = 2000.0;
/// Lowest Reynolds number treated as fully turbulent. Common practice.
pub const RE_TURBULENT_MIN: f64 = 4000.0;

/// Flow regime, from the Reynolds number alone.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Regime {
    /// Re ≤ 2000.
    Laminar,
    /// 2000 < Re < 4000: the friction factor is uncertain.
    Transition,
    /// Re ≥ 4000.
    Turbulent,
}

impl Regime {
    /// Classifies a Reynolds number.
    pub fn of(re: f64) -> Regime {
        if re <= RE_LAMINAR_MAX {
            Regime::Laminar
        } else if re < RE_TURBULENT_MIN {
            Regime::Transition
        } else {
            Regime::Turbulent
        }
    }
}

/// Why a friction factor could not be computed.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum FrictionError {
    /// Re must be finite and positive.
    Reynolds(f64),
    /// ε/D must be finite, ≥ 0 and below 0.1 (beyond the Moody chart).
    RelativeRoughness(f64),
}

use crate::hydraulics::digits::Short;

impl std::fmt::Display for FrictionError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            FrictionError::Reynolds(re) => write!(f, "Reynolds number {} must be positive", Short(*re)),
            FrictionError::RelativeRoughness(r) => {
                write!(f, "relative roughness {} must be between 0 and 0.1", Short(*r))
            }
        }
    }
}

impl std::error::Error for FrictionError {}

fn check(re: f64, rr: f64) -> Result<(), FrictionError> {
    if !(re.is_finite() && re > 0.0) {
        return Err(FrictionError::Reynolds(re));
    }
    if !(rr.is_finite() && (0.0..0.1).contains(&rr)) {
        return Err(FrictionError::RelativeRoughness(rr));
    }
    Ok(())
}

/// A friction factor with the regime it was computed in.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Friction {
    /// Darcy friction factor (four times the Fanning factor).
    pub f: f64,
    /// Regime of the Reynolds number.
    pub regime: Regime,
}

/// Darcy friction factor for any Reynolds number, by the rule in the module
/// doc: 64/Re when laminar, Colebrook–White otherwise.
///
/// # Errors
/// [`FrictionError`] for a non-positive Re or ε/D outside [0, 0.1).
///
/// # Examples
/// ```
/// use headroom::hydraulics::friction::{darcy, Regime};
/// let lam = darcy(1000.0, 1e-4).unwrap();
/// assert_eq!((lam.f, lam.regime), (0.064, Regime::Laminar));
/// ```
pub fn darcy(re: f64, rr: f64) -> Result<Friction, FrictionError> {
    check(re, rr)?;
    let regime = Regime::of(re);
    let f = match regime {
        Regime::Laminar => laminar(re),
        Regime::Transition | Regime::Turbulent => colebrook(re, rr)?,
    };
    Ok(Friction { f, regime })
}

/// Laminar Darcy friction factor, f = 64/Re (Hagen–Poiseuille flow).
pub fn laminar(re: f64) -> f64 {
    64.0 / re
}

/// Colebrook–White, solved exactly:
///
/// 1/√f = −2 log10( (ε/D)/3.7 + 2.51/(Re √f) )
///
/// Colebrook, C. F. (1939). "Turbulent flow in pipes, with particular
/// reference to the transition region between the smooth and rough pipe
/// laws." J. Inst. Civil Engineers 11(4), 133–156. doi:10.1680/ijoti.1939.13150
///
/// Newton's method on x = 1/√f, started from Swamee–Jain. The function
/// F(x) = x + 2 log10(a + b x), a = (ε/D)/3.7, b = 2.51/Re, is increasing and
/// concave in x, so Newton from any start converges monotonically after one
/// step; it stops when |F|/x ≤ 1e-13, typically in 3–4 iterations.
///
/// Valid (as a solve) for any Re > 0 and 0 ≤ ε/D < 0.1; as physics, for
/// turbulent flow, Re ≳ 4000.
///
/// # Errors
/// [`FrictionError`] as for [`darcy`].
///
/// # Examples
/// ```
/// // fluids 1.3.1: fluids.friction.Colebrook(1e5, 1e-4) = 0.018513866077471648
/// let f = headroom::hydraulics::friction::colebrook(1e5, 1e-4).unwrap();
/// assert!((f - 0.018_513_866_077_471_648).abs() < 1e-12);
/// ```
pub fn colebrook(re: f64, rr: f64) -> Result<f64, FrictionError> {
    check(re, rr)?;
    Ok(colebrook_solve(re, rr).0)
}

/// The solve itself: (f, Newton iterations, final relative residual |F|/x).
pub fn colebrook_solve(re: f64, rr: f64) -> (f64, u32, f64) {
    const LN10: f64 = std::f64::consts::LN_10;
    let a = rr / 3.7;
    let b = 2.51 / re;
    let residual = |x: f64| x + 2.0 * (a + b * x).log10();
    // Start from Swamee–Jain where it is defined; it is within a few percent.
    let mut x = 1.0 / swamee_jain(re.max(1.0), rr).sqrt();
    let mut iterations = 0;
    let mut rel = f64::INFINITY;
    while iterations < 50 {
        let fx = residual(x);
        rel = (fx / x).abs();
        if rel <= 1e-13 {
            break;
        }
        let dfx = 1.0 + 2.0 * b / ((a + b * x) * LN10);
        x -= fx / dfx;
        iterations += 1;
    }
    (1.0 / (x * x), iterations, rel)
}

/// Swamee–Jain explicit approximation to Colebrook–White:
///
/// f = 0.25 / [log10( (ε/D)/3.7 + 5.74/Re^0.9 )]²
///
/// Swamee, P. K., Jain, A. K. (1976). "Explicit equations for pipe-flow
/// problems." J. Hydraulics Division ASCE 102(5), 657–664.
/// Published range: 1e-6 ≤ ε/D ≤ 1e-2, 5e3 ≤ Re ≤ 1e8, within 1 % of Colebrook
/// (the authors' claim; see the tests for what we measure).
pub fn swamee_jain(re: f64, rr: f64) -> f64 {
    let l = (rr / 3.7 + 5.74 / re.powf(0.9)).log10();
    0.25 / (l * l)
}

/// Haaland explicit approximation:
///
/// 1/√f = −1.8 log10[ ((ε/D)/3.7)^1.11 + 6.9/Re ]
///
/// Haaland, S. E. (1983). "Simple and explicit formulas for the friction
/// factor in turbulent pipe flow." J. Fluids Eng. 105(1), 89–90.
/// doi:10.1115/1.3240948. Published range 4e3 ≤ Re ≤ 1e8, 0 ≤ ε/D ≤ 0.05,
/// within about ±1.5 % of Colebrook.
pub fn haaland(re: f64, rr: f64) -> f64 {
    let x = -1.8 * ((rr / 3.7).powf(1.11) + 6.9 / re).log10();
    1.0 / (x * x)
}

/// Churchill's all-regime equation (laminar, transition and turbulent):
///
/// f = 8 [ (8/Re)^12 + (A + B)^−1.5 ]^(1/12),
/// A = [ 2.457 ln( 1 / ((7/Re)^0.9 + 0.27 ε/D) ) ]^16, B = (37530/Re)^16
///
/// Churchill, S. W. (1977). "Friction-factor equation spans all fluid-flow
/// regimes." Chemical Engineering 84(24), 91–92.
pub fn churchill_1977(re: f64, rr: f64) -> f64 {
    let a = (2.457 * (1.0 / ((7.0 / re).powf(0.9) + 0.27 * rr)).ln()).powi(16);
    let b = (37530.0 / re).powi(16);
    8.0 * ((8.0 / re).powi(12) + (a + b).powf(-1.5)).powf(1.0 / 12.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn log_grid() -> Vec<(f64, f64)> {
        let mut out = Vec::new();
        for i in 0..=40 {
            let re = 10f64.powf(3.6 + 4.4 * i as f64 / 40.0);
            for rr in [0.0, 1e-6, 1e-5, 1e-4, 1e-3, 5e-3, 1e-2, 2e-2, 5e-2] {
                out.push((re, rr));
            }
        }
        out
    }

    #[test]
    fn colebrook_residual_is_below_1e_12_everywhere_in_range() {
        for (re, rr) in log_grid() {
            let (f, iterations, rel) = colebrook_solve(re, rr);
            assert!(rel <= 1e-12, "Re {re} ε/D {rr}: residual {rel}");
            assert!(iterations <= 6, "Re {re} ε/D {rr}: {iterations} iterations");
            // And the equation holds when checked independently.
            let lhs = 1.0 / f.sqrt();
            let rhs = -2.0 * (rr / 3.7 + 2.51 / (re * f.sqrt())).log10();
            assert!(((lhs - rhs) / lhs).abs() < 1e-12);
        }
    }

    #[test]
    fn colebrook_reaches_re_1e8_and_rough_pipes() {
        // Up to Re = 1e8 and ε/D = 0.05, as required.
        let f = colebrook(1e8, 0.05).unwrap();
        // Fully rough limit (von Kármán): 1/√f = −2 log10(ε/D / 3.7).
        let rough = (2.0 * (0.05f64 / 3.7).log10()).powi(-2);
        assert!(((f - rough) / rough).abs() < 1e-4);
    }

    #[test]
    fn moody_1944_chart_reading() {
        // Moody (1944), Trans. ASME 66, Fig. 1: at Re = 1e5, ε/D = 0.001 the
        // chart reads f ≈ 0.022. A chart reading is good to about 2 %.
        let f = colebrook(1e5, 0.001).unwrap();
        assert!((f - 0.022).abs() / 0.022 < 0.02, "{f}");
    }

    #[test]
    fn transition_takes_the_higher_turbulent_value_and_says_so() {
        let fr = darcy(3000.0, 1e-4).unwrap();
        assert_eq!(fr.regime, Regime::Transition);
        assert!(fr.f > laminar(3000.0));
        assert_eq!(fr.f, colebrook(3000.0, 1e-4).unwrap());
    }

    #[test]
    fn bad_groups_are_errors_not_nan() {
        assert!(darcy(0.0, 0.0).is_err());
        assert!(darcy(f64::NAN, 0.0).is_err());
        assert!(darcy(1e5, -1e-4).is_err());
        assert!(darcy(1e5, 0.2).is_err());
    }

    /// Worst relative error of an approximation against the exact solve.
    fn worst(approx: fn(f64, f64) -> f64, re_lo: f64, re_hi: f64, rr_lo: f64, rr_hi: f64) -> f64 {
        let mut worst: f64 = 0.0;
        for i in 0..=60 {
            let re = re_lo * (re_hi / re_lo).powf(i as f64 / 60.0);
            for j in 0..=30 {
                let rr = if rr_lo == 0.0 && j == 0 {
                    0.0
                } else {
                    let lo = rr_lo.max(1e-7);
                    lo * (rr_hi / lo).powf(j as f64 / 30.0)
                };
                let exact = colebrook(re, rr).unwrap();
                worst = worst.max(((approx(re, rr) - exact) / exact).abs());
            }
        }
        worst
    }

    #[test]
    fn swamee_jain_within_its_bound() {
        // Swamee & Jain (1976) claim 1 % over ε/D 1e-6..1e-2, Re 5e3..1e8.
        // Against the exact solve (and fluids' Colebrook, which agrees) the
        // claim does not hold at the rough, low-Re corner: 2.83 % at Re 5e3,
        // ε/D 1e-2. For ε/D ≤ 1e-3 and Re ≥ 1e4 the worst is 1.14 %. We hold
        // the formula to what we measured, so a regression still fails.
        let w = worst(swamee_jain, 5e3, 1e8, 1e-6, 1e-2);
        eprintln!("Swamee–Jain worst relative error, full claimed range: {w:.4}");
        assert!(w < 0.029, "{w}");
        let w = worst(swamee_jain, 1e4, 1e8, 1e-6, 1e-3);
        eprintln!("Swamee–Jain worst relative error, Re ≥ 1e4, ε/D ≤ 1e-3: {w:.4}");
        assert!(w < 0.012, "{w}");
    }

    #[test]
    fn haaland_within_its_bound() {
        // Haaland (1983): about ±1.5 % over 4e3..1e8, ε/D 0..0.05.
        let w = worst(haaland, 4e3, 1e8, 0.0, 0.05);
        eprintln!("Haaland worst relative error: {w:.4}");
        assert!(w < 0.015, "{w}");
    }

    #[test]
    fn churchill_matches_laminar_and_colebrook() {
        // Churchill (1977) reduces to 64/Re in laminar flow ...
        for re in [10.0, 100.0, 1000.0] {
            assert!(((churchill_1977(re, 1e-3) - 64.0 / re) / (64.0 / re)).abs() < 0.005);
        }
        // ... and follows Colebrook in turbulent flow.
        let w = worst(churchill_1977, 1e4, 1e8, 0.0, 0.05);
        eprintln!("Churchill 1977 worst relative error (turbulent): {w:.4}");
        assert!(w < 0.03, "{w}");
    }
}
