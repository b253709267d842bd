//! The sheet file's records read by hand from the parsed tree
//! ([`super::json::parse`]) and written by hand (`Out`), for the page
//! and the batch command alike.
//!
//! serde's derived readers held, per field of every record, its name
//! match, its duplicate check and its value read, all inlined into one
//! function of 51 KB in the page's module. Here one non-generic loop
//! (`record`) walks an object's members for every record, and a record
//! says only which of its names a member is and how to read its value. The
//! refusals are serde's own, in serde's words and in the same order (a
//! member's key before its value, the members in the file's order, then
//! the first missing field in the record's order), because the derived
//! readers stay as the reference: `tests/json_reader.rs` reads every
//! example sheet, every one damaged byte by byte and every one with each
//! member changed, both ways, and expects the same sheet or the same
//! refusal. Written, a record comes out byte for byte as serde_json writes
//! it with the derived writer (`tests/json_reader.rs`,
//! `tests/sheet_behaviour.rs`).
//!
//! Every name list below is in the order the record declares its fields
//! (serde names them in that order in "expected one of …").

use crate::hydraulics::digits::Short;
use serde::de::Error as _;

use super::file::{
    Basis, Circuit, ComponentFile, ComponentKind, FittingCount, FixtureCountFile, FixturesFile, FluidFields, FluidFile,
    LimitsFile, LineFile, LoadFile, MethodName, PipeFile, PumpPointFile, ReturnRun, SheetFile, SuctionFile, System,
    SystemFile, UnitChoice,
};
use super::json::{Error, Node};
use super::library::{Entry, Trashed};
use crate::hydraulics::demand::{Method, Supply};
use crate::hydraulics::fluid::Glycol;

type Result<T> = std::result::Result<T, Error>;

/// What a value is, in serde's words for a refusal: serde's `Unexpected`
/// as it displays, word for word, written here because serde's own
/// formats a float with `core`'s float formatting, which the page's module
/// then holds (a float goes through `digits::Short`, with ".0" added to a
/// whole number as serde adds it).
struct What<'a>(&'a Node);

impl std::fmt::Display for What<'_> {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self.0 {
            Node::Null => f.write_str("unit value"),
            Node::Bool(b) => write!(f, "boolean `{b}`"),
            Node::Unsigned(n) => write!(f, "integer `{n}`"),
            Node::Signed(n) => write!(f, "integer `{n}`"),
            Node::Float(x) => {
                let shown = Short(*x).to_string();
                let point = if x.is_finite() && !shown.contains('.') { ".0" } else { "" };
                write!(f, "floating point `{shown}{point}`")
            }
            Node::Text(s) => write!(f, "string {s:?}"),
            Node::List(_) => f.write_str("sequence"),
            Node::Object(_) => f.write_str("map"),
        }
    }
}

/// serde's `invalid_type` refusal.
#[cold]
#[inline(never)]
fn refused(node: &Node, expected: &str) -> Error {
    Error::custom(format_args!("invalid type: {}, expected {expected}", What(node)))
}

/// Reads an object's members in order. A key must be one of `names` (with
/// `strict`; otherwise an unknown member is passed over) and come once;
/// `each` reads the value of the `i`-th name. Returns the names given, a
/// bit each.
fn record(
    node: &Node,
    expected: &str,
    names: &'static [&'static str],
    strict: bool,
    each: &mut dyn FnMut(usize, &Node) -> Result<()>,
) -> Result<u32> {
    let Node::Object(members) = node else { return Err(refused(node, expected)) };
    let mut seen = 0u32;
    for (key, value) in members {
        match names.iter().position(|n| *n == key.as_str()) {
            Some(i) => {
                if seen & (1 << i) != 0 {
                    return Err(Error::duplicate_field(names[i]));
                }
                seen |= 1 << i;
                each(i, value).map_err(|e| e.under_key(key))?;
            }
            None if strict => return Err(Error::unknown_field(key, names)),
            None => {}
        }
    }
    Ok(seen)
}

/// Refuses a record that lacks one of the fields it must have (`needed`,
/// a bit each), naming the first in the record's order.
fn needs(seen: u32, needed: u32, names: &'static [&'static str]) -> Result<()> {
    match (0..names.len()).find(|&i| needed & !seen & (1 << i) != 0) {
        Some(i) => Err(Error::missing_field(names[i])),
        None => Ok(()),
    }
}

fn text(node: &Node) -> Result<String> {
    match node {
        Node::Text(s) => Ok(s.clone()),
        _ => Err(refused(node, "a string")),
    }
}

