//! The sheet file: one versioned JSON format for a whole worksheet, read by
//! the native batch command and (later) saved and exported by the page.
//!
//! Design choices:
//! - Every value is kept as the text the engineer typed ("12.5 L/s",
//!   "2,5", "7 °C"), so nothing typed is ever lost or silently rounded, and
//!   a bare number is read in the sheet's unit for that field.
//! - `format` and `version` come first; a reader refuses a version it does
//!   not know rather than guessing. Unknown fields are refused too, so a
//!   typo in a hand-edited file is reported, not ignored.
//!
//! The format is documented field by field in `docs/sheet-format.md`; the
//! text becomes the core's line in `reader`.

pub use crate::hydraulics::line::Circuit;
use serde::{Deserialize, Serialize};

use super::units::{self, Dimension, Unit};
use super::{json, records};
use crate::hydraulics::field::Field;
use crate::hydraulics::fluid::Glycol;

/// The value of the `format` field.
pub const FORMAT: &str = "headroom-sheet";
/// The newest version this build reads and writes. A sheet is written as
/// the oldest version that holds everything it uses (see
/// [`SheetFile::required_version`]), so a sheet without the newer fields
/// still opens in an older Headroom, and one with them is reported there as
/// newer rather than as damaged.
///
/// - 1: the first format.
/// - 2: adds `basis`, `components`, `smallest_size`,
///   `limits.velocity_by_size`, `load`, `fed_from`, `diversity`,
///   `basis.return_run`, and the units `power` and `temperature_difference`.
/// - 3: adds `fixtures` on a line, `basis.demand` and the sheet's `system`
///   (source and outlet pressures, pump curve, pump suction).
/// - 4: adds the fluids `gas` and `steam`, `limits.max_drop_percent`, and
///   standard and normal volume flow units as the sheet's flow unit.
pub const VERSION: u32 = 4;

/// A whole worksheet.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SheetFile {
    /// Always "headroom-sheet".
    pub format: String,
    /// Format version.
    pub version: u32,
    /// Project name.
    #[serde(default)]
    pub project: String,
    /// Date of the worksheet, as written (ISO 8601 recommended).
    #[serde(default)]
    pub date: String,
    /// Unit system and per-field unit choices.
    #[serde(default)]
    pub units: UnitChoice,
    /// Sheet-wide design basis (absent: an open system, a 3 K freezing
    /// margin, preferred sizes only).
    #[serde(default, skip_serializing_if = "Basis::is_default")]
    pub basis: Basis,
    /// Whole-system settings: pressures of an open system, the pump curve
    /// and its suction (version 3).
    #[serde(default, skip_serializing_if = "SystemFile::is_empty")]
    pub system: SystemFile,
    /// The lines.
    pub lines: Vec<LineFile>,
}

/// Whole-system settings, as typed; every field may be blank.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct SystemFile {
    /// Open system: the pressure available at the source (mains pressure
    /// at the meter, or a booster set's discharge), gauge.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub source_pressure: String,
    /// Open system: the least pressure each outlet needs, flowing, gauge.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub outlet_minimum: String,
    /// Up to three points of the pump's curve, flow and head.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub pump: Vec<PumpPointFile>,
    /// The pump's suction, for the NPSH available.
    #[serde(default, skip_serializing_if = "SuctionFile::is_empty")]
    pub suction: SuctionFile,
}

impl SystemFile {
    /// True when nothing is set.
    pub fn is_empty(&self) -> bool {
        *self == SystemFile::default()
    }
}

/// One point of a pump curve, as typed.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct PumpPointFile {
    /// Flow.
    #[serde(default)]
    pub flow: String,
    /// Head (a pressure or a height of the fluid).
    #[serde(default)]
    pub head: String,
}

/// The pump's suction side, as typed.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct SuctionFile {
    /// Absolute pressure on the liquid surface the pump draws from (the
    /// atmosphere for an open tank; the fill pressure at the expansion
    /// vessel of a closed loop).
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub pressure: String,
    /// Height of that surface above the pump's inlet (negative below).
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub height: String,
    /// Losses in the suction pipe at the duty flow.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub loss: String,
}

impl SuctionFile {
    /// True when nothing is set.
    pub fn is_empty(&self) -> bool {
        *self == SuctionFile::default()
    }
}

/// Sheet-wide design settings, as stored.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct Basis {
    /// Open system or closed loop.
    #[serde(default, skip_serializing_if = "is_open")]
    pub circuit: Circuit,
    /// Kelvin a glycol mixture must stay above its freezing point; absent
    /// means [`DEFAULT_FREEZE_MARGIN_K`].
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub freeze_margin_k: Option<u8>,
    /// Search every size, the rarely stocked ones too.
    #[serde(default, skip_serializing_if = "is_false")]
    pub every_size: bool,
    /// Closed loop: whether the return run mirrors the flow run (the pump
    /// head counts the index circuit twice) or is entered as lines.
    #[serde(default, skip_serializing_if = "ReturnRun::is_mirrored")]
    pub return_run: ReturnRun,
    /// How fixtures become a probable flow (version 3).
    #[serde(default, skip_serializing_if = "is_hunter_tanks")]
    pub demand: crate::hydraulics::demand::Method,
}

fn is_hunter_tanks(m: &crate::hydraulics::demand::Method) -> bool {
    *m == crate::hydraulics::demand::Method::HunterTanks
}

