//! The edits a person makes to a line, as plain methods on [`LineFile`]:
//! the page's editor only calls them, and they are tested natively.
//!
//! - Every text input is addressed by its [`Field`] ([`LineFile::text`],
//!   [`LineFile::set_text`]), so the editor needs one small component for
//!   all of them instead of a getter and a setter per input.
//! - Switching a fluid or a pipe keeps what still applies (the temperature,
//!   the material) and fills the rest with defaults marked below.

use super::file::{
    ComponentFile, ComponentKind, FittingCount, FixtureCountFile, FixturesFile, FluidFile, GlycolName, LineFile,
    LoadFile, MethodName, PipeFile,
};
use super::presets::Service;
use crate::hydraulics::field::Field;
use crate::hydraulics::losses::Fitting;
use crate::hydraulics::pipes::{self, Material};

/// Where a line's flow comes from.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum FlowFrom {
    /// A flow typed in.
    Flow,
    /// A heat load and ΔT.
    Load,
    /// The fixtures it serves.
    Fixtures,
}

impl FlowFrom {
    /// Every source, in picker order.
    pub const ALL: [FlowFrom; 3] = [FlowFrom::Flow, FlowFrom::Load, FlowFrom::Fixtures];

    /// Stable id for the picker.
    pub fn id(self) -> &'static str {
        match self {
            FlowFrom::Flow => "flow",
            FlowFrom::Load => "load",
            FlowFrom::Fixtures => "fixtures",
        }
    }

    /// Words for the picker.
    pub fn label(self) -> &'static str {
        match self {
            FlowFrom::Flow => "a flow",
            FlowFrom::Load => "a heat load and ΔT",
            FlowFrom::Fixtures => "fixtures (probable demand)",
        }
    }

    /// Finds a source by id.
    pub fn from_id(id: &str) -> Option<FlowFrom> {
        FlowFrom::ALL.into_iter().find(|f| f.id() == id)
    }
}

/// The gases a line can name, in listing order, as (id, label): the
/// tabulated ones from `hydraulics::fluid::gas::NAMED`, then natural gas
/// and a gas typed in.
pub fn gas_choices() -> impl Iterator<Item = (&'static str, &'static str)> {
    crate::hydraulics::fluid::gas::NAMED
        .into_iter()
        .map(|n| (n.id, n.label))
        .chain([("natural-gas", "Natural gas (by relative density)"), ("custom", "Other gas (molar mass, μ, Z)")])
}

/// Which kind of fluid a line carries.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum FluidKind {
    /// Liquid water.
    Water,
    /// A glycol in water.
    Glycol,
    /// Properties typed in.
    Custom,
    /// A gas.
    Gas,
    /// Dry steam.
    Steam,
}

impl FluidKind {
    /// Every kind, in listing order.
    pub const ALL: [FluidKind; 5] =
        [FluidKind::Water, FluidKind::Glycol, FluidKind::Custom, FluidKind::Gas, FluidKind::Steam];

    /// Its id (the file's `fluid.kind`).
    pub fn id(self) -> &'static str {
        match self {
            FluidKind::Water => "water",
            FluidKind::Glycol => "glycol",
            FluidKind::Custom => "custom",
            FluidKind::Gas => "gas",
            FluidKind::Steam => "steam",
        }
    }

    /// How a list shows it.
    pub fn label(self) -> &'static str {
        match self {
            FluidKind::Water => "Water",
            FluidKind::Glycol => "Glycol in water",
            FluidKind::Custom => "Other liquid (enter ρ and μ)",
            FluidKind::Gas => "Gas (air, nitrogen, natural gas …)",
            FluidKind::Steam => "Steam (dry saturated or superheated)",
        }
    }

    /// The kind of an id.
    pub fn from_id(id: &str) -> Option<FluidKind> {
        FluidKind::ALL.into_iter().find(|k| k.id() == id)
    }
}

/// What the pipe list shows for a custom bore.
pub const CUSTOM_BORE: &str = "custom";

fn some(text: String) -> Option<String> {
    if text.trim().is_empty() {
        None
    } else {
        Some(text)
    }
}

