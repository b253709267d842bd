//! Liquid water: density from IAPWS-IF97 region 1, saturation pressure from
//! IF97 region 4, dynamic viscosity from IAPWS 2008.
//!
//! - IAPWS (2007). Revised Release on the IAPWS Industrial Formulation 1997
//!   for the Thermodynamic Properties of Water and Steam (IAPWS-IF97),
//!   equations 7 (region 1) and 30 (region 4), tables 2 and 34.
//! - IAPWS (2008). Release on the IAPWS Formulation 2008 for the Viscosity
//!   of Ordinary Water Substance, equations 10–12, tables 1 and 2, with the
//!   critical enhancement μ2 = 1 (the release's recommendation for
//!   industrial use outside the near-critical region).
//!
//! Coefficients were typed from memory of those releases; the tests repeat
//! the releases' own verification tables (IF97 tables 5 and 35, IAPWS 2008
//! table 4) to their printed digits, which a wrong coefficient cannot pass.
//! They caught one slip (n33 of region 1 typed as …e-20 instead of …e-23),
//! corrected after comparing with the table in the `iapws` package (PyPI).
//!
//! We accept 0–150 °C (heating water is often pressurised above 100 °C) and
//! refuse a state where the water would boil at the stated pressure.

use uom::si::dynamic_viscosity::pascal_second;
use uom::si::f64::{DynamicViscosity, MassDensity, Pressure, ThermodynamicTemperature};
use uom::si::mass_density::kilogram_per_cubic_meter;
use uom::si::pressure::pascal;
use uom::si::thermodynamic_temperature::kelvin;

use super::properties::{FluidError, Properties};

/// Where water's numbers come from.
pub const SOURCES: &str = "IAPWS-IF97 region 1 (density); IAPWS 2008 (viscosity)";

/// Specific gas constant of water used by IF97, J/(kg·K) (IF97 eq. 1).
const R: f64 = 461.526;

/// IF97 region 1: (I, J, n), table 2.
const REGION1: [(i32, i32, f64); 34] = [
    (0, -2, 0.146_329_712_131_67),
    (0, -1, -0.845_481_871_691_14),
    (0, 0, -0.375_636_036_720_40e1),
    (0, 1, 0.338_551_691_683_85e1),
    (0, 2, -0.957_919_633_878_72),
    (0, 3, 0.157_720_385_132_28),
    (0, 4, -0.166_164_171_995_01e-1),
    (0, 5, 0.812_146_299_835_68e-3),
    (1, -9, 0.283_190_801_238_04e-3),
    (1, -7, -0.607_063_015_658_74e-3),
    (1, -1, -0.189_900_682_184_19e-1),
    (1, 0, -0.325_297_487_705_05e-1),
    (1, 1, -0.218_417_171_754_14e-1),
    (1, 3, -0.528_383_579_699_30e-4),
    (2, -3, -0.471_843_210_732_67e-3),
    (2, 0, -0.300_017_807_930_26e-3),
    (2, 1, 0.476_613_939_069_87e-4),
    (2, 3, -0.441_418_453_308_46e-5),
    (2, 17, -0.726_949_962_975_94e-15),
    (3, -4, -0.316_796_448_450_54e-4),
    (3, 0, -0.282_707_979_853_12e-5),
    (3, 6, -0.852_051_281_201_03e-9),
    (4, -5, -0.224_252_819_080_00e-5),
    (4, -2, -0.651_712_228_956_01e-6),
    (4, 10, -0.143_417_299_379_24e-12),
    (5, -8, -0.405_169_968_601_17e-6),
    (8, -11, -0.127_343_017_416_41e-8),
    (8, -6, -0.174_248_712_306_34e-9),
    (21, -29, -0.687_621_312_955_31e-18),
    (23, -31, 0.144_783_078_285_21e-19),
    (29, -38, 0.263_357_816_627_95e-22),
    (30, -39, -0.119_476_226_400_71e-22),
    (31, -40, 0.182_280_945_814_04e-23),
    (32, -41, -0.935_370_872_924_58e-25),
];

/// Specific volume in region 1, m³/kg, from T in K and p in Pa (IF97 eq. 7
/// and table 3: v = (R T / p) π γπ, π = p / 16.53 MPa, τ = 1386 K / T).
pub fn if97_region1_specific_volume(t_k: f64, p_pa: f64) -> f64 {
    let pi = p_pa / 16.53e6;
    let tau = 1386.0 / t_k;
    let gamma_pi: f64 =
        REGION1.iter().map(|&(i, j, n)| -n * i as f64 * (7.1 - pi).powi(i - 1) * (tau - 1.222).powi(j)).sum();
    R * t_k / p_pa * pi * gamma_pi
}