/// How a closed loop's return run is accounted for.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(rename_all = "lowercase")]
pub enum ReturnRun {
    /// The return mirrors the flow run: the same drop again.
    #[default]
    Mirrored,
    /// The return is entered as lines of its own.
    Entered,
}

impl ReturnRun {
    fn is_mirrored(&self) -> bool {
        *self == ReturnRun::Mirrored
    }
}

/// Margin above a glycol mixture's freezing point when the sheet sets
/// none: 3 K, the low end of the 3–5 K of common practice.
pub const DEFAULT_FREEZE_MARGIN_K: u8 = 3;

/// Largest freezing margin a sheet may ask for, K.
pub const MAX_FREEZE_MARGIN_K: u8 = 20;

fn is_open(c: &Circuit) -> bool {
    *c == Circuit::Open
}

impl Basis {
    /// True when nothing differs from the defaults (then it is not written).
    pub fn is_default(&self) -> bool {
        *self == Basis::default()
    }

    /// The margin in force, K.
    pub fn freeze_margin(&self) -> u8 {
        self.freeze_margin_k.unwrap_or(DEFAULT_FREEZE_MARGIN_K)
    }
}

/// SI or US customary, the base for per-field defaults.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(rename_all = "lowercase")]
pub enum System {
    /// SI.
    #[default]
    Si,
    /// US customary.
    Us,
}

/// Which unit a bare number in each field is read in (and results are
/// written in). Absent fields take the system's default.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct UnitChoice {
    /// SI or US customary.
    #[serde(default)]
    pub system: System,
    /// Flow unit.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub flow: Option<String>,
    /// Pressure unit.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub pressure: Option<String>,
    /// Drop-per-length unit.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub drop_per_length: Option<String>,
    /// Length unit.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub length: Option<String>,
    /// Velocity unit.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub velocity: Option<String>,
    /// Temperature unit.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub temperature: Option<String>,
    /// Roughness unit.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub roughness: Option<String>,
    /// Heat-load unit (version 2).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub power: Option<String>,
    /// Temperature-difference unit (version 2).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub temperature_difference: Option<String>,
}

/// The unit of each field, resolved.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Units {
    /// Flow.
    pub flow: &'static Unit,
    /// Pressure.
    pub pressure: &'static Unit,
    /// Drop per length.
    pub drop_per_length: &'static Unit,
    /// Length.
    pub length: &'static Unit,
    /// Velocity.
    pub velocity: &'static Unit,
    /// Temperature.
    pub temperature: &'static Unit,
    /// Roughness.
    pub roughness: &'static Unit,
    /// Heat loads.
    pub power: &'static Unit,
    /// Temperature differences.
    pub temperature_difference: &'static Unit,
    /// The sheet's design basis.
    pub basis: Basis,
}

impl Units {
    /// The defaults of a unit system.
    pub fn defaults(system: System) -> Units {
        let f = |d, s| units::find(d, s).expect("default units exist");
        match system {
            System::Si => Units {
                flow: f(Dimension::Flow, "L/s"),
                pressure: f(Dimension::Pressure, "kPa"),
                drop_per_length: f(Dimension::DropPerLength, "Pa/m"),
                length: f(Dimension::Length, "m"),
                velocity: f(Dimension::Velocity, "m/s"),
                temperature: f(Dimension::Temperature, "°C"),
                roughness: f(Dimension::Roughness, "mm"),
                power: f(Dimension::Power, "kW"),
                temperature_difference: f(Dimension::TemperatureDifference, "K"),
                basis: Basis::default(),
            },
            System::Us => Units {
                flow: f(Dimension::Flow, "US gpm"),
                pressure: f(Dimension::Pressure, "psi"),
                drop_per_length: f(Dimension::DropPerLength, "ft/100 ft"),
                length: f(Dimension::Length, "ft"),
                velocity: f(Dimension::Velocity, "ft/s"),
                temperature: f(Dimension::Temperature, "°F"),
                roughness: f(Dimension::Roughness, "in"),
                power: f(Dimension::Power, "Btu/h"),
                temperature_difference: f(Dimension::TemperatureDifference, "°F"),
                basis: Basis::default(),
            },
        }
    }
}

impl Units {
    /// The unit of one kind of field.
    pub fn of(&self, dim: Dimension) -> &'static Unit {
        match dim {
            Dimension::Flow => self.flow,
            Dimension::Pressure => self.pressure,
            Dimension::DropPerLength => self.drop_per_length,
            Dimension::Length => self.length,
            Dimension::Velocity => self.velocity,
            Dimension::Temperature => self.temperature,
            Dimension::Roughness => self.roughness,
            Dimension::Power => self.power,
            Dimension::TemperatureDifference => self.temperature_difference,
        }
    }

    /// The unit inside diameters are shown in: inches on a sheet measured
    /// in feet, millimetres otherwise.
    pub fn bore(&self) -> &'static Unit {
        let name = if self.length.symbol == "ft" { "in" } else { "mm" };
        units::find(Dimension::Length, name).expect("bore units exist")
    }
}

