//! Gases: air, nitrogen, carbon dioxide, natural gas by its relative
//! density, or a gas typed in (molar mass, viscosity, optionally Z).
//!
//! - Density from the gas law ρ = p M / (Z R T), R = 8.314 462 618
//!   J/(mol·K) (CODATA 2018, exact).
//! - Z from the second virial coefficient, Z = 1 + B p / (R T), with B by
//!   the Pitzer correlation in Abbott's form: B p_c / (R T_c) = B⁰ + ω B¹,
//!   B⁰ = 0.083 − 0.422 / T_r^1.6, B¹ = 0.139 − 0.172 / T_r^4.2 (Smith,
//!   Van Ness & Abbott, *Introduction to Chemical Engineering
//!   Thermodynamics*, eqs. 3.61–3.66). Meant for moderate pressures: a
//!   state whose Z falls below [`Z_FLOOR`] is refused.
//! - Critical constants and acentric factors: Poling, Prausnitz &
//!   O'Connell, *The Properties of Gases and Liquids*, 5th ed., appendix A
//!   (air as a pseudo-pure fluid) — typed from memory; `tests/reference.rs`
//!   checks the densities they give against CoolProp.
//! - Viscosity by Sutherland's law, μ = μ₀ (T/T₀)^1.5 (T₀ + S)/(T + S),
//!   with the constants of White, *Viscous Fluid Flow*, table 1-2 (from
//!   memory); it is the low-pressure viscosity, which the reference check
//!   compares with CoolProp's at pressure.
//! - Natural gas: molar mass 28.9647 × relative density; pseudo-critical
//!   constants by Sutton (1985), T_pc = 169.2 + 349.5 γ − 74.0 γ² °R,
//!   p_pc = 756.8 − 131.0 γ − 3.6 γ² psia, with methane's acentric factor;
//!   viscosity by Lee, Gonzalez & Eakin (1966, JPT 18(8)) from T, M and ρ.
//!   Both from memory; checked against CoolProp's methane.

use uom::si::dynamic_viscosity::pascal_second;
use uom::si::f64::{DynamicViscosity, MassDensity};
use uom::si::mass_density::kilogram_per_cubic_meter;

use super::properties::{FluidError, Properties};

/// Molar gas constant, J/(mol·K) (CODATA 2018, exact).
pub const R_MOLAR: f64 = 8.314_462_618;

/// Molar mass of dry air, g/mol (the relative density's reference; common
/// practice, as in ISO 13443 and the gas industry's tables).
pub const AIR_MOLAR_MASS: f64 = 28.9647;

/// Below this Z the virial form is too far from the gas's real behaviour
/// to size with (a limit of ours): the message points to a custom gas
/// with its own Z.
pub const Z_FLOOR: f64 = 0.85;

/// Lowest and highest absolute pressures a gas line is evaluated at, Pa
/// (a limit of ours).
pub const PRESSURE_RANGE_PA: (f64, f64) = (5e3, 5e6);

/// Lowest and highest temperatures, °C (a limit of ours).
pub const RANGE_C: (f64, f64) = (-50.0, 300.0);

/// Where a gas's numbers come from.
pub const SOURCES: &str = "gas law with Z from the Pitzer–Abbott virial correlation (critical constants: \
                           Poling et al. 2001); viscosity by Sutherland's law (White, table 1-2)";

/// Where natural gas's numbers come from.
pub const SOURCES_NATURAL: &str = "gas law with Z from the Pitzer–Abbott virial correlation on Sutton's \
                                   (1985) pseudo-critical constants; viscosity by Lee, Gonzalez & Eakin (1966)";

/// Where a gas typed in gets its numbers.
pub const SOURCES_CUSTOM: &str = "gas law with the molar mass, viscosity and Z entered by the user";

/// A gas whose properties are tabulated here.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Named {
    /// Stable id (the file's `fluid.gas.gas`).
    pub id: &'static str,
    /// How a list shows it.
    pub label: &'static str,
    /// Molar mass, g/mol.
    pub molar_mass: f64,
    /// Critical temperature, K.
    pub t_c: f64,
    /// Critical pressure, Pa.
    pub p_c: f64,
    /// Acentric factor.
    pub omega: f64,
    /// Sutherland: μ₀ (Pa·s) at T₀ (K), and S (K).
    pub sutherland: (f64, f64, f64),
}

/// Air (pseudo-pure; Poling et al. appendix A; White table 1-2).
pub const AIR: Named = Named {
    id: "air",
    label: "Air (dry)",
    molar_mass: AIR_MOLAR_MASS,
    t_c: 132.5,
    p_c: 3.77e6,
    omega: 0.035,
    sutherland: (1.716e-5, 273.0, 111.0),
};

