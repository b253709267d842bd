//! What a line needs of its fluid (density and dynamic viscosity), and why
//! a fluid may not be able to give it. Depends on no other fluid module.

use uom::si::dynamic_viscosity::pascal_second;
use uom::si::f64::{DynamicViscosity, MassDensity};
use uom::si::mass_density::kilogram_per_cubic_meter;

/// Density and dynamic viscosity at the line's conditions.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Properties {
    /// ρ.
    pub density: MassDensity,
    /// μ.
    pub viscosity: DynamicViscosity,
}

impl Properties {
    /// ρ in kg/m³ (for display and reference checks).
    pub fn density_kg_m3(&self) -> f64 {
        self.density.get::<kilogram_per_cubic_meter>()
    }

    /// μ in Pa·s (for display and reference checks).
    pub fn viscosity_pa_s(&self) -> f64 {
        self.viscosity.get::<pascal_second>()
    }
}

/// Why a fluid's properties could not be given.
#[derive(Debug, Clone, PartialEq)]
pub enum FluidError {
    /// Temperature outside the range of the formulation.
    TemperatureRange {
        /// What was asked, °C.
        t_c: f64,
        /// Lowest accepted, °C.
        min_c: f64,
        /// Highest accepted, °C.
        max_c: f64,
    },
    /// The water would boil at this pressure.
    Boils {
        /// Temperature, °C.
        t_c: f64,
        /// Pressure asked, Pa absolute.
        p_pa: f64,
        /// Saturation pressure, Pa absolute.
        p_sat_pa: f64,
    },
    /// Pressure above the range Headroom evaluates water at (10 MPa, a
    /// limit of ours well inside IAPWS-IF97 region 1's 100 MPa).
    PressureRange {
        /// Pressure asked, Pa absolute.
        p_pa: f64,
        /// Highest accepted, Pa absolute.
        max_pa: f64,
    },
    /// A glycol mixture below its freezing point.
    Freezes {
        /// Temperature, °C.
        t_c: f64,
        /// Freezing point of the mixture, °C.
        freeze_c: f64,
    },
    /// Glycol mass fraction outside the tabulated range.
    Concentration {
        /// What was asked, as a fraction.
        fraction: f64,
        /// Lowest accepted.
        min: f64,
        /// Highest accepted.
        max: f64,
    },
    /// A custom property that is not a positive, finite number.
    Custom(&'static str),
    /// A heat load on a fluid with no specific heat (one typed in).
    NoSpecificHeat,
    /// A gas's pressure outside the range Headroom evaluates gases at.
    GasPressure {
        /// Pressure asked, Pa absolute.
        p_pa: f64,
        /// Lowest accepted, Pa absolute.
        min_pa: f64,
        /// Highest accepted, Pa absolute.
        max_pa: f64,
    },
    /// Steam's pressure outside the range Headroom evaluates steam at.
    SteamPressure {
        /// Pressure asked, Pa absolute.
        p_pa: f64,
        /// Lowest accepted, Pa absolute.
        min_pa: f64,
        /// Highest accepted, Pa absolute.
        max_pa: f64,
    },
    /// A gas so far from ideal that the virial form cannot be trusted.
    NotNearIdeal {
        /// Z the correlation gives.
        z: f64,
        /// The lowest Z accepted.
        floor: f64,
    },
    /// A natural gas's relative density outside the correlations' range.
    RelativeDensity {
        /// What was asked.
        value: f64,
        /// Lowest accepted.
        min: f64,
        /// Highest accepted.
        max: f64,
    },
    /// Steam below its saturation temperature: wet steam or water.
    WetSteam {
        /// Temperature asked, °C.
        t_c: f64,
        /// Saturation temperature at the pressure, °C.
        t_sat_c: f64,
        /// Pressure, Pa absolute.
        p_pa: f64,
    },
}

impl std::fmt::Display for FluidError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match *self {
            FluidError::TemperatureRange { t_c, min_c, max_c } => {
                write!(f, "temperature {t_c:.1} °C is outside {min_c}–{max_c} °C for this fluid")
            }
            FluidError::PressureRange { p_pa, max_pa } => write!(
                f,
                "{:.1} MPa is above the {:.0} MPa absolute that Headroom evaluates water at",
                p_pa / 1e6,
                max_pa / 1e6
            ),
            FluidError::Boils { t_c, p_pa, p_sat_pa } => write!(
                f,
                "water at {t_c:.1} °C boils below {:.1} kPa absolute; {:.1} kPa is too low",
                p_sat_pa / 1e3,
                p_pa / 1e3
            ),
            FluidError::Freezes { t_c, freeze_c } => {
                write!(f, "the mixture freezes at {freeze_c:.1} °C; {t_c:.1} °C is below that")
            }
            FluidError::Concentration { fraction, min, max } => write!(
                f,
                "glycol strength {:.0} % is outside {:.0}–{:.0} % by mass",
                fraction * 100.0,
                min * 100.0,
                max * 100.0
            ),
            FluidError::Custom(what) => write!(f, "{what} must be a positive number"),
            FluidError::GasPressure { p_pa, min_pa, max_pa } => write!(
                f,
                "{:.1} kPa absolute is outside the {:.0} kPa to {:.0} MPa absolute that Headroom evaluates gases at",
                p_pa / 1e3,
                min_pa / 1e3,
                max_pa / 1e6
            ),
            FluidError::SteamPressure { p_pa, min_pa, max_pa } => write!(
                f,
                "{:.1} kPa absolute is outside the {:.0} kPa to {:.0} MPa absolute that Headroom evaluates steam at",
                p_pa / 1e3,
                min_pa / 1e3,
                max_pa / 1e6
            ),
            FluidError::NotNearIdeal { z, floor } => write!(
                f,
                "the gas is too far from ideal here (Z = {z:.3}, below {floor}) for the virial correlation: it may \
                 be near condensing; use a custom gas with a compressibility factor from a reliable source"
            ),
            FluidError::RelativeDensity { value, min, max } => {
                write!(f, "relative density {value} is outside {min}–{max} for a methane-rich natural gas")
            }
            FluidError::WetSteam { t_c, t_sat_c, p_pa } => write!(
                f,
                "{t_c:.1} °C is below the saturation temperature {t_sat_c:.1} °C at {:.1} kPa absolute: that is wet \
                 steam or water, which Headroom does not size; leave the temperature blank for dry saturated steam",
                p_pa / 1e3
            ),
            FluidError::NoSpecificHeat => write!(
                f,
                "a heat load gives a flow only for a liquid whose specific heat Headroom knows (water, glycol): \
                 for this fluid enter a flow"
            ),
        }
    }
}

impl std::error::Error for FluidError {}