/// `null` is no value, as serde reads an `Option`.
fn maybe<T>(node: &Node, read: fn(&Node) -> Result<T>) -> Result<Option<T>> {
    match node {
        Node::Null => Ok(None),
        _ => read(node).map(Some),
    }
}

fn flag(node: &Node) -> Result<bool> {
    match node {
        Node::Bool(b) => Ok(*b),
        _ => Err(refused(node, "a boolean")),
    }
}

/// A whole number from 0 to `max`; `kind` names the type as serde does
/// ("u32").
fn whole(node: &Node, max: u64, kind: &str) -> Result<u64> {
    match node {
        Node::Unsigned(n) if *n <= max => Ok(*n),
        Node::Unsigned(_) | Node::Signed(_) => {
            Err(Error::custom(format_args!("invalid value: {}, expected {kind}", What(node))))
        }
        _ => Err(refused(node, kind)),
    }
}

fn list<T>(node: &Node, read: fn(&Node) -> Result<T>) -> Result<Vec<T>> {
    let Node::List(items) = node else { return Err(refused(node, "a sequence")) };
    items.iter().enumerate().map(|(i, item)| read(item).map_err(|e| e.under_index(i))).collect()
}

/// An enum's variant by its id: a string, or an object of one key naming
/// it (with `null` for the content of a variant that has none), as the
/// serde reader took it. Returns the variant's place in `ids` and the
/// object's content, if it was one.
fn variant<'a>(node: &'a Node, ids: &'static [&'static str]) -> Result<(usize, Option<&'a Node>)> {
    let (id, content) = match node {
        Node::Text(s) => (s.as_str(), None),
        Node::Object(members) if members.len() == 1 => (members[0].0.as_str(), Some(&members[0].1)),
        _ => return Err(refused(node, "a string or an object with one key")),
    };
    match ids.iter().position(|v| *v == id) {
        Some(i) => Ok((i, content)),
        None => {
            let e = Error::unknown_variant(id, ids);
            Err(if content.is_some() { e.under_key(id) } else { e })
        }
    }
}

/// A variant that carries nothing.
fn plain<T: Copy>(node: &Node, ids: &'static [&'static str], all: &[T]) -> Result<T> {
    match variant(node, ids)? {
        (i, None | Some(Node::Null)) => Ok(all[i]),
        (i, Some(content)) => Err(refused(content, "unit variant").under_key(ids[i])),
    }
}

fn circuit(node: &Node) -> Result<Circuit> {
    plain(node, &["open", "closed"], &[Circuit::Open, Circuit::Closed])
}

fn return_run(node: &Node) -> Result<ReturnRun> {
    plain(node, &["mirrored", "entered"], &[ReturnRun::Mirrored, ReturnRun::Entered])
}

fn demand(node: &Node) -> Result<Method> {
    plain(node, &["hunter-tanks", "hunter-valves", "en806-3"], &Method::ALL)
}

fn system(node: &Node) -> Result<System> {
    plain(node, &["si", "us"], &[System::Si, System::Us])
}

fn supply(node: &Node) -> Result<Supply> {
    plain(node, &["total", "cold", "hot"], &[Supply::Total, Supply::Cold, Supply::Hot])
}

fn glycol(node: &Node) -> Result<Glycol> {
    plain(node, &["ethylene", "propylene"], &[Glycol::Ethylene, Glycol::Propylene])
}

fn component_kind(node: &Node) -> Result<ComponentKind> {
    plain(node, &["kv", "cv", "rated", "butterfly", "reducer"], &ComponentKind::ALL)
}

fn method(node: &Node) -> Result<MethodName> {
    plain(node, &["darcy-weisbach", "hazen-williams"], &MethodName::ALL)
}

/// A count: a JSON number or its text, kept as text.
fn count(node: &Node) -> Result<String> {
    match node {
        Node::Unsigned(n) => Ok(n.to_string()),
        Node::Signed(n) => Ok(n.to_string()),
        Node::Float(x) => Ok(Short(*x).to_string()),
        Node::Text(s) => Ok(s.clone()),
        _ => Err(refused(node, "a count (a number or its text)")),
    }
}