impl UnitChoice {
    /// The stored choice for one kind of field.
    pub fn slot_mut(&mut self, dim: Dimension) -> &mut Option<String> {
        match dim {
            Dimension::Flow => &mut self.flow,
            Dimension::Pressure => &mut self.pressure,
            Dimension::DropPerLength => &mut self.drop_per_length,
            Dimension::Length => &mut self.length,
            Dimension::Velocity => &mut self.velocity,
            Dimension::Temperature => &mut self.temperature,
            Dimension::Roughness => &mut self.roughness,
            Dimension::Power => &mut self.power,
            Dimension::TemperatureDifference => &mut self.temperature_difference,
        }
    }

    /// Resolves the choices against the system's defaults.
    ///
    /// # Errors
    /// A [`FieldError`] naming the unit field that is not a known unit.
    pub fn resolve(&self) -> Result<Units, FieldError> {
        let mut u = Units::defaults(self.system);
        let pick = |slot: &mut &'static Unit, choice: &Option<String>, d: Dimension, field: Field| {
            if let Some(text) = choice {
                *slot = units::find(d, text)
                    .filter(|u| u.reference().is_none())
                    .ok_or_else(|| FieldError { field, message: format!("'{text}' is not a unit of {field}") })?;
            }
            Ok::<(), FieldError>(())
        };
        pick(&mut u.flow, &self.flow, Dimension::Flow, Field::UnitsFlow)?;
        pick(&mut u.pressure, &self.pressure, Dimension::Pressure, Field::UnitsPressure)?;
        pick(&mut u.drop_per_length, &self.drop_per_length, Dimension::DropPerLength, Field::UnitsDropPerLength)?;
        pick(&mut u.length, &self.length, Dimension::Length, Field::UnitsLength)?;
        pick(&mut u.velocity, &self.velocity, Dimension::Velocity, Field::UnitsVelocity)?;
        pick(&mut u.temperature, &self.temperature, Dimension::Temperature, Field::UnitsTemperature)?;
        pick(&mut u.roughness, &self.roughness, Dimension::Roughness, Field::UnitsRoughness)?;
        pick(&mut u.power, &self.power, Dimension::Power, Field::UnitsPower)?;
        pick(
            &mut u.temperature_difference,
            &self.temperature_difference,
            Dimension::TemperatureDifference,
            Field::UnitsTemperatureDifference,
        )?;
        Ok(u)
    }
}

/// One line as stored.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LineFile {
    /// Line name, e.g. "CHW riser B2".
    #[serde(default)]
    pub name: String,
    /// Design flow (ignored while `load` is set: the flow is derived).
    #[serde(default)]
    pub flow: String,
    /// A heat load and temperature difference the flow is derived from
    /// (version 2).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub load: Option<LoadFile>,
    /// The name of the line this one is fed from (version 2).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub fed_from: Option<String>,
    /// Diversity applied to the loads its branches bring, 0–1 (version 2).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub diversity: Option<String>,
    /// The fixtures the flow is derived from (version 3); with `load`
    /// absent.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub fixtures: Option<FixturesFile>,
    /// The fluid.
    pub fluid: FluidFile,
    /// The pipe: a series id or a custom bore.
    pub pipe: PipeFile,
    /// Roughness; absent means the material's.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub roughness: Option<String>,
    /// Use the material's aged roughness where one is published.
    #[serde(default, skip_serializing_if = "is_false")]
    pub aged: bool,
    /// Length of straight pipe.
    #[serde(default)]
    pub length: String,
    /// Counted fittings.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub fittings: Vec<FittingCount>,
    /// Valves and equipment by Kv/Cv, rated drop, butterfly valve or reducer.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub components: Vec<ComponentFile>,
    /// Extra ΣK.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub extra_k: Option<String>,
    /// Equivalent length of straight pipe for other losses.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub equivalent_length: Option<String>,
    /// Rise from start to end (negative for a fall).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub rise: Option<String>,
    /// Friction method.
    #[serde(default)]
    pub method: MethodName,
    /// Hazen–Williams C; absent means the material's.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub hazen_williams_c: Option<String>,
    /// Design limits.
    #[serde(default)]
    pub limits: LimitsFile,
    /// Check mode: the size to report instead of the proposal.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub check_size: Option<String>,
    /// The smallest size the search may propose.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub smallest_size: Option<String>,
}

/// A heat load and the temperature difference across it, as typed: the
/// flow is Φ / (ρ c_p ΔT).
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct LoadFile {
    /// The heat load.
    #[serde(default)]
    pub power: String,
    /// The temperature difference.
    #[serde(default)]
    pub delta_t: String,
}

/// The fixtures a line serves, as stored.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct FixturesFile {
    /// Which supply the line carries (cold, hot or both).
    #[serde(default)]
    pub supply: crate::hydraulics::demand::Supply,
    /// Kinds and counts.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub items: Vec<FixtureCountFile>,
    /// A continuous flow added to the probable demand (hot-water
    /// circulation, irrigation, process make-up).
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub continuous: String,
}

/// So many fixtures of a kind.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct FixtureCountFile {
    /// A kind id of the sheet's method (`hydraulics::demand`).
    pub kind: String,
    /// How many.
    #[serde(default)]
    pub count: String,
}

/// A valve or piece of equipment, as stored. Which texts count depends on
/// the kind: `value` for Kv and Cv, `drop` and `at_flow` for a rated drop,
/// `to_bore` and `angle` for a reducer, none for a butterfly valve.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct ComponentFile {
    /// What it is, e.g. "2-way valve V-3".
    #[serde(default)]
    pub name: String,
    /// How it is given.
    pub kind: ComponentKind,
    /// Kv (m³/h at 1 bar) or Cv (US gpm at 1 psi).
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub value: String,
    /// The rated drop.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub drop: String,
    /// The flow the drop was rated at.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub at_flow: String,
    /// The bore the flow goes to (mm unless typed).
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub to_bore: String,
    /// Included angle in degrees; empty means a sudden change (180°).
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub angle: String,
}

