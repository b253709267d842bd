//! Reading a stored line: its typed text becomes the core's [`Line`], every
//! bad field reported at once (not just the first), each against its
//! [`Field`].
//!
//! - One small function per part of a line (fluid, pipe, fittings, method,
//!   limits), each pushing its own field errors; `LineFile::to_line` only
//!   puts the parts together.
//! - The fluid is read first: mass flows, heads and head-per-length limits
//!   need its density.

use crate::hydraulics::digits::Short;
use uom::si::dynamic_viscosity::pascal_second;
use uom::si::f64::{DynamicViscosity, Length, MassDensity, Pressure, ThermodynamicTemperature, Velocity, VolumeRate};
use uom::si::length::meter;
use uom::si::mass_density::kilogram_per_cubic_meter;
use uom::si::pressure::pascal;
use uom::si::thermodynamic_temperature::kelvin;
use uom::si::velocity::meter_per_second;
use uom::si::volume_rate::cubic_meter_per_second;

use super::file::{
    ComponentKind, FieldError, FixturesFile, FluidFile, LineFile, LoadFile, MethodName, PipeFile, Units,
};
use super::number::{parse_count, parse_decimal};
use super::units::{self, Dimension, Unit};
use crate::hydraulics::demand;
use crate::hydraulics::field::Field;
use crate::hydraulics::fluid::{gas, steam, Fluid, FluidError, Gas, Properties};
use crate::hydraulics::line::{pa_per_m, Limits, Line, Method, Pipe, Valid};
use crate::hydraulics::losses::{Component, Fitting, Fittings, CV_PER_KV};
use crate::hydraulics::pipes::{self, Material};
use crate::hydraulics::velocity;

/// Atmospheric pressure where none is given: the standard atmosphere,
/// 101 325 Pa (ISO 2533).
const ATMOSPHERE_PA: f64 = 101_325.0;

/// The errors found so far and the sheet's units.
struct Reader<'a> {
    errors: Vec<FieldError>,
    units: &'a Units,
}

/// A fluid read from its text, with the temperature and absolute pressure
/// its properties are taken at (K, Pa).
struct FluidAt {
    fluid: Option<Fluid>,
    t_k: Option<f64>,
    p_pa: Option<f64>,
}