/// A sheet's `format` and `version`, read before the rest so that a newer
/// file is reported as newer rather than as malformed; any other member
/// is passed over.
pub(crate) fn head(node: &Node) -> Result<(Option<String>, Option<u32>)> {
    let (mut format, mut version) = (None, None);
    record(node, "struct Head", &["format", "version"], false, &mut |i, v| {
        match i {
            0 => format = maybe(v, text)?,
            _ => version = maybe(v, |v| whole(v, u32::MAX.into(), "u32"))?.map(|n| n as u32),
        }
        Ok(())
    })?;
    Ok((format, version))
}

impl SheetFile {
    /// Reads a sheet's shape from its parsed tree, refusing as serde's derived
    /// reader would ([`SheetFile::from_json`] checks the rest).
    ///
    /// # Errors
    /// [`Error`] naming the first value of the wrong shape and where it is.
    pub fn read(node: &Node) -> Result<SheetFile> {
        const NAMES: &[&str] = &["format", "version", "project", "date", "units", "basis", "system", "lines"];
        let mut s = SheetFile {
            format: String::new(),
            version: 0,
            project: String::new(),
            date: String::new(),
            units: UnitChoice::default(),
            basis: Basis::default(),
            system: SystemFile::default(),
            lines: Vec::new(),
        };
        let seen = record(node, "struct SheetFile", NAMES, true, &mut |i, v| {
            match i {
                0 => s.format = text(v)?,
                1 => s.version = whole(v, u32::MAX.into(), "u32")? as u32,
                2 => s.project = text(v)?,
                3 => s.date = text(v)?,
                4 => s.units = UnitChoice::read(v)?,
                5 => s.basis = Basis::read(v)?,
                6 => s.system = SystemFile::read(v)?,
                _ => s.lines = list(v, LineFile::read)?,
            }
            Ok(())
        })?;
        needs(seen, 0b1000_0011, NAMES)?;
        Ok(s)
    }
}

impl UnitChoice {
    fn read(node: &Node) -> Result<UnitChoice> {
        const NAMES: &[&str] = &[
            "system",
            "flow",
            "pressure",
            "drop_per_length",
            "length",
            "velocity",
            "temperature",
            "roughness",
            "power",
            "temperature_difference",
        ];
        let mut u = UnitChoice::default();
        record(node, "struct UnitChoice", NAMES, true, &mut |i, v| {
            if i == 0 {
                u.system = system(v)?;
                return Ok(());
            }
            let slot = match i {
                1 => &mut u.flow,
                2 => &mut u.pressure,
                3 => &mut u.drop_per_length,
                4 => &mut u.length,
                5 => &mut u.velocity,
                6 => &mut u.temperature,
                7 => &mut u.roughness,
                8 => &mut u.power,
                _ => &mut u.temperature_difference,
            };
            *slot = maybe(v, text)?;
            Ok(())
        })?;
        Ok(u)
    }
}

impl Basis {
    fn read(node: &Node) -> Result<Basis> {
        const NAMES: &[&str] = &["circuit", "freeze_margin_k", "every_size", "return_run", "demand"];
        let mut b = Basis::default();
        record(node, "struct Basis", NAMES, true, &mut |i, v| {
            match i {
                0 => b.circuit = circuit(v)?,
                1 => b.freeze_margin_k = maybe(v, |v| whole(v, u8::MAX.into(), "u8"))?.map(|n| n as u8),
                2 => b.every_size = flag(v)?,
                3 => b.return_run = return_run(v)?,
                _ => b.demand = demand(v)?,
            }
            Ok(())
        })?;
        Ok(b)
    }
}

impl SystemFile {
    fn read(node: &Node) -> Result<SystemFile> {
        const NAMES: &[&str] = &["source_pressure", "outlet_minimum", "pump", "suction"];
        let mut s = SystemFile::default();
        record(node, "struct SystemFile", NAMES, true, &mut |i, v| {
            match i {
                0 => s.source_pressure = text(v)?,
                1 => s.outlet_minimum = text(v)?,
                2 => s.pump = list(v, PumpPointFile::read)?,
                _ => s.suction = SuctionFile::read(v)?,
            }
            Ok(())
        })?;
        Ok(s)
    }
}

/// A record whose every field is text that may be left out: reads the
/// `i`-th name's value into `slots[i]`.
fn texts(node: &Node, expected: &str, names: &'static [&'static str], slots: &mut [&mut String]) -> Result<u32> {
    record(node, expected, names, true, &mut |i, v| {
        *slots[i] = text(v)?;
        Ok(())
    })
}

impl PumpPointFile {
    fn read(node: &Node) -> Result<PumpPointFile> {
        let mut p = PumpPointFile::default();
        texts(node, "struct PumpPointFile", &["flow", "head"], &mut [&mut p.flow, &mut p.head])?;
        Ok(p)
    }
}