impl LineFile {
    /// The text of one input ("" where the line has no such input now).
    pub fn text(&self, field: Field) -> String {
        let opt = |o: &Option<String>| o.clone().unwrap_or_default();
        match (field, &self.fluid, &self.pipe) {
            (Field::Name, ..) => self.name.clone(),
            (Field::FedFrom, ..) => opt(&self.fed_from),
            (Field::Diversity, ..) => opt(&self.diversity),
            (Field::Flow, ..) => self.flow.clone(),
            (Field::LoadPower, ..) => self.load.as_ref().map(|l| l.power.clone()).unwrap_or_default(),
            (Field::LoadDeltaT, ..) => self.load.as_ref().map(|l| l.delta_t.clone()).unwrap_or_default(),
            (Field::ContinuousFlow, ..) => self.fixtures.as_ref().map(|x| x.continuous.clone()).unwrap_or_default(),
            (
                Field::FluidTemperature,
                FluidFile::Water { temperature, .. } | FluidFile::Glycol { temperature, .. },
                _,
            ) => temperature.clone(),
            (Field::FluidPressure, FluidFile::Water { pressure, .. }, _) => opt(pressure),
            (Field::FluidTemperature, FluidFile::Gas { temperature, .. }, _) => temperature.clone(),
            (Field::FluidTemperature, FluidFile::Steam { temperature, .. }, _) => opt(temperature),
            (Field::FluidPressure, FluidFile::Gas { pressure, .. } | FluidFile::Steam { pressure, .. }, _) => {
                pressure.clone()
            }
            (Field::FluidRelativeDensity, FluidFile::Gas { relative_density, .. }, _) => opt(relative_density),
            (Field::FluidMolarMass, FluidFile::Gas { molar_mass, .. }, _) => opt(molar_mass),
            (Field::FluidViscosity, FluidFile::Gas { viscosity_mpa_s, .. }, _) => opt(viscosity_mpa_s),
            (Field::FluidZ, FluidFile::Gas { z, .. }, _) => opt(z),
            (Field::MaxDropPercent, ..) => opt(&self.limits.max_drop_percent),
            (Field::FluidPercent, FluidFile::Glycol { percent, .. }, _) => percent.clone(),
            (Field::FluidDensity, FluidFile::Custom { density_kg_m3, .. }, _) => density_kg_m3.clone(),
            (Field::FluidViscosity, FluidFile::Custom { viscosity_mpa_s, .. }, _) => opt(viscosity_mpa_s),
            (Field::PipeDiameter, _, PipeFile::Bore { diameter, .. }) => diameter.clone(),
            (Field::Roughness, ..) => opt(&self.roughness),
            (Field::Length, ..) => self.length.clone(),
            (Field::ExtraK, ..) => opt(&self.extra_k),
            (Field::EquivalentLength, ..) => opt(&self.equivalent_length),
            (Field::Rise, ..) => opt(&self.rise),
            (Field::HazenWilliamsC, ..) => opt(&self.hazen_williams_c),
            (Field::MaxDropPerLength, ..) => opt(&self.limits.max_drop_per_length),
            (Field::MaxTotalDrop, ..) => opt(&self.limits.max_total_drop),
            (Field::MaxVelocity, ..) => opt(&self.limits.max_velocity),
            (Field::MinVelocity, ..) => opt(&self.limits.min_velocity),
            _ => String::new(),
        }
    }