/// Nitrogen.
pub const NITROGEN: Named = Named {
    id: "nitrogen",
    label: "Nitrogen",
    molar_mass: 28.0134,
    t_c: 126.2,
    p_c: 3.398e6,
    omega: 0.037,
    sutherland: (1.663e-5, 273.0, 107.0),
};

/// Carbon dioxide.
pub const CARBON_DIOXIDE: Named = Named {
    id: "carbon-dioxide",
    label: "Carbon dioxide",
    molar_mass: 44.0095,
    t_c: 304.13,
    p_c: 7.377e6,
    omega: 0.224,
    sutherland: (1.370e-5, 273.0, 222.0),
};

/// Methane's acentric factor (Poling et al.), taken for natural gas.
const METHANE_OMEGA: f64 = 0.011;

/// Relative densities accepted for natural gas (methane-rich; Sutton's
/// and Lee–Gonzalez–Eakin's data cover these).
pub const RELATIVE_DENSITY_RANGE: (f64, f64) = (0.55, 0.9);

/// A gas in a line.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Gas {
    /// One of the tabulated gases.
    Named(&'static Named),
    /// Natural gas of a relative density (to air).
    Natural {
        /// Relative density to air, e.g. 0.6.
        relative_density: f64,
    },
    /// A gas typed in.
    Custom {
        /// Molar mass, g/mol.
        molar_mass: f64,
        /// Dynamic viscosity, Pa·s (taken as constant).
        viscosity: f64,
        /// Compressibility factor Z, 1 when not given.
        z: f64,
    },
}

/// The tabulated gases, in listing order.
pub const NAMED: [&Named; 3] = [&AIR, &NITROGEN, &CARBON_DIOXIDE];

/// Sutherland's law.
pub fn sutherland(t_k: f64, (mu0, t0, s): (f64, f64, f64)) -> f64 {
    mu0 * (t_k / t0).powf(1.5) * (t0 + s) / (t_k + s)
}

/// Z from the second virial coefficient by the Pitzer–Abbott correlation.
pub fn virial_z(t_k: f64, p_pa: f64, t_c: f64, p_c: f64, omega: f64) -> f64 {
    let tr = t_k / t_c;
    let pr = p_pa / p_c;
    let b0 = 0.083 - 0.422 / tr.powf(1.6);
    let b1 = 0.139 - 0.172 / tr.powf(4.2);
    1.0 + (b0 + omega * b1) * pr / tr
}

/// Sutton's pseudo-critical temperature (K) and pressure (Pa) of a natural
/// gas of relative density `g`.
pub fn sutton_pseudo_critical(g: f64) -> (f64, f64) {
    let t_r = 169.2 + 349.5 * g - 74.0 * g * g;
    let p_psia = 756.8 - 131.0 * g - 3.6 * g * g;
    (t_r * 5.0 / 9.0, p_psia * 6_894.757_293_168)
}

/// Lee–Gonzalez–Eakin viscosity, Pa·s, from T (K), molar mass (g/mol) and
/// density (kg/m³).
pub fn lee_gonzalez_eakin(t_k: f64, m: f64, rho: f64) -> f64 {
    let t_r = t_k * 1.8;
    let k = (9.4 + 0.02 * m) * t_r.powf(1.5) / (209.0 + 19.0 * m + t_r);
    let x = 3.5 + 986.0 / t_r + 0.01 * m;
    let y = 2.4 - 0.2 * x;
    1e-4 * k * (x * (rho / 1000.0).powf(y)).exp() * 1e-3
}

impl Gas {
    /// Molar mass, g/mol.
    pub fn molar_mass(&self) -> f64 {
        match *self {
            Gas::Named(n) => n.molar_mass,
            Gas::Natural { relative_density } => AIR_MOLAR_MASS * relative_density,
            Gas::Custom { molar_mass, .. } => molar_mass,
        }
    }

    /// Compressibility factor Z at T (K) and p (Pa absolute).
    pub fn z(&self, t_k: f64, p_pa: f64) -> f64 {
        match *self {
            Gas::Named(n) => virial_z(t_k, p_pa, n.t_c, n.p_c, n.omega),
            Gas::Natural { relative_density } => {
                let (tc, pc) = sutton_pseudo_critical(relative_density);
                virial_z(t_k, p_pa, tc, pc, METHANE_OMEGA)
            }
            Gas::Custom { z, .. } => z,
        }
    }

    /// Density, kg/m³, by the gas law with [`Gas::z`].
    pub fn density(&self, t_k: f64, p_pa: f64) -> f64 {
        p_pa * self.molar_mass() * 1e-3 / (self.z(t_k, p_pa) * R_MOLAR * t_k)
    }

    /// Where its numbers come from.
    pub fn sources(&self) -> &'static str {
        match self {
            Gas::Named(_) => SOURCES,
            Gas::Natural { .. } => SOURCES_NATURAL,
            Gas::Custom { .. } => SOURCES_CUSTOM,
        }
    }
}