impl SuctionFile {
    fn read(node: &Node) -> Result<SuctionFile> {
        let mut s = SuctionFile::default();
        texts(
            node,
            "struct SuctionFile",
            &["pressure", "height", "loss"],
            &mut [&mut s.pressure, &mut s.height, &mut s.loss],
        )?;
        Ok(s)
    }
}

impl LoadFile {
    fn read(node: &Node) -> Result<LoadFile> {
        let mut l = LoadFile::default();
        texts(node, "struct LoadFile", &["power", "delta_t"], &mut [&mut l.power, &mut l.delta_t])?;
        Ok(l)
    }
}

impl LineFile {
    fn read(node: &Node) -> Result<LineFile> {
        const NAMES: &[&str] = &[
            "name",
            "flow",
            "load",
            "fed_from",
            "diversity",
            "fixtures",
            "fluid",
            "pipe",
            "roughness",
            "aged",
            "length",
            "fittings",
            "components",
            "extra_k",
            "equivalent_length",
            "rise",
            "method",
            "hazen_williams_c",
            "limits",
            "check_size",
            "smallest_size",
        ];
        let mut l = LineFile {
            name: String::new(),
            flow: String::new(),
            load: None,
            fed_from: None,
            diversity: None,
            fixtures: None,
            fluid: FluidFile::Water { temperature: String::new(), pressure: None },
            pipe: PipeFile::Series(String::new()),
            roughness: None,
            aged: false,
            length: String::new(),
            fittings: Vec::new(),
            components: Vec::new(),
            extra_k: None,
            equivalent_length: None,
            rise: None,
            method: MethodName::default(),
            hazen_williams_c: None,
            limits: LimitsFile::default(),
            check_size: None,
            smallest_size: None,
        };
        let seen = record(node, "struct LineFile", NAMES, true, &mut |i, v| {
            match i {
                0 => l.name = text(v)?,
                1 => l.flow = text(v)?,
                2 => l.load = maybe(v, LoadFile::read)?,
                3 => l.fed_from = maybe(v, text)?,
                4 => l.diversity = maybe(v, text)?,
                5 => l.fixtures = maybe(v, FixturesFile::read)?,
                6 => l.fluid = FluidFile::read(v)?,
                7 => l.pipe = PipeFile::read(v)?,
                8 => l.roughness = maybe(v, text)?,
                9 => l.aged = flag(v)?,
                10 => l.length = text(v)?,
                11 => l.fittings = list(v, FittingCount::read)?,
                12 => l.components = list(v, ComponentFile::read)?,
                13 => l.extra_k = maybe(v, text)?,
                14 => l.equivalent_length = maybe(v, text)?,
                15 => l.rise = maybe(v, text)?,
                16 => l.method = method(v)?,
                17 => l.hazen_williams_c = maybe(v, text)?,
                18 => l.limits = LimitsFile::read(v)?,
                19 => l.check_size = maybe(v, text)?,
                _ => l.smallest_size = maybe(v, text)?,
            }
            Ok(())
        })?;
        needs(seen, 0b1100_0000, NAMES)?;
        Ok(l)
    }
}

impl FixturesFile {
    fn read(node: &Node) -> Result<FixturesFile> {
        let mut f = FixturesFile::default();
        record(node, "struct FixturesFile", &["supply", "items", "continuous"], true, &mut |i, v| {
            match i {
                0 => f.supply = supply(v)?,
                1 => f.items = list(v, FixtureCountFile::read)?,
                _ => f.continuous = text(v)?,
            }
            Ok(())
        })?;
        Ok(f)
    }
}

impl FixtureCountFile {
    fn read(node: &Node) -> Result<FixtureCountFile> {
        const NAMES: &[&str] = &["kind", "count"];
        let mut f = FixtureCountFile::default();
        let seen = texts(node, "struct FixtureCountFile", NAMES, &mut [&mut f.kind, &mut f.count])?;
        needs(seen, 0b1, NAMES)?;
        Ok(f)
    }
}