impl Reader<'_> {
    fn fail(&mut self, field: Field, message: impl Into<String>) {
        self.errors.push(FieldError { field, message: message.into() });
    }

    /// A value with its unit (or in `unit` when bare), in SI.
    fn measure(
        &mut self,
        field: Field,
        text: &str,
        dim: Dimension,
        unit: &'static Unit,
        rho: Option<f64>,
    ) -> Option<f64> {
        let parsed = units::parse(dim, text, unit);
        if let Ok(m) = &parsed {
            if let (Some(kind), false) = (m.unit.reference(), field == Field::FluidPressure) {
                self.fail(
                    field,
                    format!(
                        "{} is a {kind} pressure; a drop or a limit is a difference of pressures: write it in {}",
                        m.unit.symbol,
                        m.unit.symbol.trim_end_matches(['g', 'a'])
                    ),
                );
                return None;
            }
        }
        match parsed.and_then(|m| m.to_si(rho)) {
            Ok(v) => Some(v),
            Err(e) => {
                self.fail(field, e.to_string());
                None
            }
        }
    }

    /// As [`Reader::measure`], `None` without an error when left empty.
    fn optional(
        &mut self,
        field: Field,
        text: &Option<String>,
        dim: Dimension,
        unit: &'static Unit,
        rho: Option<f64>,
    ) -> Option<f64> {
        match text.as_deref().map(str::trim) {
            None | Some("") => None,
            Some(t) => self.measure(field, t, dim, unit, rho),
        }
    }

    /// A number without a unit.
    fn number(&mut self, field: Field, text: &str) -> Option<f64> {
        match parse_decimal(text) {
            Ok(v) => Some(v),
            Err(e) => {
                self.fail(field, e.to_string());
                None
            }
        }
    }

    fn fluid(&mut self, f: &FluidFile) -> FluidAt {
        let temperature = self.units.temperature;
        match f {
            FluidFile::Water { temperature: t, pressure } => {
                let t_k = self.measure(Field::FluidTemperature, t, Dimension::Temperature, temperature, None);
                // A head typed for the pressure is taken in water at about
                // 1000 kg/m³: the density is not known before the pressure.
                let p = self.optional(
                    Field::FluidPressure,
                    pressure,
                    Dimension::Pressure,
                    self.units.pressure,
                    Some(1000.0),
                );
                FluidAt { fluid: Some(Fluid::Water), t_k, p_pa: Some(p.unwrap_or(ATMOSPHERE_PA)) }
            }
            FluidFile::Glycol { glycol, percent, temperature: t } => {
                let g = *glycol;
                let pct = self.number(Field::FluidPercent, percent.trim().trim_end_matches('%'));
                let t_k = self.measure(Field::FluidTemperature, t, Dimension::Temperature, temperature, None);
                FluidAt { fluid: pct.map(|p| Fluid::GlycolMix(g, p / 100.0)), t_k, p_pa: Some(ATMOSPHERE_PA) }
            }
            FluidFile::Custom { density_kg_m3, viscosity_mpa_s, kinematic_viscosity_mm2_s } => {
                let rho = self.number(Field::FluidDensity, density_kg_m3);
                let mu = match (viscosity_mpa_s, kinematic_viscosity_mm2_s, rho) {
                    (Some(mu), None, _) => self.number(Field::FluidViscosity, mu).map(|v| v * 1e-3),
                    (None, Some(nu), Some(r)) => self.number(Field::FluidKinematicViscosity, nu).map(|v| v * 1e-6 * r),
                    (None, Some(_), None) => None,
                    _ => {
                        self.fail(
                            Field::FluidViscosity,
                            "give the dynamic viscosity (mPa·s) or the kinematic (mm²/s), not both",
                        );
                        None
                    }
                };
                let fluid = rho.zip(mu).map(|(r, m)| {
                    Fluid::Custom(Properties {
                        density: MassDensity::new::<kilogram_per_cubic_meter>(r),
                        viscosity: DynamicViscosity::new::<pascal_second>(m),
                    })
                });
                // Entered properties do not depend on the state; 20 °C and
                // one atmosphere stand in for it.
                FluidAt { fluid, t_k: Some(293.15), p_pa: Some(ATMOSPHERE_PA) }
            }
            FluidFile::Gas { gas, temperature: t, pressure, relative_density, molar_mass, viscosity_mpa_s, z } => {
                let t_k = self.measure(Field::FluidTemperature, t, Dimension::Temperature, temperature, None);
                let p_pa = self.gas_pressure(pressure);
                let fluid = match gas.as_str() {
                    "natural-gas" => match relative_density.as_deref().map(str::trim).filter(|t| !t.is_empty()) {
                        Some(t) => self.number(Field::FluidRelativeDensity, t),
                        None => {
                            self.fail(Field::FluidRelativeDensity, "give the gas's relative density to air (e.g. 0.6)");
                            None
                        }
                    }
                    .map(|relative_density| Gas::Natural { relative_density }),
                    "custom" => {
                        let mut need = |field: Field, text: &Option<String>, what: &str| match text
                            .as_deref()
                            .map(str::trim)
                            .filter(|t| !t.is_empty())
                        {
                            Some(t) => self.number(field, t),
                            None => {
                                self.fail(field, format!("give the gas's {what}"));
                                None
                            }
                        };
                        let m = need(Field::FluidMolarMass, molar_mass, "molar mass (g/mol)");
                        let mu = need(Field::FluidViscosity, viscosity_mpa_s, "viscosity (mPa·s)");
                        let z = match z.as_deref().map(str::trim).filter(|t| !t.is_empty()) {
                            None => Some(1.0),
                            Some(t) => self.number(Field::FluidZ, t),
                        };
                        m.zip(mu).zip(z).map(|((molar_mass, mu), z)| Gas::Custom {
                            molar_mass,
                            viscosity: mu * 1e-3,
                            z,
                        })
                    }
                    id => match gas::named(id) {
                        Some(n) => Some(Gas::Named(n)),
                        None => {
                            let ids: Vec<&str> = gas::NAMED.iter().map(|n| n.id).collect();
                            self.fail(
                                Field::Fluid,
                                format!(
                                    "'{id}' is not a gas Headroom knows: {}, natural-gas or custom",
                                    ids.join(", ")
                                ),
                            );
                            None
                        }
                    },
                };
                FluidAt { fluid: fluid.map(Fluid::Gas), t_k, p_pa }
            }
            FluidFile::Steam { pressure, temperature: t } => {
                let p_pa = self.gas_pressure(pressure);
                let typed = t.as_deref().map(str::trim).filter(|t| !t.is_empty());
                let t_k = match typed {
                    None => p_pa.map(steam::saturation_temperature),
                    Some(t) => self.measure(Field::FluidTemperature, t, Dimension::Temperature, temperature, None),
                };
                FluidAt { fluid: Some(Fluid::Steam { saturated: typed.is_none() }), t_k, p_pa }
            }
        }
    }

    /// A gas or steam line's inlet pressure: required, absolute unless
    /// typed in a gauge unit; a head is refused (no density before it).
    fn gas_pressure(&mut self, text: &str) -> Option<f64> {
        if text.trim().is_empty() {
            self.fail(Field::FluidPressure, "give the pressure at the line's inlet (e.g. 7 barg or 8 bar absolute)");
            return None;
        }
        self.measure(Field::FluidPressure, text, Dimension::Pressure, self.units.pressure, None)
    }

    fn properties(&mut self, at: &FluidAt) -> Option<Properties> {
        let (f, t, p) = (at.fluid?, at.t_k?, at.p_pa?);
        match f.properties(ThermodynamicTemperature::new::<kelvin>(t), Pressure::new::<pascal>(p)) {
            Ok(props) => Some(props),
            Err(err) => {
                // Placed beside the input that can put it right.
                let field = match err {
                    FluidError::WetSteam { .. } => Field::FluidTemperature,
                    FluidError::GasPressure { .. } | FluidError::SteamPressure { .. } => Field::FluidPressure,
                    FluidError::RelativeDensity { .. } => Field::FluidRelativeDensity,
                    _ => Field::Fluid,
                };
                self.fail(field, err.to_string());
                None
            }
        }
    }

    fn flow(&mut self, text: &str, rho: Option<f64>, fluid: Option<&Fluid>) -> Option<f64> {
        let unit = self.units.flow;
        let parsed = units::parse(Dimension::Flow, text, unit);
        let needs_rho = parsed.as_ref().map(|m| m.needs_density()).unwrap_or(false);
        if rho.is_none() && needs_rho {
            return None; // the fluid's error is already reported
        }
        match parsed.and_then(|m| m.flow_si(rho, fluid)) {
            Ok(v) => Some(v),
            Err(e) => {
                self.fail(Field::Flow, e.to_string());
                None
            }
        }
    }

    /// The flow a heat load needs: Q = Φ / (ρ c_p ΔT), with ρ and c_p of
    /// the line's fluid at its temperature and pressure.
    fn load_flow(&mut self, load: &LoadFile, at: &FluidAt, rho: Option<f64>, carried_w: Option<f64>) -> Option<f64> {
        let u = self.units;
        // A line whose branches bring a load may leave its own blank.
        let own_blank = load.power.trim().is_empty() && carried_w.is_some_and(|w| w > 0.0);
        let own = if own_blank {
            Some(0.0)
        } else {
            self.measure(Field::LoadPower, &load.power, Dimension::Power, u.power, None)
        };
        let dt = self.measure(
            Field::LoadDeltaT,
            &load.delta_t,
            Dimension::TemperatureDifference,
            u.temperature_difference,
            None,
        );
        if !own_blank {
            if let Some(p) = own.filter(|p| !(p.is_finite() && *p > 0.0)) {
                self.fail(Field::LoadPower, format!("the heat load must be greater than zero, not {} W", Short(p)));
                return None;
            }
        }
        let power = match (own, carried_w) {
            (Some(_), Some(w)) => Some(w),
            (own, _) => own,
        };
        if dt.is_some_and(|d| !(d.is_finite() && d > 0.0)) {
            self.fail(Field::LoadDeltaT, "the temperature difference must be greater than zero");
            return None;
        }
        let (power, dt, rho) = (power?, dt?, rho?);
        let (f, t, p) = (at.fluid?, at.t_k?, at.p_pa?);
        match f.specific_heat(ThermodynamicTemperature::new::<kelvin>(t), Pressure::new::<pascal>(p)) {
            Ok(cp) => Some(power / (rho * cp * dt)),
            Err(e) => {
                self.fail(Field::LoadPower, e.to_string());
                None
            }
        }
    }

    /// The probable flow of the fixtures a line serves (with its branches'
    /// when it has any), plus its continuous flow.
    fn fixture_flow(&mut self, fx: &FixturesFile, carried: Option<&super::system::Carried>) -> Option<f64> {
        let method = self.units.basis.demand;
        let kinds = method.kinds();
        let mut counts = vec![0.0; kinds.len()];
        for item in &fx.items {
            let Some(k) = kinds.iter().position(|k| k.id == item.kind) else {
                let other = demand::Method::ALL.into_iter().find(|m| demand::kind(*m, &item.kind).is_some());
                self.fail(
                    Field::Fixtures,
                    match other {
                        Some(m) => format!(
                            "'{}' is counted in {} but the sheet's demand method counts {}: change the method or the \
                             fixture",
                            item.kind,
                            m.unit(),
                            method.unit()
                        ),
                        None => format!("'{}' is not a fixture kind Headroom knows", item.kind),
                    },
                );
                continue;
            };
            match parse_decimal(item.count.trim()) {
                Ok(c) if c.is_finite() && c >= 0.0 && c.fract() == 0.0 && c <= 100_000.0 => counts[k] += c,
                Ok(c) => self
                    .fail(Field::FixtureCount, format!("a fixture count is a whole number from 0, not {}", Short(c))),
                Err(e) => self.fail(Field::FixtureCount, e.to_string()),
            }
        }
        let own_q = match super::system::continuous_flow(fx, self.units) {
            Some(q) => q,
            None => {
                let t = fx.continuous.trim();
                match self.measure(Field::ContinuousFlow, t, Dimension::Flow, self.units.flow, None) {
                    Some(q) if q < 0.0 => self.fail(Field::ContinuousFlow, "a continuous flow cannot be negative"),
                    Some(_) => {
                        self.fail(Field::ContinuousFlow, "give the continuous flow as a volume flow (L/s, gpm, m³/h)")
                    }
                    None => {}
                }
                return None;
            }
        };
        let (units, largest, continuous) = match carried.filter(|c| c.has_branches()) {
            Some(c) => (c.fixture_units, c.largest_unit, c.continuous_m3_s),
            None => {
                let (u, big) = super::system::units_of(&counts, method, fx.supply);
                (u, big, own_q)
            }
        };
        if units <= 0.0 && continuous <= 0.0 {
            if self.errors.is_empty() {
                self.fail(
                    Field::Fixtures,
                    "list the fixtures this line serves (or a continuous flow): it has none on this supply",
                );
            }
            return None;
        }
        match demand::probable_flow(method, units, largest) {
            Ok(q) => Some(q + continuous),
            Err(e) => {
                self.fail(Field::Fixtures, e.to_string());
                None
            }
        }
    }

    fn pipe(&mut self, p: &PipeFile) -> (Option<Pipe>, Option<Material>) {
        match p {
            PipeFile::Series(id) => match pipes::series(id) {
                Some(s) => (Some(Pipe::Series(s)), Some(s.material)),
                None => {
                    self.fail(Field::PipeSeries, format!("'{id}' is not a pipe series Headroom knows"));
                    (None, None)
                }
            },
            PipeFile::Bore { diameter, material } => {
                let mm = units::find(Dimension::Length, "mm").expect("mm is a length unit");
                let d = self.measure(Field::PipeDiameter, diameter, Dimension::Length, mm, None);
                let m = Material::from_id(material);
                if m.is_none() {
                    let ids = Material::ALL.map(Material::id).join(", ");
                    self.fail(Field::PipeMaterial, format!("'{material}' is not one of {ids}"));
                }
                (d.map(|d| Pipe::Custom(Length::new::<meter>(d))), m)
            }
        }
    }

    fn roughness(&mut self, lf: &LineFile, material: Option<Material>) -> Option<f64> {
        match (&lf.roughness, material) {
            (Some(t), _) if !t.trim().is_empty() => {
                self.measure(Field::Roughness, t, Dimension::Roughness, self.units.roughness, None)
            }
            (_, Some(m)) => {
                let r = m.roughness();
                Some(if lf.aged { r.aged_mm.unwrap_or(r.new_mm) } else { r.new_mm } * 1e-3)
            }
            _ => None,
        }
    }

    /// The straight length: optional for a quick check (then 0 — the
    /// total drop is not shown), required by a total-drop limit or a drop
    /// as a share of the inlet pressure, which need the whole line.
    fn length(&mut self, text: &str, limits: &super::file::LimitsFile) -> Option<f64> {
        if text.trim().is_empty() {
            let blank = |t: &Option<String>| t.as_deref().is_none_or(|t| t.trim().is_empty());
            if !blank(&limits.max_total_drop) || !blank(&limits.max_drop_percent) {
                self.fail(
                    Field::Length,
                    "a total-drop limit needs the whole line: enter the length of straight pipe (or clear that limit \
                     for a quick check by velocity or drop per length)",
                );
                return None;
            }
            return Some(0.0);
        }
        self.measure(Field::Length, text, Dimension::Length, self.units.length, None)
    }

    fn fittings(&mut self, lf: &LineFile) -> Vec<(Fitting, u32)> {
        let mut counts = Vec::new();
        for (row, fc) in lf.fittings.iter().enumerate() {
            let n = match parse_count(&fc.count) {
                Ok(n) => Some(n),
                Err(err) => {
                    self.fail(Field::FittingCount, format!("row {}: {err}", row + 1));
                    None
                }
            };
            match (Fitting::from_id(&fc.fitting), n) {
                (Some(f), Some(n)) => counts.push((f, n)),
                (Some(_), None) => {}
                (None, _) => self.fail(Field::Fittings, format!("'{}' is not a fitting Headroom knows", fc.fitting)),
            }
        }
        counts
    }

    fn method(&mut self, lf: &LineFile, material: Option<Material>) -> Option<Method> {
        match lf.method {
            MethodName::DarcyWeisbach => Some(Method::DarcyWeisbach),
            MethodName::HazenWilliams => match (lf.hazen_williams_c.as_deref().map(str::trim), material) {
                (Some(t), _) if !t.is_empty() => {
                    self.number(Field::HazenWilliamsC, t).map(|c| Method::HazenWilliams { c })
                }
                (_, Some(m)) => Some(Method::HazenWilliams { c: m.hazen_williams_c().0 }),
                _ => None,
            },
        }
    }

    /// One text of a component: `None` (with an error naming the component)
    /// when it is empty or wrong.
    #[allow(clippy::too_many_arguments)]
    fn component_value(
        &mut self,
        who: &str,
        what: &str,
        text: &str,
        dim: Dimension,
        unit: &'static Unit,
        rho: Option<f64>,
    ) -> Option<f64> {
        if text.trim().is_empty() {
            self.fail(Field::Components, format!("{who}: enter the {what}"));
            return None;
        }
        let got = units::parse(dim, text, unit).and_then(|m| {
            if m.unit.reference().is_some() {
                return Err(units::UnitError::UnknownUnit { dimension: dim, unit: m.unit.symbol.to_owned() });
            }
            m.to_si(rho)
        });
        match got {
            Ok(v) if v.is_finite() && v > 0.0 => Some(v),
            Ok(_) => {
                self.fail(Field::Components, format!("{who}: the {what} must be greater than zero"));
                None
            }
            Err(e) => {
                self.fail(Field::Components, format!("{who}: {what}: {e}"));
                None
            }
        }
    }

    /// The line's valves and equipment; `None` when any is wrong (each
    /// reported, naming the component).
    fn components(&mut self, lf: &LineFile, rho: Option<f64>) -> Option<Vec<Component>> {
        let mut out = Vec::with_capacity(lf.components.len());
        let mut ok = true;
        let u = self.units;
        let mm = units::find(Dimension::Length, "mm").expect("mm is a length unit");
        for (i, c) in lf.components.iter().enumerate() {
            let who = if c.name.trim().is_empty() {
                format!("component {}", i + 1)
            } else {
                format!("component {} ({})", i + 1, c.name.trim())
            };
            let number = |r: &mut Self, what: &str, text: &str| match parse_decimal(text) {
                Ok(v) if v.is_finite() && v > 0.0 => Some(v),
                Ok(_) => {
                    r.fail(Field::Components, format!("{who}: the {what} must be greater than zero"));
                    None
                }
                Err(e) => {
                    r.fail(Field::Components, format!("{who}: {what}: {e}"));
                    None
                }
            };
            let got = match c.kind {
                ComponentKind::Kv => number(self, "Kv", &c.value).map(Component::Kv),
                ComponentKind::Cv => number(self, "Cv", &c.value).map(|cv| Component::Kv(cv / CV_PER_KV)),
                ComponentKind::Rated => {
                    let drop = self.component_value(&who, "rated drop", &c.drop, Dimension::Pressure, u.pressure, rho);
                    let flow = self.component_value(&who, "rated flow", &c.at_flow, Dimension::Flow, u.flow, rho);
                    drop.zip(flow).map(|(drop_pa, flow_m3_s)| Component::Rated { drop_pa, flow_m3_s })
                }
                ComponentKind::Butterfly => Some(Component::Butterfly),
                ComponentKind::Reducer => {
                    let to = self.component_value(&who, "other bore", &c.to_bore, Dimension::Length, mm, None);
                    let angle = if c.angle.trim().is_empty() { Some(180.0) } else { number(self, "angle", &c.angle) };
                    to.zip(angle).map(|(to_bore_m, angle_deg)| Component::Reducer { to_bore_m, angle_deg })
                }
            };
            match got {
                Some(c) => out.push(c),
                None => ok = false,
            }
        }
        ok.then_some(out)
    }

    fn limits(&mut self, lf: &LineFile, rho: Option<f64>) -> Limits {
        let (lim, u) = (&lf.limits, self.units);
        let limits = Limits {
            max_drop_per_length: self
                .optional(
                    Field::MaxDropPerLength,
                    &lim.max_drop_per_length,
                    Dimension::DropPerLength,
                    u.drop_per_length,
                    rho,
                )
                .map(pa_per_m),
            max_total_drop: self
                .optional(Field::MaxTotalDrop, &lim.max_total_drop, Dimension::Pressure, u.pressure, rho)
                .map(Pressure::new::<pascal>),
            max_velocity: self
                .optional(Field::MaxVelocity, &lim.max_velocity, Dimension::Velocity, u.velocity, None)
                .map(Velocity::new::<meter_per_second>),
            min_velocity: self
                .optional(Field::MinVelocity, &lim.min_velocity, Dimension::Velocity, u.velocity, None)
                .map(Velocity::new::<meter_per_second>),
            max_drop_fraction: match lim.max_drop_percent.as_deref().map(str::trim).filter(|t| !t.is_empty()) {
                None => None,
                Some(t) => match parse_decimal(t.trim_end_matches('%').trim()) {
                    Ok(v) if v.is_finite() && v > 0.0 && v < 90.0 => Some(v / 100.0),
                    Ok(_) => {
                        self.fail(
                            Field::MaxDropPercent,
                            "give a percentage of the inlet pressure above 0 and below 90",
                        );
                        None
                    }
                    Err(e) => {
                        self.fail(Field::MaxDropPercent, e.to_string());
                        None
                    }
                },
            },
            velocity_by_size: match lim.velocity_by_size.as_deref().map(str::trim).filter(|t| !t.is_empty()) {
                None => None,
                Some(id) => {
                    let rule = velocity::rule(id);
                    if rule.is_none() {
                        let ids: Vec<&str> = velocity::RULES.iter().map(|r| r.id).collect();
                        self.fail(Field::VelocityBySize, format!("'{id}' is not one of {}", ids.join(", ")));
                    }
                    rule
                }
            },
        };
        if let (Some(lo), Some(hi)) = (limits.min_velocity, limits.max_velocity) {
            if lo >= hi {
                self.fail(Field::MinVelocity, "minimum velocity must be below the maximum");
            }
        }
        if limits == Limits::default() {
            self.fail(Field::Limits, "set at least one limit to size against");
        } else if limits.max_drop_per_length.is_none()
            && limits.max_total_drop.is_none()
            && limits.max_velocity.is_none()
            && limits.velocity_by_size.is_none()
            && limits.max_drop_fraction.is_none()
        {
            self.fail(
                Field::MinVelocity,
                "a minimum velocity alone does not size a line: set a maximum too (drop per length, total drop or \
                 velocity)",
            );
        }
        limits
    }
}

