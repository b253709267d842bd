//! Steam, dry saturated or superheated: density from IAPWS-IF97 region 2,
//! the saturation state from region 4, viscosity from IAPWS 2008.
//!
//! - IAPWS (2007). Revised Release on IAPWS-IF97, equation 15 with the
//!   residual part's table 11 (region 2); the ideal-gas part's volume is
//!   R T / p exactly, so its table 10 is not needed for density. Equation
//!   30 (region 4) gives the saturation pressure; the saturation
//!   temperature is found from it by bisection (the forward equation's own
//!   inverse, rather than the backward equation 31).
//! - IAPWS 2008 viscosity: shared with liquid water ([`super::water`]).
//!
//! Coefficients typed from memory of the release; the tests repeat its
//! table 15 (region 2 verification values) to the printed digits. One slip
//! (n31 typed as …e-9 instead of …e-8) was found by comparing with the
//! `iapws` package's table (PyPI) and corrected.
//!
//! Wet steam is refused, never treated as dry: a temperature below the
//! saturation temperature at the line's pressure is an error.

use uom::si::dynamic_viscosity::pascal_second;
use uom::si::f64::{DynamicViscosity, MassDensity};
use uom::si::mass_density::kilogram_per_cubic_meter;

use super::properties::{FluidError, Properties};
use super::water::{iapws2008_viscosity, if97_saturation_pressure};

/// Where steam's numbers come from.
pub const SOURCES: &str = "IAPWS-IF97 region 2 (density) and region 4 (saturation); IAPWS 2008 (viscosity)";

/// IF97 specific gas constant, J/(kg·K).
const R: f64 = 461.526;

/// Absolute pressures a steam line is evaluated at, Pa (a limit of ours,
/// inside region 2 for every temperature accepted).
pub const PRESSURE_RANGE_PA: (f64, f64) = (5e3, 10e6);

/// Highest temperature, °C (a limit of ours; region 2 reaches 800 °C).
pub const MAX_C: f64 = 600.0;

/// IF97 region 2, residual part: (I, J, n), table 11.
const REGION2_RES: [(i32, i32, f64); 43] = [
    (1, 0, -0.177_317_424_732_13e-2),
    (1, 1, -0.178_348_622_923_58e-1),
    (1, 2, -0.459_960_136_963_65e-1),
    (1, 3, -0.575_812_590_834_32e-1),
    (1, 6, -0.503_252_787_279_30e-1),
    (2, 1, -0.330_326_416_702_03e-4),
    (2, 2, -0.189_489_875_163_15e-3),
    (2, 4, -0.393_927_772_433_55e-2),
    (2, 7, -0.437_972_956_505_73e-1),
    (2, 36, -0.266_745_479_140_87e-4),
    (3, 0, 0.204_817_376_923_09e-7),
    (3, 1, 0.438_706_672_844_35e-6),
    (3, 3, -0.322_776_772_385_70e-4),
    (3, 6, -0.150_339_245_421_48e-2),
    (3, 35, -0.406_682_535_626_49e-1),
    (4, 1, -0.788_473_095_593_67e-9),
    (4, 2, 0.127_907_178_522_85e-7),
    (4, 3, 0.482_253_727_185_07e-6),
    (5, 7, 0.229_220_763_376_61e-5),
    (6, 3, -0.167_147_664_510_61e-10),
    (6, 16, -0.211_714_723_213_55e-2),
    (6, 35, -0.238_957_419_341_04e2),
    (7, 0, -0.590_595_643_242_70e-17),
    (7, 11, -0.126_218_088_991_01e-5),
    (7, 25, -0.389_468_424_357_39e-1),
    (8, 8, 0.112_562_113_604_59e-10),
    (8, 36, -0.823_113_408_979_98e1),
    (9, 13, 0.198_097_128_020_88e-7),
    (10, 4, 0.104_069_652_101_74e-18),
    (10, 10, -0.102_347_470_959_29e-12),
    (10, 14, -0.100_181_793_795_11e-8),
    (16, 29, -0.808_829_086_469_85e-10),
    (16, 50, 0.106_930_318_794_09),
    (18, 57, -0.336_622_505_741_71),
    (20, 20, 0.891_858_453_554_21e-24),
    (20, 35, 0.306_293_168_762_32e-12),
    (20, 48, -0.420_024_676_982_08e-5),
    (21, 21, -0.590_560_296_856_39e-25),
    (22, 53, 0.378_269_476_134_57e-5),
    (23, 39, -0.127_686_089_346_81e-14),
    (24, 26, 0.730_876_105_950_61e-28),
    (24, 40, 0.554_147_153_507_78e-16),
    (24, 58, -0.943_697_072_412_10e-6),
];