impl ComponentFile {
    fn read(node: &Node) -> Result<ComponentFile> {
        const NAMES: &[&str] = &["name", "kind", "value", "drop", "at_flow", "to_bore", "angle"];
        let mut c = ComponentFile::default();
        let seen = record(node, "struct ComponentFile", NAMES, true, &mut |i, v| {
            if i == 1 {
                c.kind = component_kind(v)?;
                return Ok(());
            }
            let slot = match i {
                0 => &mut c.name,
                2 => &mut c.value,
                3 => &mut c.drop,
                4 => &mut c.at_flow,
                5 => &mut c.to_bore,
                _ => &mut c.angle,
            };
            *slot = text(v)?;
            Ok(())
        })?;
        needs(seen, 0b10, NAMES)?;
        Ok(c)
    }
}

impl FittingCount {
    fn read(node: &Node) -> Result<FittingCount> {
        const NAMES: &[&str] = &["fitting", "count"];
        let mut f = FittingCount { fitting: String::new(), count: String::new() };
        let seen = record(node, "struct FittingCount", NAMES, true, &mut |i, v| {
            match i {
                0 => f.fitting = text(v)?,
                _ => f.count = count(v)?,
            }
            Ok(())
        })?;
        needs(seen, 0b11, NAMES)?;
        Ok(f)
    }
}

impl LimitsFile {
    fn read(node: &Node) -> Result<LimitsFile> {
        const NAMES: &[&str] = &[
            "max_drop_per_length",
            "max_total_drop",
            "max_velocity",
            "min_velocity",
            "velocity_by_size",
            "max_drop_percent",
        ];
        let mut l = LimitsFile::default();
        record(node, "struct LimitsFile", NAMES, true, &mut |i, v| {
            let slot = match i {
                0 => &mut l.max_drop_per_length,
                1 => &mut l.max_total_drop,
                2 => &mut l.max_velocity,
                3 => &mut l.min_velocity,
                4 => &mut l.velocity_by_size,
                _ => &mut l.max_drop_percent,
            };
            *slot = maybe(v, text)?;
            Ok(())
        })?;
        Ok(l)
    }
}

impl PipeFile {
    fn read(node: &Node) -> Result<PipeFile> {
        const IDS: &[&str] = &["series", "bore"];
        let (i, content) = variant(node, IDS)?;
        let Some(content) = content else {
            // A bare id names a variant but gives it no content.
            let kind = if i == 0 { "newtype variant" } else { "struct variant" };
            return Err(Error::custom(format_args!("invalid type: unit variant, expected {kind}")));
        };
        let pipe = if i == 0 {
            text(content).map(PipeFile::Series)
        } else {
            const NAMES: &[&str] = &["diameter", "material"];
            let (mut diameter, mut material) = (String::new(), String::new());
            texts(content, "struct variant PipeFile::Bore", NAMES, &mut [&mut diameter, &mut material])
                .and_then(|seen| needs(seen, 0b11, NAMES))
                .map(|()| PipeFile::Bore { diameter, material })
        };
        pipe.map_err(|e| e.under_key(IDS[i]))
    }
}

impl FluidFile {
    /// Read as one flat record of every field any kind has, then made the
    /// kind's ([`FluidFile`]'s `TryFrom`, which refuses a field the kind
    /// does not have).
    fn read(node: &Node) -> Result<FluidFile> {
        const NAMES: &[&str] = &[
            "kind",
            "temperature",
            "pressure",
            "glycol",
            "percent",
            "density_kg_m3",
            "viscosity_mpa_s",
            "kinematic_viscosity_mm2_s",
            "gas",
            "relative_density",
            "molar_mass",
            "z",
        ];
        let Node::Object(members) = node else { return Err(refused(node, "a fluid")) };
        let mut f = FluidFields::default();
        for (key, value) in members {
            let Some(i) = NAMES.iter().position(|n| *n == key.as_str()) else {
                f.unknown.get_or_insert_with(|| key.clone());
                continue;
            };
            if i == 3 {
                if f.glycol.is_some() {
                    return Err(Error::duplicate_field("glycol"));
                }
                f.glycol = Some(glycol(value).map_err(|e| e.under_key(key))?);
                continue;
            }
            let slot = match i {
                0 => &mut f.kind,
                1 => &mut f.temperature,
                2 => &mut f.pressure,
                4 => &mut f.percent,
                5 => &mut f.density_kg_m3,
                6 => &mut f.viscosity_mpa_s,
                7 => &mut f.kinematic_viscosity_mm2_s,
                8 => &mut f.gas,
                9 => &mut f.relative_density,
                10 => &mut f.molar_mass,
                _ => &mut f.z,
            };
            // A member given as null leaves its slot empty, as serde's
            // `Option` reads it, so a later one is not a repeat.
            if slot.is_some() {
                return Err(Error::duplicate_field(NAMES[i]));
            }
            *slot = maybe(value, text).map_err(|e| e.under_key(key))?;
        }
        FluidFile::try_from(f).map_err(Error::custom)
    }
}

