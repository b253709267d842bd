//! Ethylene and propylene glycol solutions in water.
//!
//! Source: Melinder, Å. (2010). *Properties of Secondary Working Fluids for
//! Indirect Systems*, 2nd ed., International Institute of Refrigeration —
//! as implemented in CoolProp's incompressible mixtures INCOMP::MEG and
//! INCOMP::MPG. We do not ship Melinder's polynomial coefficients: we ship a
//! table tabulated from CoolProp 8.0.0 (`glycol_table.rs`, made by
//! `tests/reference/glycol_table.py`) at 10–60 % by mass in 5 % steps and
//! −50…100 °C in 2.5 K steps, and interpolate bilinearly in density and in
//! ln μ. The test command measures the interpolation error against CoolProp
//! off the grid (see the README).
//!
//! Below the mixture's freezing point (also from the table) the answer is an
//! error, never a number. Between strengths the freezing point is a
//! quadratic through the three nearest rows, never colder than the chord:
//! the curve bends down (each 5 % colder by more than the last), so a
//! straight line between rows puts the freezing point too cold, on the
//! unsafe side.

use uom::si::dynamic_viscosity::pascal_second;
use uom::si::f64::{DynamicViscosity, MassDensity, ThermodynamicTemperature};
use uom::si::mass_density::kilogram_per_cubic_meter;
use uom::si::thermodynamic_temperature::degree_celsius;

use super::glycol_table as table;
use super::properties::{FluidError, Properties};
use super::Glycol;

/// Where a glycol solution's numbers come from.
pub const SOURCES: &str = "Melinder (2010) via CoolProp INCOMP tables, interpolated";

/// Highest temperature tabulated, °C.
pub const T_MAX_C: f64 = 100.0;

/// One property on the grid, in whole steps: each row's first value and
/// the change from each column to the next (how `glycol_table.rs` stores
/// it, because small changes compress far better than f32 values).
pub struct Packed {
    /// The size of one step, in the property's unit.
    pub step: f64,
    /// Each row's value at the first column, in steps.
    pub starts: [i32; 11],
    /// Each row's change from one column to the next, in steps.
    pub changes: [[i16; table::NT - 1]; 11],
}

impl Packed {
    /// The value at row `r`, column `c`: exact to the step (the changes
    /// sum without error).
    pub fn at(&self, r: usize, c: usize) -> f64 {
        let q = self.starts[r] + self.changes[r][..c].iter().map(|&d| i32::from(d)).sum::<i32>();
        self.step * f64::from(q)
    }
}

fn tables(g: Glycol) -> (&'static [f64; 11], &'static Packed, &'static Packed) {
    match g {
        Glycol::Ethylene => (&table::ETHYLENE_FREEZE_C, &table::ETHYLENE_RHO, &table::ETHYLENE_LN_MU),
        Glycol::Propylene => (&table::PROPYLENE_FREEZE_C, &table::PROPYLENE_RHO, &table::PROPYLENE_LN_MU),
    }
}

/// Row index and weight of `x` between rows (clamped into the table).
fn bracket(x: f64) -> (usize, f64) {
    let f = &table::FRACTIONS;
    let step = f[1] - f[0];
    let pos = crate::hydraulics::digits::clamp((x - f[0]) / step, 0.0, (f.len() - 1) as f64);
    let i = (pos.floor() as usize).min(f.len() - 2);
    (i, pos - i as f64)
}

/// Freezing point of a mixture, °C: quadratic through the three nearest
/// tabulated strengths, and never colder than the straight line between the
/// two around it.
///
/// # Errors
/// [`FluidError::Concentration`] outside 10–60 % by mass.
pub fn freezing_point_c(g: Glycol, fraction: f64) -> Result<f64, FluidError> {
    let (lo, hi) = (table::FRACTIONS[0], table::FRACTIONS[table::FRACTIONS.len() - 1]);
    if !(fraction.is_finite() && (lo - 1e-9..=hi + 1e-9).contains(&fraction)) {
        return Err(FluidError::Concentration { fraction, min: lo, max: hi });
    }
    let (freeze, _, _) = tables(g);
    let (i, w) = bracket(fraction);
    let chord = freeze[i] * (1.0 - w) + freeze[i + 1] * w;
    // Three rows j, j+1, j+2 holding i and i+1, positions 0, 1, 2.
    let j = if i + 2 < freeze.len() { i } else { i - 1 };
    let u = w + (i - j) as f64;
    let (a, b, c) = (freeze[j], freeze[j + 1], freeze[j + 2]);
    let quadratic = a * (u - 1.0) * (u - 2.0) / 2.0 - b * u * (u - 2.0) + c * u * (u - 1.0) / 2.0;
    Ok(quadratic.max(chord))
}