/// How a component is given.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize, Default)]
#[serde(rename_all = "lowercase")]
pub enum ComponentKind {
    /// Flow coefficient Kv.
    #[default]
    Kv,
    /// Flow coefficient Cv.
    Cv,
    /// A drop at a rated flow.
    Rated,
    /// A centric butterfly valve, open.
    Butterfly,
    /// A reducer or enlargement.
    Reducer,
}

impl ComponentKind {
    /// Every kind, in listing order.
    pub const ALL: [ComponentKind; 5] =
        [ComponentKind::Kv, ComponentKind::Cv, ComponentKind::Rated, ComponentKind::Butterfly, ComponentKind::Reducer];

    /// Its id in files.
    pub fn id(self) -> &'static str {
        match self {
            ComponentKind::Kv => "kv",
            ComponentKind::Cv => "cv",
            ComponentKind::Rated => "rated",
            ComponentKind::Butterfly => "butterfly",
            ComponentKind::Reducer => "reducer",
        }
    }

    /// The kind of an id.
    pub fn from_id(id: &str) -> Option<ComponentKind> {
        ComponentKind::ALL.into_iter().find(|k| k.id() == id)
    }

    /// A plain name.
    pub fn label(self) -> &'static str {
        match self {
            ComponentKind::Kv => "Valve by Kv (m³/h at 1 bar)",
            ComponentKind::Cv => "Valve by Cv (US gpm at 1 psi)",
            ComponentKind::Rated => "Equipment by drop at a rated flow (coil, exchanger, meter, strainer …)",
            ComponentKind::Butterfly => "Butterfly valve, centric, open (Crane)",
            ComponentKind::Reducer => "Reducer or enlargement to another bore",
        }
    }
}

/// Writes a value as indented JSON (the batch command's results report;
/// stored records are written by hand, `records::Out`).
pub fn pretty_json<T: Serialize + ?Sized>(value: &T) -> String {
    serde_json::to_string_pretty(value).unwrap_or_default()
}

fn is_false(b: &bool) -> bool {
    !*b
}

/// The fluid of a line.
///
/// Written with a `kind` tag; read through [`FluidFields`], one flat
/// record, because serde's reader for a tagged enum buffers the whole
/// object and was the largest single function in the page's module
/// (15 KB). The fields each kind refuses are refused as before.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "lowercase", try_from = "FluidFields")]
pub enum FluidFile {
    /// Liquid water.
    Water {
        /// Temperature.
        temperature: String,
        /// Absolute pressure; absent means 101.325 kPa.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        pressure: Option<String>,
    },
    /// Glycol in water.
    Glycol {
        /// Which glycol.
        glycol: GlycolName,
        /// Strength, percent by mass.
        percent: String,
        /// Temperature.
        temperature: String,
    },
    /// Properties entered directly.
    Custom {
        /// Density, kg/m³.
        density_kg_m3: String,
        /// Dynamic viscosity, mPa·s (cP). Give this or the kinematic one.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        viscosity_mpa_s: Option<String>,
        /// Kinematic viscosity, mm²/s (cSt).
        #[serde(default, skip_serializing_if = "Option::is_none")]
        kinematic_viscosity_mm2_s: Option<String>,
    },
    /// A gas (version 4).
    Gas {
        /// `air`, `nitrogen`, `carbon-dioxide`, `natural-gas` or `custom`.
        gas: String,
        /// Temperature.
        temperature: String,
        /// Pressure at the line's inlet (absolute, or typed in barg/psig).
        pressure: String,
        /// Natural gas: relative density to air.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        relative_density: Option<String>,
        /// Custom gas: molar mass, g/mol.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        molar_mass: Option<String>,
        /// Custom gas: dynamic viscosity, mPa·s.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        viscosity_mpa_s: Option<String>,
        /// Custom gas: compressibility factor Z (1 when absent).
        #[serde(default, skip_serializing_if = "Option::is_none")]
        z: Option<String>,
    },
    /// Dry steam (version 4).
    Steam {
        /// Pressure at the line's inlet (absolute, or typed in barg/psig).
        pressure: String,
        /// Temperature if superheated; absent or blank: dry saturated.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        temperature: Option<String>,
    },
}

/// Every field any kind of fluid has, as read from a file, and the first
/// field that no kind has.
#[derive(Default)]
pub struct FluidFields {
    pub(super) kind: Option<String>,
    pub(super) temperature: Option<String>,
    pub(super) pressure: Option<String>,
    pub(super) glycol: Option<GlycolName>,
    pub(super) percent: Option<String>,
    pub(super) density_kg_m3: Option<String>,
    pub(super) viscosity_mpa_s: Option<String>,
    pub(super) kinematic_viscosity_mm2_s: Option<String>,
    pub(super) gas: Option<String>,
    pub(super) relative_density: Option<String>,
    pub(super) molar_mass: Option<String>,
    pub(super) z: Option<String>,
    pub(super) unknown: Option<String>,
}