/// Reads a record from JSON text.
pub(crate) fn from_text<T>(text: &str, read: fn(&Node) -> Result<T>) -> Result<T> {
    read(&super::json::parse(text)?)
}

/// The device's list of stored worksheets.
pub(crate) fn entries(node: &Node) -> Result<Vec<Entry>> {
    list(node, Entry::read)
}

impl Entry {
    fn read(node: &Node) -> Result<Entry> {
        const NAMES: &[&str] = &["id", "name", "updated"];
        let mut e = Entry { id: String::new(), name: String::new(), updated: String::new() };
        let seen = record(node, "struct Entry", NAMES, false, &mut |i, v| {
            *[&mut e.id, &mut e.name, &mut e.updated][i] = text(v)?;
            Ok(())
        })?;
        needs(seen, 0b111, NAMES)?;
        Ok(e)
    }
}

impl Trashed {
    pub(crate) fn read(node: &Node) -> Result<Trashed> {
        const NAMES: &[&str] = &["entry", "deleted", "text"];
        let mut t = Trashed {
            entry: Entry { id: String::new(), name: String::new(), updated: String::new() },
            deleted: String::new(),
            text: String::new(),
        };
        let seen = record(node, "struct Trashed", NAMES, false, &mut |i, v| {
            match i {
                0 => t.entry = Entry::read(v)?,
                1 => t.deleted = text(v)?,
                _ => t.text = text(v)?,
            }
            Ok(())
        })?;
        needs(seen, 0b111, NAMES)?;
        Ok(t)
    }
}

/// A stored sheet's project name, read loosely (any version, any other
/// member passed over) for listing only.
pub(crate) fn project(node: &Node) -> Result<String> {
    let mut project = String::new();
    record(node, "struct Head", &["project"], false, &mut |_, v| {
        project = text(v)?;
        Ok(())
    })?;
    Ok(project)
}

/// JSON written by hand, compact (links and storage) or indented by two
/// spaces (files): byte for byte what serde_json's `to_string` and
/// `to_string_pretty` write for the same record with its derived
/// `Serialize` (`tests/sheet_behaviour.rs` holds it to that).
pub(crate) struct Out {
    s: String,
    pretty: bool,
    depth: usize,
    /// Nothing written yet in the list or object just opened.
    first: bool,
}

impl Out {
    pub(crate) fn new(pretty: bool) -> Out {
        Out { s: String::with_capacity(256), pretty, depth: 0, first: true }
    }

    pub(crate) fn done(self) -> String {
        self.s
    }

    fn open(&mut self, bracket: char) {
        self.s.push(bracket);
        self.depth += 1;
        self.first = true;
    }

    fn close(&mut self, bracket: char) {
        self.depth -= 1;
        if !self.first {
            self.line();
        }
        self.s.push(bracket);
        self.first = false;
    }

    fn line(&mut self) {
        if self.pretty {
            self.s.push('\n');
            for _ in 0..self.depth {
                self.s.push_str("  ");
            }
        }
    }

    /// Before a list's next item.
    fn item(&mut self) {
        if !self.first {
            self.s.push(',');
        }
        self.first = false;
        self.line();
    }

    /// Before an object's next member's value.
    fn key(&mut self, key: &str) {
        self.item();
        self.text(key);
        self.s.push_str(if self.pretty { ": " } else { ":" });
    }

    /// A string, escaped as serde_json escapes it: quote, backslash and
    /// control characters only.
    fn text(&mut self, v: &str) {
        self.s.push('"');
        for c in v.chars() {
            match c {
                '"' => self.s.push_str("\\\""),
                '\\' => self.s.push_str("\\\\"),
                '\n' => self.s.push_str("\\n"),
                '\r' => self.s.push_str("\\r"),
                '\t' => self.s.push_str("\\t"),
                '\u{8}' => self.s.push_str("\\b"),
                '\u{c}' => self.s.push_str("\\f"),
                c if c < ' ' => {
                    const HEX: &[u8; 16] = b"0123456789abcdef";
                    self.s.push_str("\\u00");
                    self.s.push(HEX[c as usize >> 4] as char);
                    self.s.push(HEX[c as usize & 15] as char);
                }
                c => self.s.push(c),
            }
        }
        self.s.push('"');
    }