    /// Sets one input's text, exactly as typed; an optional input left
    /// blank is stored as absent. An input the line does not have now is
    /// left alone.
    pub fn set_text(&mut self, field: Field, text: String) {
        match (field, &mut self.fluid, &mut self.pipe) {
            (Field::Name, ..) => self.name = text,
            (Field::FedFrom, ..) => self.fed_from = some(text),
            (Field::Diversity, ..) => self.diversity = some(text),
            (Field::Flow, ..) => self.flow = text,
            (Field::LoadPower, ..) => {
                if let Some(l) = &mut self.load {
                    l.power = text;
                }
            }
            (Field::LoadDeltaT, ..) => {
                if let Some(l) = &mut self.load {
                    l.delta_t = text;
                }
            }
            (Field::ContinuousFlow, ..) => {
                if let Some(x) = &mut self.fixtures {
                    x.continuous = text;
                }
            }
            (
                Field::FluidTemperature,
                FluidFile::Water { temperature, .. } | FluidFile::Glycol { temperature, .. },
                _,
            ) => *temperature = text,
            (Field::FluidPressure, FluidFile::Water { pressure, .. }, _) => *pressure = some(text),
            (Field::FluidTemperature, FluidFile::Gas { temperature, .. }, _) => *temperature = text,
            (Field::FluidTemperature, FluidFile::Steam { temperature, .. }, _) => *temperature = some(text),
            (Field::FluidPressure, FluidFile::Gas { pressure, .. } | FluidFile::Steam { pressure, .. }, _) => {
                *pressure = text
            }
            (Field::FluidRelativeDensity, FluidFile::Gas { relative_density, .. }, _) => *relative_density = some(text),
            (Field::FluidMolarMass, FluidFile::Gas { molar_mass, .. }, _) => *molar_mass = some(text),
            (Field::FluidViscosity, FluidFile::Gas { viscosity_mpa_s, .. }, _) => *viscosity_mpa_s = some(text),
            (Field::FluidZ, FluidFile::Gas { z, .. }, _) => *z = some(text),
            (Field::MaxDropPercent, ..) => self.limits.max_drop_percent = some(text),
            (Field::FluidPercent, FluidFile::Glycol { percent, .. }, _) => *percent = text,
            (Field::FluidDensity, FluidFile::Custom { density_kg_m3, .. }, _) => *density_kg_m3 = text,
            (Field::FluidViscosity, FluidFile::Custom { viscosity_mpa_s, .. }, _) => *viscosity_mpa_s = some(text),
            (Field::PipeDiameter, _, PipeFile::Bore { diameter, .. }) => *diameter = text,
            (Field::Roughness, ..) => self.roughness = some(text),
            (Field::Length, ..) => self.length = text,
            (Field::ExtraK, ..) => self.extra_k = some(text),
            (Field::EquivalentLength, ..) => self.equivalent_length = some(text),
            (Field::Rise, ..) => self.rise = some(text),
            (Field::HazenWilliamsC, ..) => self.hazen_williams_c = some(text),
            (Field::MaxDropPerLength, ..) => self.limits.max_drop_per_length = some(text),
            (Field::MaxTotalDrop, ..) => self.limits.max_total_drop = some(text),
            (Field::MaxVelocity, ..) => self.limits.max_velocity = some(text),
            (Field::MinVelocity, ..) => self.limits.min_velocity = some(text),
            _ => {}
        }
    }

    /// The kind of fluid.
    pub fn fluid_kind(&self) -> FluidKind {
        match self.fluid {
            FluidFile::Water { .. } => FluidKind::Water,
            FluidFile::Glycol { .. } => FluidKind::Glycol,
            FluidFile::Custom { .. } => FluidKind::Custom,
            FluidFile::Gas { .. } => FluidKind::Gas,
            FluidFile::Steam { .. } => FluidKind::Steam,
        }
    }

    /// Switches the kind of fluid, keeping the temperature. New values are
    /// starting points to be checked (common practice, not design data):
    /// water at 300 kPa absolute, 30 % propylene glycol, a custom fluid of
    /// 1000 kg/m³ and 1.0 mPa·s, air at 7 barg, dry saturated steam at
    /// 8 barg.
    pub fn set_fluid_kind(&mut self, kind: FluidKind) {
        if kind == self.fluid_kind() {
            return;
        }
        let t = match &self.fluid {
            FluidFile::Water { temperature, .. }
            | FluidFile::Glycol { temperature, .. }
            | FluidFile::Gas { temperature, .. } => temperature.clone(),
            FluidFile::Custom { .. } | FluidFile::Steam { .. } => "20 °C".to_owned(),
        };
        self.fluid = match kind {
            FluidKind::Glycol => {
                FluidFile::Glycol { glycol: GlycolName::Propylene, percent: "30".into(), temperature: t }
            }
            FluidKind::Custom => FluidFile::Custom {
                density_kg_m3: "1000".into(),
                viscosity_mpa_s: Some("1.0".into()),
                kinematic_viscosity_mm2_s: None,
            },
            FluidKind::Water => FluidFile::Water { temperature: t, pressure: Some("300 kPa".into()) },
            FluidKind::Gas => FluidFile::Gas {
                gas: "air".into(),
                temperature: t,
                pressure: "7 barg".into(),
                relative_density: None,
                molar_mass: None,
                viscosity_mpa_s: None,
                z: None,
            },
            FluidKind::Steam => FluidFile::Steam { pressure: "8 barg".into(), temperature: None },
        };
    }

    /// The gas's id (a gas line only).
    pub fn gas_choice(&self) -> Option<&str> {
        match &self.fluid {
            FluidFile::Gas { gas, .. } => Some(gas),
            _ => None,
        }
    }