/// Specific volume in region 2, m³/kg, at T (K) and p (Pa):
/// v = (R T / p) π (1/π + γʳ_π), π = p / 1 MPa, τ = 540 K / T.
pub fn if97_region2_specific_volume(t_k: f64, p_pa: f64) -> f64 {
    let pi = p_pa / 1e6;
    let tau = 540.0 / t_k;
    let g_pi: f64 = REGION2_RES.iter().map(|&(i, j, n)| n * f64::from(i) * pi.powi(i - 1) * (tau - 0.5).powi(j)).sum();
    R * t_k / p_pa * (1.0 + pi * g_pi)
}

/// Saturation temperature, K, at p (Pa absolute): the IF97 region 4
/// saturation-pressure equation inverted by bisection to 1e-10 K.
pub fn saturation_temperature(p_pa: f64) -> f64 {
    let (mut lo, mut hi) = (273.16, 647.096);
    for _ in 0..80 {
        let mid = 0.5 * (lo + hi);
        if if97_saturation_pressure(mid) < p_pa {
            lo = mid;
        } else {
            hi = mid;
        }
        if hi - lo < 1e-10 {
            break;
        }
    }
    0.5 * (lo + hi)
}

/// Density and viscosity of dry steam at p (Pa absolute): at saturation
/// when `t_k` is `None`, superheated at `t_k` otherwise.
///
/// # Errors
/// [`FluidError::SteamPressure`] outside [`PRESSURE_RANGE_PA`];
/// [`FluidError::WetSteam`] below the saturation temperature;
/// [`FluidError::TemperatureRange`] above [`MAX_C`].
///
/// # Examples
/// ```
/// use headroom::hydraulics::fluid::steam::properties;
/// // Dry saturated steam at 10 bar absolute: 179.9 °C, 5.145 kg/m³
/// // (IF97 steam tables: v'' = 0.1944 m³/kg).
/// let s = properties(None, 1e6).unwrap();
/// assert!((s.density_kg_m3() - 5.145).abs() < 0.005);
/// ```
pub fn properties(t_k: Option<f64>, p_pa: f64) -> Result<Properties, FluidError> {
    let (lo, hi) = PRESSURE_RANGE_PA;
    if !(p_pa.is_finite() && (lo..=hi).contains(&p_pa)) {
        return Err(FluidError::SteamPressure { p_pa, min_pa: lo, max_pa: hi });
    }
    let t_sat = saturation_temperature(p_pa);
    let t = match t_k {
        None => t_sat,
        Some(t) => {
            let t_c = t - 273.15;
            if !t.is_finite() || t_c > MAX_C {
                return Err(FluidError::TemperatureRange { t_c, min_c: t_sat - 273.15, max_c: MAX_C });
            }
            // A hundredth of a kelvin allows a saturation temperature typed
            // to two decimals.
            if t < t_sat - 0.01 {
                return Err(FluidError::WetSteam { t_c, t_sat_c: t_sat - 273.15, p_pa });
            }
            t.max(t_sat)
        }
    };
    let rho = 1.0 / if97_region2_specific_volume(t, p_pa);
    Ok(Properties {
        density: MassDensity::new::<kilogram_per_cubic_meter>(rho),
        viscosity: DynamicViscosity::new::<pascal_second>(iapws2008_viscosity(t, rho)),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn if97_table15_region2_specific_volume() {
        // IAPWS-IF97 (2007 revision), table 15, v in m³/kg.
        for (t, p_mpa, v) in
            [(300.0, 0.0035, 0.394_913_866e2), (700.0, 0.0035, 0.923_015_898e2), (700.0, 30.0, 0.542_946_619e-2)]
        {
            let got = if97_region2_specific_volume(t, p_mpa * 1e6);
            assert!(((got - v) / v).abs() < 5e-9, "T {t} p {p_mpa}: {got} vs {v}");
        }
    }

    #[test]
    fn saturation_temperature_inverts_table35() {
        // IAPWS-IF97 table 35: ps(500 K) = 2.63889776 MPa.
        assert!((saturation_temperature(2.638_897_76e6) - 500.0).abs() < 1e-6);
    }

    #[test]
    fn wet_steam_is_refused() {
        let e = properties(Some(273.15 + 150.0), 1e6);
        assert!(matches!(e, Err(FluidError::WetSteam { .. })), "{e:?}");
    }
}