    fn whole(&mut self, n: u32) {
        self.s.push_str(&n.to_string());
    }

    fn member(&mut self, key: &str, v: &str) {
        self.key(key);
        self.text(v);
    }

    /// A member left out when it is empty (`skip_serializing_if`).
    fn member_if(&mut self, key: &str, v: &str) {
        if !v.is_empty() {
            self.member(key, v);
        }
    }

    /// A member left out when absent.
    fn member_opt(&mut self, key: &str, v: &Option<String>) {
        if let Some(v) = v {
            self.member(key, v);
        }
    }

    fn list<T>(&mut self, key: &str, items: &[T], write: fn(&T, &mut Out)) {
        self.key(key);
        self.open('[');
        for x in items {
            self.item();
            write(x, self);
        }
        self.close(']');
    }
}

impl SheetFile {
    pub(crate) fn write(&self, o: &mut Out) {
        o.open('{');
        o.member("format", &self.format);
        o.key("version");
        o.whole(self.version);
        o.member("project", &self.project);
        o.member("date", &self.date);
        o.key("units");
        self.units.write(o);
        if !self.basis.is_default() {
            o.key("basis");
            self.basis.write(o);
        }
        if !self.system.is_empty() {
            o.key("system");
            self.system.write(o);
        }
        o.list("lines", &self.lines, LineFile::write);
        o.close('}');
    }
}

impl UnitChoice {
    fn write(&self, o: &mut Out) {
        o.open('{');
        o.member("system", if self.system == System::Us { "us" } else { "si" });
        o.member_opt("flow", &self.flow);
        o.member_opt("pressure", &self.pressure);
        o.member_opt("drop_per_length", &self.drop_per_length);
        o.member_opt("length", &self.length);
        o.member_opt("velocity", &self.velocity);
        o.member_opt("temperature", &self.temperature);
        o.member_opt("roughness", &self.roughness);
        o.member_opt("power", &self.power);
        o.member_opt("temperature_difference", &self.temperature_difference);
        o.close('}');
    }
}

impl Basis {
    fn write(&self, o: &mut Out) {
        o.open('{');
        if self.circuit == Circuit::Closed {
            o.member("circuit", "closed");
        }
        if let Some(k) = self.freeze_margin_k {
            o.key("freeze_margin_k");
            o.whole(k.into());
        }
        if self.every_size {
            o.key("every_size");
            o.s.push_str("true");
        }
        if self.return_run == ReturnRun::Entered {
            o.member("return_run", "entered");
        }
        if self.demand != Method::HunterTanks {
            o.member("demand", self.demand.id());
        }
        o.close('}');
    }
}

impl SystemFile {
    fn write(&self, o: &mut Out) {
        o.open('{');
        o.member_if("source_pressure", &self.source_pressure);
        o.member_if("outlet_minimum", &self.outlet_minimum);
        if !self.pump.is_empty() {
            o.list("pump", &self.pump, |p, o| {
                o.open('{');
                o.member("flow", &p.flow);
                o.member("head", &p.head);
                o.close('}');
            });
        }
        if !self.suction.is_empty() {
            o.key("suction");
            o.open('{');
            o.member_if("pressure", &self.suction.pressure);
            o.member_if("height", &self.suction.height);
            o.member_if("loss", &self.suction.loss);
            o.close('}');
        }
        o.close('}');
    }
}