/// The named gas of an id.
pub fn named(id: &str) -> Option<&'static Named> {
    NAMED.into_iter().find(|n| n.id == id)
}

/// Density and viscosity of a gas at T (K) and p (Pa absolute).
///
/// # Errors
/// [`FluidError::TemperatureRange`], [`FluidError::GasPressure`] outside
/// our ranges; [`FluidError::NotNearIdeal`] when Z falls below
/// [`Z_FLOOR`]; [`FluidError::Custom`] for a typed property that is not
/// positive; [`FluidError::RelativeDensity`] outside its range.
///
/// # Examples
/// ```
/// use headroom::hydraulics::fluid::gas::{properties, Gas, AIR};
/// // Air at 20 °C and one atmosphere: about 1.204 kg/m³ and 18.2 µPa·s.
/// let p = properties(Gas::Named(&AIR), 293.15, 101_325.0).unwrap();
/// assert!((p.density_kg_m3() - 1.204).abs() < 0.003);
/// assert!((p.viscosity_pa_s() - 18.2e-6).abs() < 0.3e-6);
/// ```
pub fn properties(gas: Gas, t_k: f64, p_pa: f64) -> Result<Properties, FluidError> {
    let t_c = t_k - 273.15;
    if !(t_c.is_finite() && (RANGE_C.0..=RANGE_C.1).contains(&t_c)) {
        return Err(FluidError::TemperatureRange { t_c, min_c: RANGE_C.0, max_c: RANGE_C.1 });
    }
    let (lo, hi) = PRESSURE_RANGE_PA;
    if !(p_pa.is_finite() && (lo..=hi).contains(&p_pa)) {
        return Err(FluidError::GasPressure { p_pa, min_pa: lo, max_pa: hi });
    }
    let mu = match gas {
        Gas::Named(n) => sutherland(t_k, n.sutherland),
        Gas::Natural { relative_density } => {
            let (a, b) = RELATIVE_DENSITY_RANGE;
            if !(relative_density.is_finite() && (a..=b).contains(&relative_density)) {
                return Err(FluidError::RelativeDensity { value: relative_density, min: a, max: b });
            }
            let rho = gas.density(t_k, p_pa);
            lee_gonzalez_eakin(t_k, gas.molar_mass(), rho)
        }
        Gas::Custom { molar_mass, viscosity, z } => {
            for (v, what) in [(molar_mass, "molar mass"), (viscosity, "viscosity"), (z, "compressibility factor Z")] {
                if !(v.is_finite() && v > 0.0) {
                    return Err(FluidError::Custom(what));
                }
            }
            viscosity
        }
    };
    let z = gas.z(t_k, p_pa);
    if !matches!(gas, Gas::Custom { .. }) && z < Z_FLOOR {
        return Err(FluidError::NotNearIdeal { z, floor: Z_FLOOR });
    }
    Ok(Properties {
        density: MassDensity::new::<kilogram_per_cubic_meter>(gas.density(t_k, p_pa)),
        viscosity: DynamicViscosity::new::<pascal_second>(mu),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn sutton_gives_methane_like_constants_at_methane_relative_density() {
        // Methane: relative density 16.043 / 28.9647 = 0.554; T_c 190.6 K,
        // p_c 4.60 MPa (Poling et al.). Sutton's fit is for gas mixtures, so
        // only near.
        let (tc, pc) = sutton_pseudo_critical(16.043 / AIR_MOLAR_MASS);
        assert!((tc - 190.6).abs() < 3.0, "{tc}");
        assert!((pc - 4.60e6).abs() < 0.15e6, "{pc}");
    }

    #[test]
    fn z_falls_with_pressure_and_is_one_at_zero_pressure() {
        let z0 = AIR.omega; // silence: constants are used below
        assert!(z0 > 0.0);
        assert_eq!(virial_z(300.0, 0.0, AIR.t_c, AIR.p_c, AIR.omega), 1.0);
        let a = virial_z(250.0, 1e6, CARBON_DIOXIDE.t_c, CARBON_DIOXIDE.p_c, CARBON_DIOXIDE.omega);
        let b = virial_z(250.0, 2e6, CARBON_DIOXIDE.t_c, CARBON_DIOXIDE.p_c, CARBON_DIOXIDE.omega);
        assert!(b < a && a < 1.0, "{a} {b}");
    }

    #[test]
    fn carbon_dioxide_near_condensing_is_refused() {
        // 40 bar at 10 °C is close to CO2's saturation (about 45 bar).
        let e = properties(Gas::Named(&CARBON_DIOXIDE), 283.15, 4e6);
        assert!(matches!(e, Err(FluidError::NotNearIdeal { .. })), "{e:?}");
    }
}