    /// Chooses the gas (a gas line only). Starting values to be checked:
    /// natural gas of relative density 0.6; a custom gas with air's molar
    /// mass and viscosity.
    pub fn set_gas(&mut self, id: &str) {
        if let FluidFile::Gas { gas, relative_density, molar_mass, viscosity_mpa_s, .. } = &mut self.fluid {
            *gas = id.to_owned();
            if id == "natural-gas" && relative_density.is_none() {
                *relative_density = Some("0.6".into());
            }
            if id == "custom" {
                molar_mass.get_or_insert_with(|| "28.96".into());
                viscosity_mpa_s.get_or_insert_with(|| "0.018".into());
            }
        }
    }

    /// Chooses the glycol (a glycol line only).
    pub fn set_glycol(&mut self, which: GlycolName) {
        if let FluidFile::Glycol { glycol, .. } = &mut self.fluid {
            *glycol = which;
        }
    }

    /// The pipe's material, from its series or its custom bore.
    pub fn material(&self) -> Option<Material> {
        match &self.pipe {
            PipeFile::Series(id) => pipes::series(id).map(|s| s.material),
            PipeFile::Bore { material, .. } => Material::from_id(material),
        }
    }

    /// The series id, or [`CUSTOM_BORE`].
    pub fn series_choice(&self) -> &str {
        match &self.pipe {
            PipeFile::Series(id) => id,
            PipeFile::Bore { .. } => CUSTOM_BORE,
        }
    }

    /// Picks a series (or [`CUSTOM_BORE`], 50 mm of the same material);
    /// a pinned size no longer applies.
    pub fn set_series(&mut self, choice: &str) {
        self.check_size = None;
        self.smallest_size = None;
        self.pipe = if choice == CUSTOM_BORE {
            let m = self.material().unwrap_or(Material::CarbonSteel);
            PipeFile::Bore { diameter: "50 mm".into(), material: m.id().into() }
        } else {
            PipeFile::Series(choice.to_owned())
        };
    }

    /// Sets a custom bore's material.
    pub fn set_material(&mut self, id: &str) {
        if let PipeFile::Bore { material, .. } = &mut self.pipe {
            *material = id.to_owned();
        }
    }

    /// The roughness used when none is typed, mm, with its material.
    pub fn default_roughness_mm(&self) -> Option<(f64, Material)> {
        self.material().map(|m| {
            let r = m.roughness();
            (if self.aged { r.aged_mm.unwrap_or(r.new_mm) } else { r.new_mm }, m)
        })
    }

    /// Whether the material has a published aged roughness.
    pub fn can_age(&self) -> bool {
        self.material().and_then(|m| m.roughness().aged_mm).is_some()
    }

    /// Fills fluid, pipe and limits from a service's defaults, keeping the
    /// name, flow, run and fittings.
    pub fn apply_service(&mut self, s: &Service) {
        let fresh = s.new_line(&self.name);
        self.fluid = fresh.fluid;
        self.pipe = fresh.pipe;
        self.limits = fresh.limits;
        self.roughness = None;
        self.check_size = None;
    }

    /// Chooses the friction method.
    pub fn set_method(&mut self, method: MethodName) {
        self.method = method;
    }

    /// Adds a row of one welded 90° elbow.
    pub fn add_fitting(&mut self) {
        self.fittings.push(FittingCount::new(Fitting::Elbow90Welded.id(), 1));
    }

    /// Where the line's flow comes from.
    pub fn flow_from(&self) -> FlowFrom {
        match (&self.load, &self.fixtures) {
            (Some(_), _) => FlowFrom::Load,
            (None, Some(_)) => FlowFrom::Fixtures,
            (None, None) => FlowFrom::Flow,
        }
    }

    /// Changes where the flow comes from. The typed flow is kept whatever
    /// is chosen; a load's or the fixtures' texts are dropped when another
    /// source is chosen.
    pub fn set_flow_from(&mut self, from: FlowFrom) {
        if self.flow_from() == from {
            return;
        }
        self.load = (from == FlowFrom::Load).then(LoadFile::default);
        self.fixtures = (from == FlowFrom::Fixtures).then(FixturesFile::default);
    }

    /// Adds a fixture row of a kind, one of it.
    pub fn add_fixture(&mut self, kind: &str) {
        let fx = self.fixtures.get_or_insert_with(FixturesFile::default);
        fx.items.push(FixtureCountFile { kind: kind.to_owned(), count: "1".to_owned() });
    }

    /// Sets a fixture row's count, as typed.
    pub fn set_fixture_count(&mut self, row: usize, count: String) {
        if let Some(r) = self.fixtures.as_mut().and_then(|x| x.items.get_mut(row)) {
            r.count = count;
        }
    }