/// Specific isobaric heat capacity in region 1, J/(kg·K), from T in K and p
/// in Pa (IF97 table 3: c_p = −R τ² γ_ττ).
pub fn if97_region1_cp(t_k: f64, p_pa: f64) -> f64 {
    let pi = p_pa / 16.53e6;
    let tau = 1386.0 / t_k;
    let gamma_tautau: f64 = REGION1
        .iter()
        .map(|&(i, j, n)| n * (7.1 - pi).powi(i) * f64::from(j * (j - 1)) * (tau - 1.222).powi(j - 2))
        .sum();
    -R * tau * tau * gamma_tautau
}

/// Specific heat c_p of liquid water, J/(kg·K), at a temperature and an
/// absolute pressure (IAPWS-IF97 region 1), with the same range checks as
/// [`properties`].
///
/// # Errors
/// As [`properties`].
pub fn specific_heat(t: ThermodynamicTemperature, p: Pressure) -> Result<f64, FluidError> {
    properties(t, p)?;
    Ok(if97_region1_cp(t.get::<kelvin>(), p.get::<pascal>()))
}

/// Saturation pressure in Pa at T in K (IF97 region 4, eq. 30, table 34).
pub fn if97_saturation_pressure(t_k: f64) -> f64 {
    const N: [f64; 10] = [
        0.116_705_214_527_67e4,
        -0.724_213_167_032_06e6,
        -0.170_738_469_400_92e2,
        0.120_208_247_024_70e5,
        -0.323_255_503_223_33e7,
        0.149_151_086_135_30e2,
        -0.482_326_573_615_91e4,
        0.405_113_405_420_57e6,
        -0.238_555_575_678_49,
        0.650_175_348_447_98e3,
    ];
    let theta = t_k + N[8] / (t_k - N[9]);
    let a = theta * theta + N[0] * theta + N[1];
    let b = N[2] * theta * theta + N[3] * theta + N[4];
    let c = N[5] * theta * theta + N[6] * theta + N[7];
    let x = 2.0 * c / (-b + (b * b - 4.0 * a * c).sqrt());
    x.powi(4) * 1e6
}

/// Dynamic viscosity in Pa·s from T in K and density in kg/m³ (IAPWS 2008,
/// eqs. 10–12 with μ2 = 1).
pub fn iapws2008_viscosity(t_k: f64, rho: f64) -> f64 {
    const H0: [f64; 4] = [1.677_52, 2.204_62, 0.636_656_4, -0.241_605];
    // H1[i][j], table 2.
    const H1: [[f64; 7]; 6] = [
        [5.200_94e-1, 2.225_31e-1, -2.813_78e-1, 1.619_13e-1, -3.253_72e-2, 0.0, 0.0],
        [8.508_95e-2, 9.991_15e-1, -9.068_51e-1, 2.573_99e-1, 0.0, 0.0, 0.0],
        [-1.083_74, 1.887_97, -7.724_79e-1, 0.0, 0.0, 0.0, 0.0],
        [-2.895_55e-1, 1.266_13, -4.898_37e-1, 0.0, 6.984_52e-2, 0.0, -4.356_73e-3],
        [0.0, 0.0, -2.570_40e-1, 0.0, 0.0, 8.721_02e-3, 0.0],
        [0.0, 1.205_73e-1, 0.0, 0.0, 0.0, 0.0, -5.932_64e-4],
    ];
    let tb = t_k / 647.096;
    let rb = rho / 322.0;
    let mu0 = 100.0 * tb.sqrt() / H0.iter().enumerate().map(|(i, h)| h / tb.powi(i as i32)).sum::<f64>();
    let mut sum = 0.0;
    for (i, row) in H1.iter().enumerate() {
        for (j, h) in row.iter().enumerate() {
            sum += h * (1.0 / tb - 1.0).powi(i as i32) * (rb - 1.0).powi(j as i32);
        }
    }
    let mu1 = (rb * sum).exp();
    mu0 * mu1 * 1e-6
}

/// Lowest and highest temperatures accepted, °C.
pub const RANGE_C: (f64, f64) = (0.0, 150.0);

/// Highest pressure water is evaluated at, Pa absolute (a limit of ours;
/// IF97 region 1 itself reaches 100 MPa).
pub const MAX_PRESSURE_PA: f64 = 10e6;

