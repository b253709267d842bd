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
    /// Fluid temperature, °C.
    pub temperature_c: &'static str,
    /// Absolute system pressure, kPa (water only).
    pub pressure_kpa: &'static str,
    /// Pipe series id.
    pub series: &'static str,
    /// Friction rate limit, Pa/m.
    pub max_drop_pa_m: &'static str,
    /// Velocity limit, m/s.
    pub max_velocity_m_s: &'static str,
    /// A velocity-by-size table (`hydraulics::velocity::RULES`), if any.
    pub velocity_by_size: Option<&'static str>,
}

/// The services offered, in picker order.
pub const SERVICES: &[Service] = &[
    Service {
        id: "chilled",
        label: "Chilled water",
        temperature_c: "7",
        pressure_kpa: "300",
        series: "steel-sch40",
        max_drop_pa_m: "400",
        max_velocity_m_s: "2.4",
        velocity_by_size: Some("hydronic"),
    },
    Service {
        id: "heating",
        label: "Heating water",
        temperature_c: "80",
        pressure_kpa: "300",
        series: "steel-sch40",
        max_drop_pa_m: "300",
        max_velocity_m_s: "2.0",
        velocity_by_size: Some("hydronic"),
    },
    Service {
        id: "domestic-cold",
        label: "Domestic cold water",
        temperature_c: "12",
        pressure_kpa: "400",
        series: "copper-l",
        max_drop_pa_m: "600",
        max_velocity_m_s: "2.0",
        velocity_by_size: Some("copper-cold"),
    },
    Service {
        id: "domestic-hot",
        label: "Domestic hot water",
        temperature_c: "60",
        pressure_kpa: "400",
        series: "copper-l",
        max_drop_pa_m: "600",
        max_velocity_m_s: "1.5",
        velocity_by_size: Some("copper-hot"),
    },
    Service {
        id: "process",
        label: "Process water",
        temperature_c: "20",
        pressure_kpa: "500",
        series: "stainless-10s",
        max_drop_pa_m: "500",
        max_velocity_m_s: "3.0",
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
            fluid: FluidFile::Water {
                temperature: format!("{} °C", self.temperature_c),
                pressure: Some(format!("{} kPa", self.pressure_kpa)),
            },
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
                max_drop_per_length: Some(format!("{} Pa/m", self.max_drop_pa_m)),
                max_total_drop: None,
                max_velocity: Some(format!("{} m/s", self.max_velocity_m_s)),
                min_velocity: None,
                velocity_by_size: self.velocity_by_size.map(str::to_owned),
            },
            check_size: None,
            smallest_size: None,
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