    /// Sets a fixture row's kind.
    pub fn set_fixture_kind(&mut self, row: usize, kind: String) {
        if let Some(r) = self.fixtures.as_mut().and_then(|x| x.items.get_mut(row)) {
            r.kind = kind;
        }
    }

    /// Removes a fixture row.
    pub fn remove_fixture(&mut self, row: usize) {
        if let Some(x) = self.fixtures.as_mut().filter(|x| row < x.items.len()) {
            x.items.remove(row);
        }
    }

    /// Sets which supply the fixtures are read on.
    pub fn set_supply(&mut self, supply: crate::hydraulics::demand::Supply) {
        if let Some(x) = &mut self.fixtures {
            x.supply = supply;
        }
    }

    /// Adds a valve or piece of equipment (a Kv valve to start with).
    pub fn add_component(&mut self) {
        self.components.push(ComponentFile::default());
    }

    /// Removes a component.
    pub fn remove_component(&mut self, row: usize) {
        if row < self.components.len() {
            self.components.remove(row);
        }
    }

    /// Changes how a component is given; texts of other kinds are cleared.
    pub fn set_component_kind(&mut self, row: usize, kind: ComponentKind) {
        if let Some(c) = self.components.get_mut(row) {
            if c.kind != kind {
                *c = ComponentFile { name: std::mem::take(&mut c.name), kind, ..ComponentFile::default() };
            }
        }
    }

    /// Sets one text of a component, as typed: `which` is "name", "value",
    /// "drop", "at_flow", "to_bore" or "angle".
    pub fn set_component_text(&mut self, row: usize, which: &str, text: String) {
        if let Some(c) = self.components.get_mut(row) {
            match which {
                "name" => c.name = text,
                "value" => c.value = text,
                "drop" => c.drop = text,
                "at_flow" => c.at_flow = text,
                "to_bore" => c.to_bore = text,
                "angle" => c.angle = text,
                _ => {}
            }
        }
    }

    /// Removes a fitting row.
    pub fn remove_fitting(&mut self, row: usize) {
        if row < self.fittings.len() {
            self.fittings.remove(row);
        }
    }

    /// Sets a fitting row's kind.
    pub fn set_fitting_kind(&mut self, row: usize, id: String) {
        if let Some(r) = self.fittings.get_mut(row) {
            r.fitting = id;
        }
    }

    /// Sets a fitting row's count, as typed.
    pub fn set_fitting_count(&mut self, row: usize, text: String) {
        if let Some(r) = self.fittings.get_mut(row) {
            r.count = text;
        }
    }

