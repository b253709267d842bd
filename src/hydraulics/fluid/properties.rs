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

use crate::hydraulics::digits::{Fixed, Short};

impl std::fmt::Display for FluidError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match *self {
            FluidError::TemperatureRange { t_c, min_c, max_c } => {
                write!(
                    f,
                    "temperature {} °C is outside {}–{} °C for this fluid",
                    Fixed(t_c, 1),
                    Short(min_c),
                    Short(max_c)
                )
            }
            FluidError::PressureRange { p_pa, max_pa } => write!(
                f,
                "{} MPa is above the {} MPa absolute that Headroom evaluates water at",
                Fixed(p_pa / 1e6, 1),
                Fixed(max_pa / 1e6, 0)
            ),
            FluidError::Boils { t_c, p_pa, p_sat_pa } => write!(
                f,
                "water at {} °C boils below {} kPa absolute; {} kPa is too low",
                Fixed(t_c, 1),
                Fixed(p_sat_pa / 1e3, 1),
                Fixed(p_pa / 1e3, 1)
            ),
            FluidError::Freezes { t_c, freeze_c } => {
                write!(f, "the mixture freezes at {} °C; {} °C is below that", Fixed(freeze_c, 1), Fixed(t_c, 1))
            }
            FluidError::Concentration { fraction, min, max } => write!(
                f,
                "glycol strength {} % is outside {}–{} % by mass",
                Fixed(fraction * 100.0, 0),
                Fixed(min * 100.0, 0),
                Fixed(max * 100.0, 0)
            ),
            FluidError::Custom(what) => write!(f, "{what} must be a positive number"),
            FluidError::GasPressure { p_pa, min_pa, max_pa } => write!(
                f,
                "{} kPa absolute is outside the {} kPa to {} MPa absolute that Headroom evaluates gases at",
                Fixed(p_pa / 1e3, 1),
                Fixed(min_pa / 1e3, 0),
                Fixed(max_pa / 1e6, 0)
            ),
            FluidError::SteamPressure { p_pa, min_pa, max_pa } => write!(
                f,
                "{} kPa absolute is outside the {} kPa to {} MPa absolute that Headroom evaluates steam at",
                Fixed(p_pa / 1e3, 1),
                Fixed(min_pa / 1e3, 0),
                Fixed(max_pa / 1e6, 0)
            ),
            FluidError::NotNearIdeal { z, floor } => write!(
                f,
                "the gas is too far from ideal here (Z = {}, below {}) for the virial correlation: it may \
                 be near condensing; use a custom gas with a compressibility factor from a reliable source",
                Fixed(z, 3),
                Short(floor)
            ),
            FluidError::RelativeDensity { value, min, max } => {
                write!(
                    f,
                    "relative density {} is outside {}–{} for a methane-rich natural gas",
                    Short(value),
                    Short(min),
                    Short(max)
                )
            }
            FluidError::WetSteam { t_c, t_sat_c, p_pa } => write!(
                f,
                "{} °C is below the saturation temperature {} °C at {} kPa absolute: that is wet \
                 steam or water, which Headroom does not size; leave the temperature blank for dry saturated steam",
                Fixed(t_c, 1),
                Fixed(t_sat_c, 1),
                Fixed(p_pa / 1e3, 1)
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