impl<'de> Deserialize<'de> for FluidFields {
    fn deserialize<D: serde::Deserializer<'de>>(d: D) -> Result<FluidFields, D::Error> {
        struct Fields;
        impl<'de> serde::de::Visitor<'de> for Fields {
            type Value = FluidFields;
            fn expecting(&self, f: &mut std::fmt::Formatter) -> std::fmt::Result {
                f.write_str("a fluid")
            }
            fn visit_map<A: serde::de::MapAccess<'de>>(self, mut map: A) -> Result<FluidFields, A::Error> {
                use serde::de::Error;
                let mut f = FluidFields::default();
                while let Some(key) = map.next_key::<String>()? {
                    let slot = match key.as_str() {
                        "glycol" => {
                            if f.glycol.is_some() {
                                return Err(A::Error::duplicate_field("glycol"));
                            }
                            f.glycol = Some(map.next_value()?);
                            continue;
                        }
                        "kind" => &mut f.kind,
                        "temperature" => &mut f.temperature,
                        "pressure" => &mut f.pressure,
                        "percent" => &mut f.percent,
                        "density_kg_m3" => &mut f.density_kg_m3,
                        "viscosity_mpa_s" => &mut f.viscosity_mpa_s,
                        "kinematic_viscosity_mm2_s" => &mut f.kinematic_viscosity_mm2_s,
                        "gas" => &mut f.gas,
                        "relative_density" => &mut f.relative_density,
                        "molar_mass" => &mut f.molar_mass,
                        "z" => &mut f.z,
                        _ => {
                            map.next_value::<serde::de::IgnoredAny>()?;
                            f.unknown.get_or_insert(key);
                            continue;
                        }
                    };
                    if slot.is_some() {
                        // serde's words name the field; the key is one of ours.
                        return Err(A::Error::custom(format_args!("duplicate field `{key}`")));
                    }
                    *slot = map.next_value()?;
                }
                Ok(f)
            }
        }
        d.deserialize_map(Fields)
    }
}

impl TryFrom<FluidFields> for FluidFile {
    type Error = String;

    fn try_from(f: FluidFields) -> Result<FluidFile, String> {
        use serde::de::{value::Error as E, Error};
        const KINDS: &[&str] = &["water", "glycol", "custom", "gas", "steam"];
        let kind = f.kind.ok_or_else(|| E::missing_field("kind").to_string())?;
        // The fields this kind may have; any other given is refused with
        // serde's own words for an unknown field.
        let allowed: &'static [&'static str] = match kind.as_str() {
            "water" => &["temperature", "pressure"],
            "glycol" => &["glycol", "percent", "temperature"],
            "custom" => &["density_kg_m3", "viscosity_mpa_s", "kinematic_viscosity_mm2_s"],
            "gas" => &["gas", "temperature", "pressure", "relative_density", "molar_mass", "viscosity_mpa_s", "z"],
            "steam" => &["pressure", "temperature"],
            other => return Err(E::unknown_variant(other, KINDS).to_string()),
        };
        let given = [
            ("temperature", f.temperature.is_some()),
            ("pressure", f.pressure.is_some()),
            ("glycol", f.glycol.is_some()),
            ("percent", f.percent.is_some()),
            ("density_kg_m3", f.density_kg_m3.is_some()),
            ("viscosity_mpa_s", f.viscosity_mpa_s.is_some()),
            ("kinematic_viscosity_mm2_s", f.kinematic_viscosity_mm2_s.is_some()),
            ("gas", f.gas.is_some()),
            ("relative_density", f.relative_density.is_some()),
            ("molar_mass", f.molar_mass.is_some()),
            ("z", f.z.is_some()),
        ];
        let stray = given.iter().find(|(name, there)| *there && !allowed.contains(name)).map(|(name, _)| *name);
        if let Some(name) = f.unknown.as_deref().or(stray) {
            return Err(E::unknown_field(name, allowed).to_string());
        }
        fn need<T>(v: Option<T>, name: &'static str) -> Result<T, String> {
            v.ok_or_else(|| E::missing_field(name).to_string())
        }
        Ok(match kind.as_str() {
            "water" => FluidFile::Water { temperature: need(f.temperature, "temperature")?, pressure: f.pressure },
            "glycol" => FluidFile::Glycol {
                glycol: need(f.glycol, "glycol")?,
                percent: need(f.percent, "percent")?,
                temperature: need(f.temperature, "temperature")?,
            },
            "custom" => FluidFile::Custom {
                density_kg_m3: need(f.density_kg_m3, "density_kg_m3")?,
                viscosity_mpa_s: f.viscosity_mpa_s,
                kinematic_viscosity_mm2_s: f.kinematic_viscosity_mm2_s,
            },
            "gas" => FluidFile::Gas {
                gas: need(f.gas, "gas")?,
                temperature: need(f.temperature, "temperature")?,
                pressure: need(f.pressure, "pressure")?,
                relative_density: f.relative_density,
                molar_mass: f.molar_mass,
                viscosity_mpa_s: f.viscosity_mpa_s,
                z: f.z,
            },
            _ => FluidFile::Steam { pressure: need(f.pressure, "pressure")?, temperature: f.temperature },
        })
    }
}

impl FluidFile {
    /// Whether this fluid needs format version 4.
    pub fn is_compressible(&self) -> bool {
        matches!(self, FluidFile::Gas { .. } | FluidFile::Steam { .. })
    }
}

/// Which glycol: the core's own list ([`Glycol`]) is the file's too.
pub type GlycolName = Glycol;