    /// Pins a size for check mode, or unpins it when it is the pinned one.
    pub fn toggle_check(&mut self, nominal: &str) {
        self.check_size = if self.check_size.as_deref() == Some(nominal) { None } else { Some(nominal.to_owned()) };
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sheet::file::SheetFile;
    use crate::sheet::presets::SERVICES;

    fn line() -> LineFile {
        SheetFile::from_json(include_str!("../../examples/clinic-chilled-water.json")).unwrap().lines.remove(0)
    }

    #[test]
    fn every_input_reads_back_what_was_set() {
        let mut l = line();
        for field in [
            Field::Name,
            Field::Flow,
            Field::FluidTemperature,
            Field::FluidPressure,
            Field::Roughness,
            Field::Length,
            Field::ExtraK,
            Field::EquivalentLength,
            Field::Rise,
            Field::HazenWilliamsC,
            Field::MaxDropPerLength,
            Field::MaxTotalDrop,
            Field::MaxVelocity,
            Field::MinVelocity,
        ] {
            l.set_text(field, format!("7,5 {field}"));
            assert_eq!(l.text(field), format!("7,5 {field}"), "{field}");
        }
        // Blank optional inputs are absent, not empty strings.
        l.set_text(Field::Rise, "  ".into());
        assert_eq!(l.rise, None);
        // An input the line does not have is left alone.
        l.set_text(Field::FluidPercent, "40".into());
        assert_eq!(l.text(Field::FluidPercent), "");
    }

    #[test]
    fn switching_the_fluid_keeps_the_temperature() {
        let mut l = line();
        l.set_text(Field::FluidTemperature, "4 °C".into());
        l.set_fluid_kind(FluidKind::Glycol);
        assert_eq!(l.fluid_kind(), FluidKind::Glycol);
        assert_eq!(l.text(Field::FluidTemperature), "4 °C");
        assert_eq!(l.text(Field::FluidPercent), "30");
        l.set_glycol(GlycolName::Ethylene);
        assert!(matches!(l.fluid, FluidFile::Glycol { glycol: GlycolName::Ethylene, .. }));
        l.set_fluid_kind(FluidKind::Water);
        assert_eq!(l.text(Field::FluidTemperature), "4 °C");
        l.set_fluid_kind(FluidKind::Custom);
        assert_eq!(l.text(Field::FluidDensity), "1000");
    }

    #[test]
    fn a_custom_bore_keeps_the_material_and_unpins_the_size() {
        let mut l = line();
        l.toggle_check("4");
        assert_eq!(l.check_size.as_deref(), Some("4"));
        l.set_series(CUSTOM_BORE);
        assert_eq!(l.check_size, None);
        assert_eq!(l.series_choice(), CUSTOM_BORE);
        assert_eq!(l.material(), Some(Material::CarbonSteel));
        l.set_material("pe");
        assert_eq!(l.material(), Some(Material::Polyethylene));
        l.set_series("copper-l");
        assert_eq!(l.material(), Some(Material::Copper));
        l.toggle_check("1");
        l.toggle_check("1");
        assert_eq!(l.check_size, None, "a second tap unpins");
    }

    #[test]
    fn fitting_rows_add_change_and_remove() {
        let mut l = line();
        let n = l.fittings.len();
        l.add_fitting();
        assert_eq!(l.fittings.len(), n + 1);
        l.set_fitting_kind(n, "valve-globe".into());
        l.set_fitting_count(n, "2.5".into());
        assert_eq!(l.fittings[n], FittingCount { fitting: "valve-globe".into(), count: "2.5".into() });
        l.remove_fitting(n);
        l.remove_fitting(99);
        assert_eq!(l.fittings.len(), n);
    }

    #[test]
    fn a_service_fills_fluid_pipe_and_limits_and_keeps_the_run() {
        let mut l = line();
        let (name, flow, length) = (l.name.clone(), l.flow.clone(), l.length.clone());
        l.roughness = Some("0.2 mm".into());
        let s = SERVICES.iter().find(|s| s.id == "process").unwrap();
        l.apply_service(s);
        let fresh = s.new_line(&name);
        assert_eq!((l.fluid.clone(), l.pipe.clone(), l.limits.clone()), (fresh.fluid, fresh.pipe, fresh.limits));
        assert_eq!((l.name, l.flow, l.length, l.roughness), (name, flow, length, None));
    }

    #[test]
    fn the_default_roughness_follows_the_aged_choice() {
        // The values are the material table's (src/hydraulics/pipes.rs,
        // which names their sources); this checks which one is used.
        let mut l = line();
        let (new, m) = l.default_roughness_mm().unwrap();
        assert_eq!((new, m), (Material::CarbonSteel.roughness().new_mm, Material::CarbonSteel));
        assert!(l.can_age());
        l.aged = true;
        assert_eq!(l.default_roughness_mm().unwrap().0, Material::CarbonSteel.roughness().aged_mm.unwrap());
    }

    #[test]
    fn the_flow_source_switches_without_losing_the_typed_flow() {
        let mut l = line();
        l.set_flow_from(FlowFrom::Flow);
        l.flow = "18.5 L/s".into();
        let flow = l.flow.clone();
        assert_eq!(l.flow_from(), FlowFrom::Flow);
        l.set_flow_from(FlowFrom::Fixtures);
        l.add_fixture("lavatory-public");
        l.add_fixture("wc-public-tank");
        l.set_fixture_count(1, "3".into());
        l.set_fixture_kind(0, "shower-public".into());
        l.set_text(Field::ContinuousFlow, "0.1 L/s".into());
        let fx = l.fixtures.clone().unwrap();
        assert_eq!(fx.items[0].kind, "shower-public");
        assert_eq!(fx.items[1].count, "3");
        assert_eq!(l.text(Field::ContinuousFlow), "0.1 L/s");
        l.remove_fixture(0);
        assert_eq!(l.fixtures.as_ref().unwrap().items.len(), 1);
        l.set_flow_from(FlowFrom::Load);
        assert!(l.fixtures.is_none() && l.load.is_some());
        l.set_flow_from(FlowFrom::Flow);
        assert_eq!((l.flow_from(), l.flow.clone()), (FlowFrom::Flow, flow));
        for f in FlowFrom::ALL {
            assert_eq!(FlowFrom::from_id(f.id()), Some(f));
        }
    }
}