/// Density and viscosity of liquid water at a temperature and an absolute
/// pressure.
///
/// # Errors
/// [`FluidError::TemperatureRange`] outside [`RANGE_C`];
/// [`FluidError::PressureRange`] above [`MAX_PRESSURE_PA`];
/// [`FluidError::Boils`] when the pressure is below the saturation pressure.
///
/// # Examples
/// ```
/// use uom::si::f64::{Pressure, ThermodynamicTemperature};
/// use uom::si::{pressure::kilopascal, thermodynamic_temperature::degree_celsius};
/// let w = headroom::hydraulics::fluid::water::properties(
///     ThermodynamicTemperature::new::<degree_celsius>(20.0),
///     Pressure::new::<kilopascal>(101.325),
/// ).unwrap();
/// // IF97: 998.2 kg/m³; IAPWS 2008: 1.0016 mPa·s.
/// assert!((w.density_kg_m3() - 998.2).abs() < 0.05);
/// ```
pub fn properties(t: ThermodynamicTemperature, p: Pressure) -> Result<Properties, FluidError> {
    let t_k = t.get::<kelvin>();
    let t_c = t_k - 273.15;
    if !(t_c.is_finite() && (RANGE_C.0..=RANGE_C.1).contains(&t_c)) {
        return Err(FluidError::TemperatureRange { t_c, min_c: RANGE_C.0, max_c: RANGE_C.1 });
    }
    let p_pa = p.get::<pascal>();
    let p_sat = if97_saturation_pressure(t_k.max(273.16));
    if p_pa > MAX_PRESSURE_PA {
        return Err(FluidError::PressureRange { p_pa, max_pa: MAX_PRESSURE_PA });
    }
    if !(p_pa.is_finite() && p_pa >= p_sat) {
        return Err(FluidError::Boils { t_c, p_pa, p_sat_pa: p_sat });
    }
    let rho = 1.0 / if97_region1_specific_volume(t_k, p_pa);
    let mu = iapws2008_viscosity(t_k, rho);
    Ok(Properties {
        density: MassDensity::new::<kilogram_per_cubic_meter>(rho),
        viscosity: DynamicViscosity::new::<pascal_second>(mu),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(got: f64, want: f64, rel: f64) -> bool {
        ((got - want) / want).abs() <= rel
    }

    #[test]
    fn if97_table5_region1_specific_volume() {
        // IAPWS-IF97 (2007 revision), table 5, v in m³/kg.
        for (t, p_mpa, v) in
            [(300.0, 3.0, 0.100_215_168e-2), (300.0, 80.0, 0.971_180_894e-3), (500.0, 3.0, 0.120_241_800e-2)]
        {
            let got = if97_region1_specific_volume(t, p_mpa * 1e6);
            assert!(close(got, v, 5e-9), "T {t} p {p_mpa}: {got} vs {v}");
        }
    }

    #[test]
    fn if97_table5_region1_specific_heat() {
        // IAPWS-IF97 (2007 revision), table 5, c_p in kJ/(kg·K).
        for (t, p_mpa, cp) in
            [(300.0, 3.0, 0.417_301_218e1), (300.0, 80.0, 0.401_008_987e1), (500.0, 3.0, 0.465_580_682e1)]
        {
            let got = if97_region1_cp(t, p_mpa * 1e6) / 1e3;
            assert!(close(got, cp, 5e-9), "T {t} p {p_mpa}: {got} vs {cp}");
        }
    }

    #[test]
    fn if97_table35_saturation_pressure() {
        // IAPWS-IF97 (2007 revision), table 35, ps in MPa.
        for (t, ps) in [(300.0, 0.353_658_941e-2), (500.0, 0.263_889_776e1), (600.0, 0.123_443_146e2)] {
            let got = if97_saturation_pressure(t) / 1e6;
            assert!(close(got, ps, 5e-9), "T {t}: {got} vs {ps}");
        }
    }

    #[test]
    fn iapws2008_table4_viscosity() {
        // IAPWS 2008 viscosity release, table 4 (μ2 = 1 rows), μ in μPa·s.
        for (t, rho, mu) in [
            (298.15, 998.0, 889.735_100),
            (298.15, 1200.0, 1_437.649_467),
            (373.15, 1000.0, 307.883_622),
            (433.15, 1.0, 14.538_324),
            (433.15, 1000.0, 217.685_358),
            (873.15, 1.0, 32.619_287),
            (873.15, 100.0, 35.802_262),
            (873.15, 600.0, 77.430_195),
            (1173.15, 1.0, 44.217_245),
            (1173.15, 100.0, 47.640_433),
            (1173.15, 400.0, 64.154_608),
        ] {
            let got = iapws2008_viscosity(t, rho) * 1e6;
            // Half a unit in the table's sixth decimal.
            assert!((got - mu).abs() <= 5e-7, "T {t} ρ {rho}: {got} vs {mu}");
        }
    }

    #[test]
    fn boiling_water_is_an_error() {
        use uom::si::pressure::kilopascal;
        use uom::si::thermodynamic_temperature::degree_celsius;
        // At 120 °C water boils below about 198.5 kPa.
        let e = properties(ThermodynamicTemperature::new::<degree_celsius>(120.0), Pressure::new::<kilopascal>(150.0));
        assert!(matches!(e, Err(FluidError::Boils { .. })), "{e:?}");
    }
}