/// The pipe of a line.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "lowercase", deny_unknown_fields)]
pub enum PipeFile {
    /// A series id from the catalogue, e.g. "steel-sch40".
    Series(String),
    /// A custom inside diameter with the material it is made of.
    Bore {
        /// Inside diameter.
        diameter: String,
        /// Material id: "carbon-steel", "stainless", "copper", "pvc", "pe".
        material: String,
    },
}

/// One kind of fitting and how many.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct FittingCount {
    /// Fitting id, e.g. "elbow90-welded".
    pub fitting: String,
    /// How many, as typed. Written as a JSON number when it is a valid
    /// count and as a string otherwise, so a slip ("2.5") is kept and
    /// reported beside the count, never turned into 0.
    #[serde(with = "count_text")]
    pub count: String,
}

impl FittingCount {
    /// A row of `n` fittings of one kind.
    pub fn new(fitting: &str, n: u32) -> FittingCount {
        FittingCount { fitting: fitting.to_owned(), count: n.to_string() }
    }
}

/// A count kept as text: a JSON number or string in, a number out when it
/// reads as a count.
mod count_text {
    use serde::{de, Deserializer, Serializer};

    use crate::sheet::number::parse_count;

    pub fn serialize<S: Serializer>(text: &str, s: S) -> Result<S::Ok, S::Error> {
        match parse_count(text) {
            Ok(n) => s.serialize_u32(n),
            Err(_) => s.serialize_str(text),
        }
    }

    struct Text;

    impl de::Visitor<'_> for Text {
        type Value = String;
        fn expecting(&self, f: &mut std::fmt::Formatter) -> std::fmt::Result {
            f.write_str("a count (a number or its text)")
        }
        fn visit_u64<E>(self, v: u64) -> Result<String, E> {
            Ok(v.to_string())
        }
        fn visit_i64<E>(self, v: i64) -> Result<String, E> {
            Ok(v.to_string())
        }
        fn visit_f64<E>(self, v: f64) -> Result<String, E> {
            Ok(v.to_string())
        }
        fn visit_str<E>(self, v: &str) -> Result<String, E> {
            Ok(v.to_owned())
        }
    }

    pub fn deserialize<'de, D: Deserializer<'de>>(d: D) -> Result<String, D::Error> {
        d.deserialize_any(Text)
    }
}

/// Friction method name (the core's `Method` also carries Hazen–Williams C).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(rename_all = "kebab-case")]
pub enum MethodName {
    /// Darcy–Weisbach (default).
    #[default]
    DarcyWeisbach,
    /// Hazen–Williams.
    HazenWilliams,
}

impl MethodName {
    /// Every method, in listing order.
    pub const ALL: [MethodName; 2] = [MethodName::DarcyWeisbach, MethodName::HazenWilliams];

    /// Its stable id (the file's `method`).
    pub fn id(self) -> &'static str {
        match self {
            MethodName::DarcyWeisbach => "darcy-weisbach",
            MethodName::HazenWilliams => "hazen-williams",
        }
    }

    /// How a list shows it.
    pub fn label(self) -> &'static str {
        match self {
            MethodName::DarcyWeisbach => "Darcy–Weisbach with Colebrook (any fluid)",
            MethodName::HazenWilliams => "Hazen–Williams (water near room temperature only)",
        }
    }

    /// The method of an id.
    pub fn from_id(id: &str) -> Option<MethodName> {
        MethodName::ALL.into_iter().find(|m| m.id() == id)
    }
}

/// Design limits as stored; each may be absent.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(deny_unknown_fields)]
pub struct LimitsFile {
    /// Largest friction drop per length.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub max_drop_per_length: Option<String>,
    /// Largest total drop.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub max_total_drop: Option<String>,
    /// Largest velocity.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub max_velocity: Option<String>,
    /// Smallest velocity.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub min_velocity: Option<String>,
    /// A velocity-by-size table, by id (`hydraulics::velocity::RULES`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub velocity_by_size: Option<String>,
    /// Largest total drop as a percentage of the inlet's absolute
    /// pressure (gas and steam lines).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub max_drop_percent: Option<String>,
}

/// A bad value in one field.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct FieldError {
    /// The field ("flow", "limits.max_velocity" in the file).
    pub field: Field,
    /// What is wrong and what is expected.
    pub message: String,
}

impl std::fmt::Display for FieldError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "{}: {}", self.field, self.message)
    }
}

/// Why a sheet file cannot be read.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum SheetError {
    /// Not JSON, or not of this format's shape.
    Syntax(String),
    /// Not a Headroom sheet.
    NotASheet(String),
    /// A version this build cannot read.
    Version(u32),
    /// A bad unit choice at sheet level.
    Units(FieldError),
    /// Past one of the reader's limits.
    Limit(Limit),
}

/// Most lines a sheet may have. Far above a real worksheet (tens to a few
/// hundred lines); a sheet of this size takes about a second to size on a
/// tablet, so a hostile link cannot freeze the page for minutes.
pub const MAX_LINES: usize = 2000;
/// Most fitting rows on one line (each row is a kind and a count).
pub const MAX_FITTING_ROWS: usize = 40;
/// Longest text in any one field, characters.
pub const MAX_TEXT_CHARS: usize = 200;

