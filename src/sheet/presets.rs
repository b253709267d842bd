//! Starting points for common services. Every number here is common
//! practice — typical of design guides and office standards, from memory,
//! not from a single source — and the page says so. A line starts from one
//! and overrides what the project's own standard says.

use super::file::{FluidFile, LimitsFile, LineFile, MethodName, PipeFile};

/// A service a line can start from.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Service {
    /// Stable id.
    pub id: &'static str,
    /// Name for the picker.
    pub label: &'static str,
    /// What it carries.
    pub medium: Medium,
    /// Fluid temperature, °C (steam: only if superheated).
    pub temperature_c: &'static str,
    /// Pressure with its unit (water: absolute kPa; gas and steam: gauge).
    pub pressure: &'static str,
    /// Pipe series id.
    pub series: &'static str,
    /// Friction rate limit, Pa/m.
    pub max_drop_pa_m: Option<&'static str>,
    /// Total drop limit, with its unit.
    pub max_total_drop: Option<&'static str>,
    /// Drop limit as a percentage of the inlet pressure (gas, steam).
    pub max_drop_percent: Option<&'static str>,
    /// Velocity limit, m/s.
    pub max_velocity_m_s: &'static str,
    /// A velocity-by-size table (`hydraulics::velocity::RULES`), if any.
    pub velocity_by_size: Option<&'static str>,
}

/// What a service carries.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Medium {
    /// Liquid water.
    Water,
    /// A gas, by id (`hydraulics::fluid::gas`).
    Gas(&'static str),
    /// Steam: dry saturated when the temperature is blank.
    Steam,
}

/// The services offered, in picker order.
pub const SERVICES: &[Service] = &[
    Service {
        id: "chilled",
        label: "Chilled water",
        medium: Medium::Water,
        temperature_c: "7",
        pressure: "300 kPa",
        series: "steel-sch40",
        max_drop_pa_m: Some("400"),
        max_total_drop: None,
        max_drop_percent: None,
        max_velocity_m_s: "2.4",
        velocity_by_size: Some("hydronic"),
    },
    Service {
        id: "heating",
        label: "Heating water",
        medium: Medium::Water,
        temperature_c: "80",
        pressure: "300 kPa",
        series: "steel-sch40",
        max_drop_pa_m: Some("300"),
        max_total_drop: None,
        max_drop_percent: None,
        max_velocity_m_s: "2.0",
        velocity_by_size: Some("hydronic"),
    },
    Service {
        id: "domestic-cold",
        label: "Domestic cold water",
        medium: Medium::Water,
        temperature_c: "12",
        pressure: "400 kPa",
        series: "copper-l",
        max_drop_pa_m: Some("600"),
        max_total_drop: None,
        max_drop_percent: None,
        max_velocity_m_s: "2.0",
        velocity_by_size: Some("copper-cold"),
    },
    Service {
        id: "domestic-hot",
        label: "Domestic hot water",
        medium: Medium::Water,
        temperature_c: "60",
        pressure: "400 kPa",
        series: "copper-l",
        max_drop_pa_m: Some("600"),
        max_total_drop: None,
        max_drop_percent: None,
        max_velocity_m_s: "1.5",
        velocity_by_size: Some("copper-hot"),
    },
    Service {
        id: "process",
        label: "Process water",
        medium: Medium::Water,
        temperature_c: "20",
        pressure: "500 kPa",
        series: "stainless-10s",
        max_drop_pa_m: Some("500"),
        max_total_drop: None,
        max_drop_percent: None,
        max_velocity_m_s: "3.0",
        velocity_by_size: None,
    },
    // Gas and steam (common practice, from memory): compressed-air mains
    // at about 6 m/s with a few per cent of the pressure lost; low-pressure
    // fuel gas to the 0.5 in w.c. drop that the IFGC / NFPA 54 low-pressure
    // sizing tables are drawn for; saturated steam mains about 25–35 m/s,
    // superheated about 40–60 m/s, each losing at most a tenth of the
    // inlet pressure (where the incompressible check would still do).
    Service {
        id: "compressed-air",
        label: "Compressed air",
        medium: Medium::Gas("air"),
        temperature_c: "25",
        pressure: "7 barg",
        series: "steel-sch40",
        max_drop_pa_m: None,
        max_total_drop: None,
        max_drop_percent: Some("1.5"),
        max_velocity_m_s: "6",
        velocity_by_size: None,
    },
    Service {
        id: "fuel-gas-low",
        label: "Natural gas, low pressure",
        medium: Medium::Gas("natural-gas"),
        temperature_c: "15",
        pressure: "0.02 barg",
        series: "steel-sch40",
        max_drop_pa_m: None,
        max_total_drop: Some("0.5 in H₂O"),
        max_drop_percent: None,
        max_velocity_m_s: "20",
        velocity_by_size: None,
    },
    Service {
        id: "steam-saturated",
        label: "Steam, saturated",
        medium: Medium::Steam,
        temperature_c: "",
        pressure: "8 barg",
        series: "steel-sch40",
        max_drop_pa_m: None,
        max_total_drop: None,
        max_drop_percent: Some("10"),
        max_velocity_m_s: "30",
        velocity_by_size: None,
    },
    Service {
        id: "steam-superheated",
        label: "Steam, superheated",
        medium: Medium::Steam,
        temperature_c: "250",
        pressure: "16 barg",
        series: "steel-sch80",
        max_drop_pa_m: None,
        max_total_drop: None,
        max_drop_percent: Some("10"),
        max_velocity_m_s: "50",
        velocity_by_size: None,
    },
];