impl LineFile {
    fn write(&self, o: &mut Out) {
        o.open('{');
        o.member("name", &self.name);
        o.member("flow", &self.flow);
        if let Some(load) = &self.load {
            o.key("load");
            o.open('{');
            o.member("power", &load.power);
            o.member("delta_t", &load.delta_t);
            o.close('}');
        }
        o.member_opt("fed_from", &self.fed_from);
        o.member_opt("diversity", &self.diversity);
        if let Some(f) = &self.fixtures {
            o.key("fixtures");
            o.open('{');
            o.member("supply", ["total", "cold", "hot"][f.supply as usize]);
            if !f.items.is_empty() {
                o.list("items", &f.items, |x, o| {
                    o.open('{');
                    o.member("kind", &x.kind);
                    o.member("count", &x.count);
                    o.close('}');
                });
            }
            o.member_if("continuous", &f.continuous);
            o.close('}');
        }
        o.key("fluid");
        self.fluid.write(o);
        o.key("pipe");
        o.open('{');
        match &self.pipe {
            PipeFile::Series(id) => o.member("series", id),
            PipeFile::Bore { diameter, material } => {
                o.key("bore");
                o.open('{');
                o.member("diameter", diameter);
                o.member("material", material);
                o.close('}');
            }
        }
        o.close('}');
        o.member_opt("roughness", &self.roughness);
        if self.aged {
            o.key("aged");
            o.s.push_str("true");
        }
        o.member("length", &self.length);
        if !self.fittings.is_empty() {
            o.list("fittings", &self.fittings, |f, o| {
                o.open('{');
                o.member("fitting", &f.fitting);
                // A valid count as a number, anything else as typed.
                o.key("count");
                match super::number::parse_count(&f.count) {
                    Ok(n) => o.whole(n),
                    Err(_) => o.text(&f.count),
                }
                o.close('}');
            });
        }
        if !self.components.is_empty() {
            o.list("components", &self.components, |c, o| {
                o.open('{');
                o.member("name", &c.name);
                o.member("kind", c.kind.id());
                o.member_if("value", &c.value);
                o.member_if("drop", &c.drop);
                o.member_if("at_flow", &c.at_flow);
                o.member_if("to_bore", &c.to_bore);
                o.member_if("angle", &c.angle);
                o.close('}');
            });
        }
        o.member_opt("extra_k", &self.extra_k);
        o.member_opt("equivalent_length", &self.equivalent_length);
        o.member_opt("rise", &self.rise);
        o.member("method", self.method.id());
        o.member_opt("hazen_williams_c", &self.hazen_williams_c);
        o.key("limits");
        o.open('{');
        let l = &self.limits;
        o.member_opt("max_drop_per_length", &l.max_drop_per_length);
        o.member_opt("max_total_drop", &l.max_total_drop);
        o.member_opt("max_velocity", &l.max_velocity);
        o.member_opt("min_velocity", &l.min_velocity);
        o.member_opt("velocity_by_size", &l.velocity_by_size);
        o.member_opt("max_drop_percent", &l.max_drop_percent);
        o.close('}');
        o.member_opt("check_size", &self.check_size);
        o.member_opt("smallest_size", &self.smallest_size);
        o.close('}');
    }
}

impl FluidFile {
    /// Tagged by `kind`, then the kind's fields in order.
    fn write(&self, o: &mut Out) {
        o.open('{');
        match self {
            FluidFile::Water { temperature, pressure } => {
                o.member("kind", "water");
                o.member("temperature", temperature);
                o.member_opt("pressure", pressure);
            }
            FluidFile::Glycol { glycol, percent, temperature } => {
                o.member("kind", "glycol");
                o.member("glycol", glycol.id());
                o.member("percent", percent);
                o.member("temperature", temperature);
            }
            FluidFile::Custom { density_kg_m3, viscosity_mpa_s, kinematic_viscosity_mm2_s } => {
                o.member("kind", "custom");
                o.member("density_kg_m3", density_kg_m3);
                o.member_opt("viscosity_mpa_s", viscosity_mpa_s);
                o.member_opt("kinematic_viscosity_mm2_s", kinematic_viscosity_mm2_s);
            }
            FluidFile::Gas { gas, temperature, pressure, relative_density, molar_mass, viscosity_mpa_s, z } => {
                o.member("kind", "gas");
                o.member("gas", gas);
                o.member("temperature", temperature);
                o.member("pressure", pressure);
                o.member_opt("relative_density", relative_density);
                o.member_opt("molar_mass", molar_mass);
                o.member_opt("viscosity_mpa_s", viscosity_mpa_s);
                o.member_opt("z", z);
            }
            FluidFile::Steam { pressure, temperature } => {
                o.member("kind", "steam");
                o.member("pressure", pressure);
                o.member_opt("temperature", temperature);
            }
        }
        o.close('}');
    }
}

impl Entry {
    fn write(&self, o: &mut Out) {
        o.open('{');
        o.member("id", &self.id);
        o.member("name", &self.name);
        o.member("updated", &self.updated);
        o.close('}');
    }
}

/// The device's list of stored worksheets, compact.
pub(crate) fn write_entries(list: &[Entry]) -> String {
    let mut o = Out::new(false);
    o.open('[');
    for e in list {
        o.item();
        e.write(&mut o);
    }
    o.close(']');
    o.done()
}

impl Trashed {
    pub(crate) fn write(&self, o: &mut Out) {
        o.open('{');
        o.key("entry");
        self.entry.write(o);
        o.member("deleted", &self.deleted);
        o.member("text", &self.text);
        o.close('}');
    }
}