/// Which reader limit a sheet passed.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Limit {
    /// Too many lines (how many it has).
    Lines(usize),
    /// Too many fitting rows on a line.
    FittingRows {
        /// The line, from 1.
        line: usize,
        /// How many rows it has.
        rows: usize,
    },
    /// A field's text is too long.
    Text {
        /// The line, from 1, or `None` at sheet level.
        line: Option<usize>,
        /// The field.
        field: String,
        /// How long it is, characters.
        chars: usize,
    },
}

impl std::fmt::Display for Limit {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Limit::Lines(n) => write!(f, "it has {n} lines; a worksheet may have at most {MAX_LINES}"),
            Limit::FittingRows { line, rows } => {
                write!(f, "line {line} has {rows} fitting or component rows; a line may have at most {MAX_FITTING_ROWS} of each")
            }
            Limit::Text { line: Some(line), field, chars } => {
                write!(f, "line {line}'s {field} is {chars} characters long; a field may hold at most {MAX_TEXT_CHARS}")
            }
            Limit::Text { line: None, field, chars } => {
                write!(f, "the {field} is {chars} characters long; a field may hold at most {MAX_TEXT_CHARS}")
            }
        }
    }
}

impl std::fmt::Display for SheetError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            SheetError::Syntax(e) => write!(f, "not a readable sheet file: {e}"),
            SheetError::NotASheet(found) => write!(f, "format is '{found}', expected '{FORMAT}'"),
            SheetError::Version(v) => write!(
                f,
                "sheet format version {v} is newer than this Headroom reads (up to {VERSION}); update Headroom"
            ),
            SheetError::Units(e) => write!(f, "{e}"),
            SheetError::Limit(l) => write!(f, "too large to open safely: {l}"),
        }
    }
}

impl std::error::Error for SheetError {}

/// Largest sheet file accepted, bytes: far above any real worksheet, low
/// enough that a hostile file cannot exhaust a tablet's memory.
pub const MAX_FILE_BYTES: usize = 4 * 1024 * 1024;

impl SheetFile {
    /// Reads a sheet from JSON text.
    ///
    /// # Errors
    /// A [`SheetError`]; never panics, whatever the input.
    pub fn from_json(text: &str) -> Result<SheetFile, SheetError> {
        if text.len() > MAX_FILE_BYTES {
            return Err(SheetError::Syntax(format!("file is larger than {MAX_FILE_BYTES} bytes")));
        }
        // Look at format and version before the full shape, so a newer file
        // is reported as newer rather than as malformed.
        let tree = json::parse(text).map_err(|e| SheetError::Syntax(e.to_string()))?;
        let (format, version) = records::head(&tree).map_err(|e| SheetError::Syntax(e.to_string()))?;
        match format.as_deref() {
            Some(FORMAT) => {}
            other => return Err(SheetError::NotASheet(other.unwrap_or("missing").to_owned())),
        }
        match version {
            Some(v) if v > VERSION => return Err(SheetError::Version(v)),
            Some(v) if v >= 1 => {}
            _ => return Err(SheetError::Syntax("version must be a whole number from 1".to_owned())),
        }
        let sheet = SheetFile::read(&tree).map_err(|e| SheetError::Syntax(e.to_string()))?;
        sheet.units.resolve().map_err(SheetError::Units)?;
        sheet.check_limits()?;
        Ok(sheet)
    }

    /// Refuses a sheet past the reader's limits ([`MAX_LINES`],
    /// [`MAX_FITTING_ROWS`], [`MAX_TEXT_CHARS`]): a few kilobytes of link
    /// can inflate to a sheet that would take minutes to size.
    ///
    /// # Errors
    /// [`SheetError::Limit`] naming the first limit passed.
    pub fn check_limits(&self) -> Result<(), SheetError> {
        if self.basis.freeze_margin() > MAX_FREEZE_MARGIN_K {
            return Err(SheetError::Syntax(format!(
                "basis.freeze_margin_k must be 0 to {MAX_FREEZE_MARGIN_K} K, not {}",
                self.basis.freeze_margin()
            )));
        }
        if self.lines.len() > MAX_LINES {
            return Err(SheetError::Limit(Limit::Lines(self.lines.len())));
        }
        let long = |field: &str, text: &str, line: Option<usize>| {
            let n = text.chars().count();
            (n > MAX_TEXT_CHARS).then(|| SheetError::Limit(Limit::Text { line, field: field.to_owned(), chars: n }))
        };
        for (field, text) in [("project", &self.project), ("date", &self.date)] {
            if let Some(e) = long(field, text, None) {
                return Err(e);
            }
        }
        for (i, l) in self.lines.iter().enumerate() {
            if l.fittings.len() > MAX_FITTING_ROWS {
                return Err(SheetError::Limit(Limit::FittingRows { line: i + 1, rows: l.fittings.len() }));
            }
            if l.components.len() > MAX_FITTING_ROWS {
                return Err(SheetError::Limit(Limit::FittingRows { line: i + 1, rows: l.components.len() }));
            }
            let mut err = None;
            l.each_text(&mut |field, text| {
                if err.is_none() {
                    err = long(field, text, Some(i + 1));
                }
            });
            if let Some(e) = err {
                return Err(e);
            }
        }
        Ok(())
    }