impl Service {
    /// Finds a service by id.
    pub fn by_id(id: &str) -> Option<&'static Service> {
        SERVICES.iter().find(|s| s.id == id)
    }

    /// A new line for this service, with values in SI units (°C, kPa,
    /// Pa/m, m/s) written with their units so they read right whatever
    /// units the sheet uses.
    pub fn new_line(&self, name: &str) -> LineFile {
        LineFile {
            name: name.to_owned(),
            flow: String::new(),
            load: None,
            fed_from: None,
            diversity: None,
            fixtures: None,
            fluid: self.fluid(),
            pipe: PipeFile::Series(self.series.to_owned()),
            roughness: None,
            aged: false,
            length: String::new(),
            fittings: Vec::new(),
            components: Vec::new(),
            extra_k: None,
            equivalent_length: None,
            rise: None,
            method: MethodName::DarcyWeisbach,
            hazen_williams_c: None,
            limits: LimitsFile {
                max_drop_per_length: self.max_drop_pa_m.map(|v| format!("{v} Pa/m")),
                max_total_drop: self.max_total_drop.map(str::to_owned),
                max_drop_percent: self.max_drop_percent.map(str::to_owned),
                max_velocity: Some(format!("{} m/s", self.max_velocity_m_s)),
                min_velocity: None,
                velocity_by_size: self.velocity_by_size.map(str::to_owned),
            },
            check_size: None,
            smallest_size: None,
        }
    }

    fn fluid(&self) -> FluidFile {
        let t = format!("{} °C", self.temperature_c);
        match self.medium {
            Medium::Water => FluidFile::Water { temperature: t, pressure: Some(self.pressure.to_owned()) },
            Medium::Gas(id) => FluidFile::Gas {
                gas: id.to_owned(),
                temperature: t,
                pressure: self.pressure.to_owned(),
                relative_density: (id == "natural-gas").then(|| "0.6".to_owned()),
                molar_mass: None,
                viscosity_mpa_s: None,
                z: None,
            },
            Medium::Steam => FluidFile::Steam {
                pressure: self.pressure.to_owned(),
                temperature: (!self.temperature_c.is_empty()).then_some(t),
            },
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::hydraulics::pipes;

    #[test]
    fn every_service_names_a_real_series_and_parses() {
        let units = super::super::file::Units::defaults(super::super::file::System::Us);
        for s in SERVICES {
            assert!(pipes::series(s.series).is_some(), "{}", s.id);
            let mut line = s.new_line("x");
            line.flow = "1 L/s".into();
            line.length = "10 m".into();
            // Values carry their units, so a US sheet reads them right.
            let l = line.to_line(&units).unwrap_or_else(|e| panic!("{}: {e:?}", s.id));
            assert!(l.limits.max_velocity.is_some());
            assert_eq!(l.limits.velocity_by_size.map(|r| r.id), s.velocity_by_size);
        }
    }
}