impl LineFile {
    /// Turns the stored text into the core's [`Line`], validated, reporting
    /// every bad field, not just the first.
    ///
    /// # Errors
    /// Every [`FieldError`] found; then the core's own checks (positive
    /// flow, finite values …), each against the field it concerns.
    pub fn to_line(&self, units: &Units) -> Result<Valid, Vec<FieldError>> {
        self.to_line_carrying(units, None)
    }

    /// As [`LineFile::to_line`], for a line in a system whose flow comes from
    /// `carried_w`, the heat load it carries for its branches as well as its
    /// own (`sheet::system::carried`).
    ///
    /// # Errors
    /// As [`LineFile::to_line`].
    pub fn to_line_carrying(
        &self,
        units: &Units,
        carried: Option<&super::system::Carried>,
    ) -> Result<Valid, Vec<FieldError>> {
        let carried_w = carried.map(|c| c.load_w);
        let mut r = Reader { errors: Vec::new(), units };
        let at = r.fluid(&self.fluid);
        let rho = r.properties(&at).map(|p| p.density_kg_m3());
        if let Some(t) = self.diversity.as_deref().map(str::trim).filter(|t| !t.is_empty()) {
            match parse_decimal(t) {
                Ok(d) if d.is_finite() && d > 0.0 && d <= 1.0 => {}
                Ok(_) => r.fail(Field::Diversity, "diversity must be more than 0 and at most 1"),
                Err(e) => r.fail(Field::Diversity, e.to_string()),
            }
        }
        let flow = match (&self.load, &self.fixtures) {
            (Some(load), _) => r.load_flow(load, &at, rho, carried_w),
            (None, Some(fx)) => r.fixture_flow(fx, carried),
            (None, None) => r.flow(&self.flow, rho, at.fluid.as_ref()),
        };
        if self.limits.max_drop_percent.as_deref().is_some_and(|t| !t.trim().is_empty())
            && at.fluid.is_some_and(|f| !f.is_compressible())
        {
            r.fail(Field::MaxDropPercent, "a drop as a share of the inlet pressure is a limit for gas and steam lines");
        }
        if self.fixtures.is_some() && at.fluid.is_some_and(|f| f.is_compressible()) {
            r.fail(Field::Fixtures, "fixture units give a water demand: a gas or steam line takes a flow");
        }
        let (pipe, material) = r.pipe(&self.pipe);
        let roughness = r.roughness(self, material);
        let length = r.length(&self.length, &self.limits);
        let counts = r.fittings(self);
        let components = r.components(self, rho);
        let extra_k = match self.extra_k.as_deref().map(str::trim) {
            None | Some("") => Some(0.0),
            Some(t) => r.number(Field::ExtraK, t),
        };
        let equivalent_length =
            r.optional(Field::EquivalentLength, &self.equivalent_length, Dimension::Length, units.length, None);
        let rise = r.optional(Field::Rise, &self.rise, Dimension::Length, units.length, None).unwrap_or(0.0);
        let method = r.method(self, material);
        let limits = r.limits(self, rho);
        let smallest = match (self.smallest_size.as_deref().map(str::trim).filter(|t| !t.is_empty()), pipe) {
            (None, _) => Some(None),
            (Some(n), Some(Pipe::Series(s))) => match s.size(n) {
                Some(z) => Some(Some(z.nominal)),
                None => {
                    r.fail(Field::SmallestSize, format!("'{n}' is not a size of this pipe series"));
                    None
                }
            },
            (Some(_), _) => Some(None),
        };
        let basis = units.basis;
        let complete = (|| {
            Some(Line {
                flow: VolumeRate::new::<cubic_meter_per_second>(flow?),
                fluid: at.fluid?,
                temperature: ThermodynamicTemperature::new::<kelvin>(at.t_k?),
                pressure: Pressure::new::<pascal>(at.p_pa?),
                pipe: pipe?,
                roughness: Length::new::<meter>(roughness?),
                length: Length::new::<meter>(length?),
                fittings: Fittings {
                    counts,
                    components: components?,
                    extra_k: extra_k?,
                    equivalent_length: equivalent_length.map(Length::new::<meter>),
                },
                rise: Length::new::<meter>(rise),
                method: method?,
                limits,
                circuit: basis.circuit,
                freeze_margin: f64::from(basis.freeze_margin()),
                every_size: basis.every_size,
                smallest: smallest?,
            })
        })();
        match complete {
            Some(line) if r.errors.is_empty() => {
                line.validate().map_err(|err| vec![FieldError { field: err.field(), message: err.to_string() }])
            }
            _ => Err(r.errors),
        }
    }
}