/// The table cells around a state, after the range checks every property
/// shares: row `i` and weight `wx` in strength, column `j` and weight `wt`
/// in temperature.
fn locate(g: Glycol, fraction: f64, t: ThermodynamicTemperature) -> Result<(usize, f64, usize, f64), FluidError> {
    let t_c = t.get::<degree_celsius>();
    let freeze_c = freezing_point_c(g, fraction)?;
    if !t_c.is_finite() || t_c > T_MAX_C {
        return Err(FluidError::TemperatureRange { t_c, min_c: freeze_c.max(table::T_MIN_C), max_c: T_MAX_C });
    }
    if t_c < freeze_c {
        return Err(FluidError::Freezes { t_c, freeze_c });
    }
    if t_c < table::T_MIN_C {
        return Err(FluidError::TemperatureRange { t_c, min_c: table::T_MIN_C, max_c: T_MAX_C });
    }
    let (i, wx) = bracket(fraction);
    let pos = crate::hydraulics::digits::clamp((t_c - table::T_MIN_C) / table::T_STEP_C, 0.0, (table::NT - 1) as f64);
    let j = (pos.floor() as usize).min(table::NT - 2);
    Ok((i, wx, j, pos - j as f64))
}

/// Bilinear interpolation in one table at a located state.
fn bilinear(m: &Packed, (i, wx, j, wt): (usize, f64, usize, f64)) -> f64 {
    let at = |r: usize, c: usize| m.at(r, c);
    let a = at(i, j) * (1.0 - wt) + at(i, j + 1) * wt;
    let b = at(i + 1, j) * (1.0 - wt) + at(i + 1, j + 1) * wt;
    a * (1.0 - wx) + b * wx
}

/// Density and viscosity of a glycol solution.
///
/// # Errors
/// [`FluidError::Concentration`] outside 10–60 %; [`FluidError::Freezes`]
/// below the freezing point; [`FluidError::TemperatureRange`] above 100 °C or
/// below the table's −50 °C.
///
/// # Examples
/// ```
/// use headroom::hydraulics::fluid::{glycol, Glycol};
/// use uom::si::{f64::ThermodynamicTemperature, thermodynamic_temperature::degree_celsius};
/// let p = glycol::properties(Glycol::Ethylene, 0.30, ThermodynamicTemperature::new::<degree_celsius>(20.0)).unwrap();
/// // CoolProp 8.0.0 INCOMP::MEG-30% at 20 °C: 1038.05 kg/m³, 2.166 mPa·s.
/// assert!((p.density_kg_m3() - 1038.05).abs() < 0.05);
/// assert!((p.viscosity_pa_s() * 1e3 - 2.166).abs() < 0.002);
/// ```
pub fn properties(g: Glycol, fraction: f64, t: ThermodynamicTemperature) -> Result<Properties, FluidError> {
    let at = locate(g, fraction, t)?;
    let (_, rho, ln_mu) = tables(g);
    Ok(Properties {
        density: MassDensity::new::<kilogram_per_cubic_meter>(bilinear(rho, at)),
        viscosity: DynamicViscosity::new::<pascal_second>(bilinear(ln_mu, at).exp()),
    })
}

/// Specific heat c_p of a glycol solution, J/(kg·K), from the same
/// Melinder (2010) fits via the same CoolProp table.
///
/// # Errors
/// As [`properties`].
pub fn specific_heat(g: Glycol, fraction: f64, t: ThermodynamicTemperature) -> Result<f64, FluidError> {
    let at = locate(g, fraction, t)?;
    let cp = match g {
        Glycol::Ethylene => &table::ETHYLENE_CP,
        Glycol::Propylene => &table::PROPYLENE_CP,
    };
    Ok(bilinear(cp, at))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn at(c: f64) -> ThermodynamicTemperature {
        ThermodynamicTemperature::new::<degree_celsius>(c)
    }

    #[test]
    fn below_freezing_is_an_error() {
        // CoolProp 8.0.0: INCOMP::MEG-30% freezes at −14.58 °C.
        let e = properties(Glycol::Ethylene, 0.30, at(-16.0)).unwrap_err();
        assert!(matches!(e, FluidError::Freezes { freeze_c, .. } if (freeze_c + 14.58).abs() < 0.01));
        assert!(properties(Glycol::Ethylene, 0.30, at(-14.0)).is_ok());
    }

    #[test]
    fn strength_outside_the_table_is_an_error() {
        assert!(properties(Glycol::Propylene, 0.05, at(20.0)).is_err());
        assert!(properties(Glycol::Propylene, 0.70, at(20.0)).is_err());
    }

    #[test]
    fn propylene_is_more_viscous_than_ethylene_at_the_same_strength() {
        // Common knowledge of the trade, and what both tables say.
        let e = properties(Glycol::Ethylene, 0.40, at(5.0)).unwrap();
        let p = properties(Glycol::Propylene, 0.40, at(5.0)).unwrap();
        assert!(p.viscosity_pa_s() > e.viscosity_pa_s());
    }
}