    /// The oldest format version that holds everything this sheet uses.
    pub fn required_version(&self) -> u32 {
        let standard_unit = self
            .units
            .flow
            .as_deref()
            .and_then(|t| super::units::find(super::units::Dimension::Flow, t))
            .is_some_and(|u| u.standard().is_some());
        let v4 = standard_unit
            || self.lines.iter().any(|l| l.fluid.is_compressible() || l.limits.max_drop_percent.is_some());
        let v3 = self.basis.demand != Basis::default().demand
            || !self.system.is_empty()
            || self.lines.iter().any(|l| l.fixtures.is_some());
        let v2 = !self.basis.is_default()
            || self.units.power.is_some()
            || self.units.temperature_difference.is_some()
            || self.lines.iter().any(|l| {
                !l.components.is_empty()
                    || l.smallest_size.is_some()
                    || l.limits.velocity_by_size.is_some()
                    || l.load.is_some()
                    || l.fed_from.is_some()
                    || l.diversity.is_some()
            });
        if v4 {
            4
        } else if v3 {
            3
        } else if v2 {
            2
        } else {
            1
        }
    }

    /// The sheet with `version` set to [`SheetFile::required_version`].
    pub fn with_required_version(mut self) -> SheetFile {
        self.version = self.required_version();
        self
    }

    /// Writes the sheet as pretty JSON (written by hand, as serde_json's
    /// `to_string_pretty` writes it).
    pub fn to_json(&self) -> String {
        let mut o = records::Out::new(true);
        self.write(&mut o);
        o.done()
    }

    /// Writes the sheet as JSON without spaces (links and storage), as
    /// serde_json's `to_string` writes it.
    pub fn to_compact_json(&self) -> String {
        let mut o = records::Out::new(false);
        self.write(&mut o);
        o.done()
    }

    /// Resolved units (defaults where the file chose none), with the
    /// sheet's design basis.
    pub fn units(&self) -> Units {
        let mut u = self.units.resolve().unwrap_or_else(|_| Units::defaults(self.units.system));
        u.basis = self.basis;
        u
    }
}

impl LineFile {
    /// Calls `visit` with the name and text of every text field of the line.
    pub fn each_text(&self, visit: &mut dyn FnMut(&str, &str)) {
        visit("name", &self.name);
        visit("flow", &self.flow);
        if let Some(load) = &self.load {
            visit("load.power", &load.power);
            visit("load.delta_t", &load.delta_t);
        }
        match &self.fluid {
            FluidFile::Water { temperature, pressure } => {
                visit("fluid.temperature", temperature);
                visit("fluid.pressure", pressure.as_deref().unwrap_or_default());
            }
            FluidFile::Glycol { percent, temperature, .. } => {
                visit("fluid.percent", percent);
                visit("fluid.temperature", temperature);
            }
            FluidFile::Custom { density_kg_m3, viscosity_mpa_s, kinematic_viscosity_mm2_s } => {
                visit("fluid.density_kg_m3", density_kg_m3);
                visit("fluid.viscosity_mpa_s", viscosity_mpa_s.as_deref().unwrap_or_default());
                visit("fluid.kinematic_viscosity_mm2_s", kinematic_viscosity_mm2_s.as_deref().unwrap_or_default());
            }
            FluidFile::Gas { gas, temperature, pressure, relative_density, molar_mass, viscosity_mpa_s, z } => {
                visit("fluid.gas", gas);
                visit("fluid.temperature", temperature);
                visit("fluid.pressure", pressure);
                visit("fluid.relative_density", relative_density.as_deref().unwrap_or_default());
                visit("fluid.molar_mass", molar_mass.as_deref().unwrap_or_default());
                visit("fluid.viscosity_mpa_s", viscosity_mpa_s.as_deref().unwrap_or_default());
                visit("fluid.z", z.as_deref().unwrap_or_default());
            }
            FluidFile::Steam { pressure, temperature } => {
                visit("fluid.pressure", pressure);
                visit("fluid.temperature", temperature.as_deref().unwrap_or_default());
            }
        }
        match &self.pipe {
            PipeFile::Series(id) => visit("pipe.series", id),
            PipeFile::Bore { diameter, material } => {
                visit("pipe.diameter", diameter);
                visit("pipe.material", material);
            }
        }
        visit("length", &self.length);
        for fc in &self.fittings {
            visit("fittings.fitting", &fc.fitting);
            visit("fittings.count", &fc.count);
        }
        for c in &self.components {
            visit("components.name", &c.name);
            visit("components.value", &c.value);
            visit("components.drop", &c.drop);
            visit("components.at_flow", &c.at_flow);
            visit("components.to_bore", &c.to_bore);
            visit("components.angle", &c.angle);
        }
        let optional = [
            ("roughness", &self.roughness),
            ("extra_k", &self.extra_k),
            ("equivalent_length", &self.equivalent_length),
            ("rise", &self.rise),
            ("hazen_williams_c", &self.hazen_williams_c),
            ("check_size", &self.check_size),
            ("smallest_size", &self.smallest_size),
            ("fed_from", &self.fed_from),
            ("diversity", &self.diversity),
            ("limits.max_drop_per_length", &self.limits.max_drop_per_length),
            ("limits.max_total_drop", &self.limits.max_total_drop),
            ("limits.max_velocity", &self.limits.max_velocity),
            ("limits.velocity_by_size", &self.limits.velocity_by_size),
            ("limits.max_drop_percent", &self.limits.max_drop_percent),
            ("limits.min_velocity", &self.limits.min_velocity),
        ];
        for (field, text) in optional {
            visit(field, text.as_deref().unwrap_or_default());
        }
    }
}
