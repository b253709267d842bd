//! One line's design data, evaluated at one bore and one flow.
//!
//! Pressure drop by Darcy–Weisbach,
//! Δp/L = f ρ V² / (2 D)
//! (Weisbach 1845, Darcy 1857; in the form of any fluid mechanics text, e.g.
//! White, *Fluid Mechanics*, eq. 6.10), or by Hazen–Williams for water.
//! Total drop = friction over (length + equivalent length) + ΣK ρV²/2 +
//! ρ g Δz.

use crate::hydraulics::digits::{Fixed, Short};
use uom::si::f64::{Length, Pressure, ThermodynamicTemperature, Velocity, VolumeRate};
use uom::si::length::meter;
use uom::si::pressure::pascal;
use uom::si::thermodynamic_temperature::degree_celsius;
use uom::si::velocity::meter_per_second;
use uom::si::{Quantity, ISQ, SI};
use uom::typenum::{N2, P1, Z0};

use super::field::Field;
use super::fluid::{Fluid, FluidError, Properties};
use super::friction::{self, Regime};
use super::geometry::mean_velocity;
use super::losses::{self, Component, Fittings, G_N};
use super::pipes::Series;

/// Pressure per length (M L⁻² T⁻²), which `uom` has no name for.
pub type PressureGradient = Quantity<ISQ<N2, P1, N2, Z0, Z0, Z0, Z0>, SI<f64>, f64>;

/// Builds a [`PressureGradient`] from pascals per metre.
pub fn pa_per_m(v: f64) -> PressureGradient {
    Pressure::new::<pascal>(v) / Length::new::<meter>(1.0)
}

/// How friction loss is computed.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Method {
    /// Darcy–Weisbach with the friction factor of [`friction::darcy`].
    DarcyWeisbach,
    /// Hazen–Williams with a C factor: water near room temperature only.
    HazenWilliams {
        /// The C factor.
        c: f64,
    },
}

/// The pipe the line is made of: a standard series, or one bore typed in.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Pipe {
    /// Every nominal size of a standard series is a candidate.
    Series(&'static Series),
    /// One inside diameter entered directly.
    Custom(Length),
}

impl Pipe {
    /// Candidate bores, smallest first, with their trade names.
    pub fn bores(&self) -> Vec<(&'static str, Length)> {
        match self {
            Pipe::Series(s) => s.sizes.iter().map(|z| (z.nominal, s.bore(z))).collect(),
            Pipe::Custom(d) => vec![("custom bore", *d)],
        }
    }

    /// The diameter, in inches, that Darby's 3-K method takes for the size
    /// with this bore: its nominal diameter (see
    /// [`Series::darby_diameter_in`]); the bore itself for a custom bore.
    pub fn darby_diameter_in(&self, bore: Length) -> f64 {
        match self {
            Pipe::Series(s) => s
                .sizes
                .iter()
                .find(|z| s.bore(z) == bore)
                .map(|z| s.darby_diameter_in(z))
                .unwrap_or_else(|| bore.get::<uom::si::length::inch>()),
            Pipe::Custom(d) => d.get::<uom::si::length::inch>(),
        }
    }

    /// Whether a size is rarely stocked (never for a custom bore).
    pub fn is_rare(&self, nominal: &str) -> bool {
        matches!(self, Pipe::Series(s) if s.is_rare(nominal))
    }
}

/// Whether the fluid returns to where it started (a closed loop: chilled
/// or heating water) or leaves the system (an open system: domestic water,
/// a drain, a line to a tank). In a closed loop the pressure a riser's
/// rise takes is given back by the down-leg, so it is not pump head:
/// the line's total drop leaves the static part out and reports it apart
/// (common practice; e.g. ASHRAE Handbook—Fundamentals, hydronic piping).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum Circuit {
    /// Open: the static rise counts in the total drop.
    #[default]
    Open,
    /// Closed loop: the static rise is shown apart, not in the total.
    Closed,
}

impl Circuit {
    /// Both, in listing order.
    pub const ALL: [Circuit; 2] = [Circuit::Open, Circuit::Closed];

    /// Stable identifier in files.
    pub fn id(self) -> &'static str {
        match self {
            Circuit::Open => "open",
            Circuit::Closed => "closed",
        }
    }

    /// A plain name.
    pub fn label(self) -> &'static str {
        match self {
            Circuit::Open => "Open system (static rise counts)",
            Circuit::Closed => "Closed loop (static rise returned)",
        }
    }
}

/// Design limits; any may be absent.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Limits {
    /// Largest friction drop per length of straight pipe.
    pub max_drop_per_length: Option<PressureGradient>,
    /// Largest total drop over the line (friction and fittings, and the
    /// rise in an open system).
    pub max_total_drop: Option<Pressure>,
    /// Largest mean velocity.
    pub max_velocity: Option<Velocity>,
    /// Smallest mean velocity (to keep air or solids moving).
    pub min_velocity: Option<Velocity>,
    /// A largest velocity that depends on the size.
    pub velocity_by_size: Option<&'static super::velocity::VelocityRule>,
    /// Largest total drop as a fraction of the inlet's absolute pressure
    /// (gas and steam lines).
    pub max_drop_fraction: Option<f64>,
}

impl Limits {
    /// The largest velocity allowed in a size of nominal diameter `dn_in`
    /// inches carrying fluid at `t_c` °C: the lower of the line's maximum
    /// and its by-size table.
    pub fn max_velocity_at(&self, dn_in: f64, t_c: f64) -> Option<f64> {
        let by_size = self.velocity_by_size.map(|r| r.max_at(dn_in, t_c));
        match (self.max_velocity.map(|v| v.value), by_size) {
            (Some(a), Some(b)) => Some(a.min(b)),
            (a, b) => a.or(b),
        }
    }
}

/// One of the limits.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Limit {
    /// Friction drop per length.
    DropPerLength,
    /// Total drop.
    TotalDrop,
    /// Largest velocity.
    MaxVelocity,
    /// Smallest velocity.
    MinVelocity,
    /// Total drop as a fraction of the inlet pressure (gas and steam).
    DropFraction,
    /// The flow a gas or steam line can pass before it chokes: always
    /// checked on such a line.
    Choking,
}

impl Limit {
    /// A plain name.
    pub fn name(self) -> &'static str {
        match self {
            Limit::DropPerLength => "drop per length",
            Limit::TotalDrop => "total drop",
            Limit::MaxVelocity => "maximum velocity",
            Limit::MinVelocity => "minimum velocity",
            Limit::DropFraction => "drop as a share of inlet pressure",
            Limit::Choking => "choked flow (sonic limit)",
        }
    }

    /// Stable identifier for files.
    pub fn id(self) -> &'static str {
        match self {
            Limit::DropPerLength => "drop_per_length",
            Limit::TotalDrop => "total_drop",
            Limit::MaxVelocity => "max_velocity",
            Limit::MinVelocity => "min_velocity",
            Limit::DropFraction => "drop_fraction",
            Limit::Choking => "choking",
        }
    }
}

/// Why a line cannot be evaluated.
#[derive(Debug, Clone, PartialEq)]
pub enum LineError {
    /// Fluid properties could not be found.
    Fluid(FluidError),
    /// A value that must be positive and finite is not.
    NotPositive(Field),
    /// A value that must be finite is not.
    NotFinite(Field),
    /// The pipe roughness is negative or not finite.
    Roughness,
    /// The series has no sizes.
    NoSizes,
    /// A value outside the range the methods are meant for.
    OutOfRange {
        /// The input at fault.
        field: Field,
        /// What, with its SI unit, as the message names it.
        what: &'static str,
        /// Lowest accepted, SI.
        min: f64,
        /// Highest accepted, SI.
        max: f64,
    },
    /// The numbers could not be computed for these inputs (an overflow);
    /// reported rather than shown as NaN.
    NotComputable,
    /// No maximum limit: a minimum velocity alone (or nothing) cannot pick
    /// a size, since every larger size would do.
    NoMaximum,
    /// Something a gas or steam line cannot take (Hazen–Williams, a
    /// component rated for liquids).
    NotForGas {
        /// The input at fault.
        field: Field,
        /// Why, as a sentence.
        why: &'static str,
    },
    /// A glycol mixture too close to (or below) its freezing point for the
    /// sheet's margin.
    FreezeMargin {
        /// The mixture's freezing point, °C.
        freezing_c: f64,
        /// The margin the sheet asks for, K.
        margin_k: f64,
    },
}

impl std::fmt::Display for LineError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            LineError::Fluid(e) => write!(f, "{e}"),
            LineError::NotPositive(field) => write!(f, "{} must be greater than zero", field.label()),
            LineError::NotFinite(field) => write!(f, "{} must be a finite number", field.label()),
            LineError::Roughness => write!(f, "roughness must be zero or more"),
            LineError::NotForGas { why, .. } => write!(f, "{why}"),
            LineError::NoSizes => write!(f, "the pipe series has no sizes"),
            LineError::OutOfRange { what, min, max, .. } => {
                write!(f, "{what} must be between {} and {} (SI units)", Short(*min), Short(*max))
            }
            LineError::NotComputable => write!(f, "these inputs are beyond what the methods can compute"),
            LineError::NoMaximum => write!(
                f,
                "a minimum velocity alone does not size a line: set a maximum too \
                 (drop per length, total drop or velocity)"
            ),
            LineError::FreezeMargin { freezing_c, margin_k } => write!(
                f,
                "this mixture freezes at {} °C; the sheet keeps {} K clear of that, so the \
                 temperature must be at least {} °C (or use a stronger mixture)",
                Fixed(*freezing_c, 1),
                Short(*margin_k),
                Fixed(freezing_c + margin_k, 1)
            ),
        }
    }
}

impl std::error::Error for LineError {}

/// All the design data of one line.
#[derive(Debug, Clone, PartialEq)]
pub struct Line {
    /// Volume flow.
    pub flow: VolumeRate,
    /// The fluid.
    pub fluid: Fluid,
    /// Fluid temperature.
    pub temperature: ThermodynamicTemperature,
    /// Absolute pressure the fluid is at (water: must keep it liquid).
    pub pressure: Pressure,
    /// Pipe series or custom bore.
    pub pipe: Pipe,
    /// Absolute roughness ε.
    pub roughness: Length,
    /// Length of straight pipe.
    pub length: Length,
    /// Fittings, ΣK and equivalent length.
    pub fittings: Fittings,
    /// Rise from start to end (negative for a fall).
    pub rise: Length,
    /// Friction method.
    pub method: Method,
    /// Design limits.
    pub limits: Limits,
    /// Open system or closed loop: whether the rise counts in the total.
    pub circuit: Circuit,
    /// How far above a glycol mixture's freezing point the fluid must be, K.
    pub freeze_margin: f64,
    /// Search the rarely stocked sizes too (check mode may pin any size).
    pub every_size: bool,
    /// The smallest size the search may propose, by its designation.
    pub smallest: Option<&'static str>,
}

/// The hydraulic state of a line at one bore and one flow.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Point {
    /// Inside diameter.
    pub bore: Length,
    /// Mean velocity.
    pub velocity: Velocity,
    /// Re = ρ V D / μ.
    pub reynolds: f64,
    /// ε / D.
    pub relative_roughness: f64,
    /// Regime of Re.
    pub regime: Regime,
    /// Darcy friction factor (for Hazen–Williams, the equivalent f).
    pub friction_factor: f64,
    /// Friction drop per length of straight pipe.
    pub drop_per_length: PressureGradient,
    /// ΣK of the fittings at this Re and bore.
    pub sum_k: f64,
    /// Friction over length + equivalent length.
    pub friction_drop: Pressure,
    /// ΣK ρ V² / 2.
    pub fittings_drop: Pressure,
    /// Across the valves and equipment given by Kv, rated drop, or as a
    /// butterfly valve or reducer.
    pub components_drop: Pressure,
    /// ρ g Δz (reported in both circuits).
    pub static_drop: Pressure,
    /// Friction + fittings + components, + static in an open system.
    pub total_drop: Pressure,
    /// Both ends of a gas or steam line (`None` for a liquid).
    pub gas: Option<GasEnds>,
}

/// The two ends of a gas or steam line at one size, by the isothermal
/// compressible-flow equation ([`super::compressible`]).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct GasEnds {
    /// Inlet pressure, Pa absolute.
    pub inlet_pressure: f64,
    /// Outlet pressure, Pa absolute (the sonic state's when choked).
    pub outlet_pressure: f64,
    /// Inlet density, kg/m³.
    pub inlet_density: f64,
    /// Outlet density, kg/m³.
    pub outlet_density: f64,
    /// Outlet mean velocity, m/s (the inlet's is [`Point::velocity`]).
    pub outlet_velocity: f64,
    /// K = f (L + L_eq)/D + ΣK.
    pub resistance: f64,
    /// G / G_max (1 chokes).
    pub choke_ratio: f64,
    /// The line cannot pass the flow at this size.
    pub choked: bool,
    /// Friction and fittings by Darcy–Weisbach at the inlet density, Pa:
    /// the incompressible form, for comparison.
    pub incompressible_drop: f64,
}

impl GasEnds {
    /// Friction and fittings drop as a fraction of the inlet pressure.
    pub fn fraction(&self) -> f64 {
        (self.inlet_pressure - self.outlet_pressure) / self.inlet_pressure
    }
}

fn within(v: f64, field: Field, what: &'static str, min: f64, max: f64) -> Result<(), LineError> {
    if v.is_finite() && (min..=max).contains(&v) {
        Ok(())
    } else {
        Err(LineError::OutOfRange { field, what, min, max })
    }
}

fn positive(v: f64, field: Field) -> Result<(), LineError> {
    if v.is_finite() && v > 0.0 {
        Ok(())
    } else {
        Err(LineError::NotPositive(field))
    }
}

impl LineError {
    /// The input the error belongs to.
    pub fn field(&self) -> Field {
        match self {
            LineError::Fluid(_) => Field::Fluid,
            LineError::NotPositive(f)
            | LineError::NotFinite(f)
            | LineError::OutOfRange { field: f, .. }
            | LineError::NotForGas { field: f, .. } => *f,
            LineError::Roughness => Field::Roughness,
            LineError::NoSizes => Field::Pipe,
            LineError::NotComputable => Field::Line,
            LineError::NoMaximum => Field::Limits,
            LineError::FreezeMargin { .. } => Field::FluidTemperature,
        }
    }
}

/// A line whose inputs passed [`Line::validate`], with its fluid's
/// properties found once. Reads as the [`Line`] it holds.
#[derive(Debug, Clone, PartialEq)]
pub struct Valid {
    line: Line,
    props: Properties,
}

impl Valid {
    /// The line.
    pub fn line(&self) -> &Line {
        &self.line
    }

    /// Density and viscosity at the line's temperature and pressure.
    pub fn properties(&self) -> Properties {
        self.props
    }

    /// The line, to change and validate again.
    pub fn into_line(self) -> Line {
        self.line
    }
}

impl std::ops::Deref for Valid {
    type Target = Line;
    fn deref(&self) -> &Line {
        &self.line
    }
}

impl Line {
    /// Density and viscosity at the line's temperature and pressure.
    ///
    /// # Errors
    /// [`LineError::Fluid`].
    pub fn properties(&self) -> Result<Properties, LineError> {
        self.fluid.properties(self.temperature, self.pressure).map_err(LineError::Fluid)
    }

    /// Checks every input that the core cannot work without, once: the
    /// sizing functions take the [`Valid`] line this returns, so nothing
    /// re-checks per size or per table row.
    ///
    /// # Errors
    /// The first bad input, as a [`LineError`].
    pub fn validate(self) -> Result<Valid, LineError> {
        let props = self.check_inputs()?;
        Ok(Valid { line: self, props })
    }

    fn check_inputs(&self) -> Result<Properties, LineError> {
        positive(self.flow.value, Field::Flow)?;
        // Bounds far outside any pipe a person would size, so that no input
        // can overflow the arithmetic (they are not design advice).
        within(self.flow.value, Field::Flow, "flow (m³/s)", 1e-12, 1e3)?;
        within(self.length.value, Field::Length, "length (m)", 0.0, 1e6)?;
        within(self.rise.value, Field::Rise, "rise (m)", -1e4, 1e4)?;
        within(self.roughness.value, Field::Roughness, "roughness (m)", 0.0, 0.1)?;
        within(self.fittings.extra_k, Field::ExtraK, "ΣK", 0.0, 1e5)?;
        if !(self.length.value.is_finite() && self.length.value >= 0.0) {
            return Err(LineError::NotFinite(Field::Length));
        }
        if !(self.roughness.value.is_finite() && self.roughness.value >= 0.0) {
            return Err(LineError::Roughness);
        }
        if !self.rise.value.is_finite() {
            return Err(LineError::NotFinite(Field::Rise));
        }
        if !(self.fittings.extra_k.is_finite() && self.fittings.extra_k >= 0.0) {
            return Err(LineError::NotFinite(Field::ExtraK));
        }
        if let Some(le) = self.fittings.equivalent_length {
            if !(le.value.is_finite() && le.value >= 0.0) {
                return Err(LineError::NotFinite(Field::EquivalentLength));
            }
        }
        for c in &self.fittings.components {
            let f = Field::Components;
            match *c {
                Component::Kv(kv) => within(kv, f, "Kv (m³/h at 1 bar)", 1e-6, 1e6)?,
                Component::Rated { drop_pa, flow_m3_s } => {
                    within(drop_pa, f, "rated drop (Pa)", 1.0, 1e8)?;
                    within(flow_m3_s, f, "rated flow (m³/s)", 1e-9, 1e3)?;
                }
                Component::Butterfly => {}
                Component::Reducer { to_bore_m, angle_deg } => {
                    within(to_bore_m, f, "reducer's other bore (m)", 1e-4, 20.0)?;
                    within(angle_deg, f, "reducer's included angle (°)", 1.0, 180.0)?;
                }
            }
        }
        if self.fluid.is_compressible() {
            if let Method::HazenWilliams { .. } = self.method {
                return Err(LineError::NotForGas {
                    field: Field::HazenWilliamsC,
                    why: "Hazen–Williams is a water formula: size a gas or steam line by Darcy–Weisbach",
                });
            }
            if !self.fittings.components.is_empty() {
                return Err(LineError::NotForGas {
                    field: Field::Components,
                    why: "valves and equipment by Kv, Cv or rated drop are read as liquids here: on a gas or \
                          steam line give their resistance as K in the fittings' extra ΣK, or size control \
                          valves by IEC 60534-2-1 and add their drop apart",
                });
            }
        }
        if let Method::HazenWilliams { c } = self.method {
            positive(c, Field::HazenWilliamsC)?;
            within(c, Field::HazenWilliamsC, "Hazen–Williams C", 1.0, 250.0)?;
        }
        let bores = self.pipe.bores();
        if bores.is_empty() {
            return Err(LineError::NoSizes);
        }
        for (_, d) in bores {
            positive(d.value, Field::PipeDiameter)?;
            within(d.value, Field::PipeDiameter, "inside diameter (m)", 1e-4, 20.0)?;
        }
        let l = &self.limits;
        for (v, what) in [
            (l.max_drop_per_length.map(|g| g.value), Field::MaxDropPerLength),
            (l.max_total_drop.map(|p| p.value), Field::MaxTotalDrop),
            (l.max_velocity.map(|v| v.value), Field::MaxVelocity),
            (l.min_velocity.map(|v| v.value), Field::MinVelocity),
        ] {
            if let Some(v) = v {
                positive(v, what)?;
            }
        }
        if let Some(x) = l.max_drop_fraction {
            within(x, Field::MaxDropPercent, "drop as a fraction of inlet pressure", 1e-6, 0.9)?;
        }
        if l.max_drop_per_length.is_none()
            && l.max_total_drop.is_none()
            && l.max_velocity.is_none()
            && l.velocity_by_size.is_none()
            && l.max_drop_fraction.is_none()
        {
            return Err(LineError::NoMaximum);
        }
        within(self.freeze_margin, Field::FluidTemperature, "freezing margin (K)", 0.0, 20.0)?;
        let props = self.properties()?;
        if let Some(freezing_c) = self.fluid.freezing_point_c() {
            let t = self.temperature.get::<degree_celsius>();
            if t < freezing_c + self.freeze_margin {
                return Err(LineError::FreezeMargin { freezing_c, margin_k: self.freeze_margin });
            }
        }
        let rho_min = if self.fluid.is_compressible() { 1e-3 } else { 1.0 };
        within(props.density_kg_m3(), Field::Fluid, "density (kg/m³)", rho_min, 3e4)?;
        within(props.viscosity_pa_s(), Field::Fluid, "viscosity (Pa·s)", 1e-7, 1e3)?;
        Ok(props)
    }

    /// The hydraulic state at `bore` carrying `flow`. Inputs must have
    /// passed [`Line::validate`]; `props` is what it returned.
    pub fn point(&self, props: &Properties, bore: Length, flow: VolumeRate) -> Point {
        let velocity = mean_velocity(flow, bore);
        let v = velocity.get::<meter_per_second>();
        let d = bore.get::<meter>();
        let rho = props.density_kg_m3();
        let mu = props.viscosity_pa_s();
        let reynolds = rho * v * d / mu;
        let relative_roughness = (self.roughness.get::<meter>() / d).min(0.099);
        let regime = Regime::of(reynolds.max(f64::MIN_POSITIVE));
        let (friction_factor, dpl) = match self.method {
            Method::DarcyWeisbach => {
                let f = friction::darcy(reynolds.max(f64::MIN_POSITIVE), relative_roughness)
                    .map(|fr| fr.f)
                    .unwrap_or(f64::NAN);
                (f, f * rho * v * v / (2.0 * d))
            }
            Method::HazenWilliams { c } => {
                let s = hazen_williams_slope(v, d, c);
                let dpl = rho * G_N * s;
                let f = if v > 0.0 { 2.0 * G_N * d * s / (v * v) } else { 0.0 };
                (f, dpl)
            }
        };
        let drop_per_length = pa_per_m(dpl);
        let run = self.length + self.fittings.equivalent_length.unwrap_or(Length::new::<meter>(0.0));
        let friction_drop = drop_per_length * run;
        let sum_k = if self.fittings.counts.is_empty() {
            self.fittings.extra_k
        } else {
            self.fittings.sum_k(reynolds.max(1.0), self.pipe.darby_diameter_in(bore))
        };
        let fittings_drop = losses::minor_loss(sum_k, props.density, velocity);
        let components_drop = if self.fittings.components.is_empty() {
            Pressure::new::<pascal>(0.0)
        } else {
            let dn = self.pipe.darby_diameter_in(bore);
            let q = flow.get::<uom::si::volume_rate::cubic_meter_per_second>();
            Pressure::new::<pascal>(self.fittings.components.iter().map(|c| c.drop(q, rho, d, dn)).sum())
        };
        if self.fluid.is_compressible() {
            return self.gas_point(props, bore, velocity, reynolds, relative_roughness, friction_factor, sum_k);
        }
        let static_drop = losses::static_pressure(self.rise, props.density);
        Point {
            bore,
            velocity,
            reynolds,
            relative_roughness,
            regime,
            friction_factor,
            drop_per_length,
            sum_k,
            friction_drop,
            fittings_drop,
            components_drop,
            static_drop,
            total_drop: match self.circuit {
                Circuit::Open => friction_drop + fittings_drop + components_drop + static_drop,
                Circuit::Closed => friction_drop + fittings_drop + components_drop,
            },
            gas: None,
        }
    }

    /// A gas or steam line's point: the isothermal compressible-flow
    /// equation over K = f (L + L_eq)/D + ΣK, the drop shared between pipe
    /// and fittings in proportion to their K; the static term at the mean
    /// density.
    #[allow(clippy::too_many_arguments)]
    fn gas_point(
        &self,
        props: &Properties,
        bore: Length,
        velocity: Velocity,
        reynolds: f64,
        relative_roughness: f64,
        friction_factor: f64,
        sum_k: f64,
    ) -> Point {
        let d = bore.get::<meter>();
        let v1 = velocity.get::<meter_per_second>();
        let rho1 = props.density_kg_m3();
        let p1 = self.pressure.get::<pascal>();
        let run = (self.length + self.fittings.equivalent_length.unwrap_or(Length::new::<meter>(0.0))).value;
        let k_pipe = friction_factor * run / d;
        let k = k_pipe + sum_k;
        let g = rho1 * v1;
        let iso = super::compressible::isothermal(p1, rho1, g, k);
        let p2 = iso.outlet_pressure;
        // A choked size is given all of the inlet pressure: it fails every
        // drop limit, and the drop never falls as the flow grows.
        let dp = if iso.choked { p1 } else { p1 - p2 };
        let share = |part: f64| if k > 0.0 { dp * part / k } else { 0.0 };
        let rho2 = rho1 * p2 / p1;
        let gradient =
            if k > 0.0 { friction_factor * dp / (d * k) } else { friction_factor * rho1 * v1 * v1 / (2.0 * d) };
        let friction_drop = Pressure::new::<pascal>(share(k_pipe));
        let fittings_drop = Pressure::new::<pascal>(share(sum_k));
        let static_drop = Pressure::new::<pascal>(0.5 * (rho1 + rho2) * G_N * self.rise.get::<meter>());
        Point {
            bore,
            velocity,
            reynolds,
            relative_roughness,
            regime: Regime::of(reynolds.max(f64::MIN_POSITIVE)),
            friction_factor,
            drop_per_length: pa_per_m(gradient),
            sum_k,
            friction_drop,
            fittings_drop,
            components_drop: Pressure::new::<pascal>(0.0),
            static_drop,
            total_drop: match self.circuit {
                Circuit::Open => friction_drop + fittings_drop + static_drop,
                Circuit::Closed => friction_drop + fittings_drop,
            },
            gas: Some(GasEnds {
                inlet_pressure: p1,
                outlet_pressure: p2,
                inlet_density: rho1,
                outlet_density: rho2,
                outlet_velocity: g / rho2,
                resistance: k,
                choke_ratio: iso.choke_ratio,
                choked: iso.choked,
                incompressible_drop: k * rho1 * v1 * v1 / 2.0,
            }),
        }
    }

    /// Cautions about the method for this line, as plain sentences.
    pub fn method_warnings(&self) -> Vec<&'static str> {
        let mut out = Vec::new();
        if let Fluid::Steam { .. } = self.fluid {
            out.push(
                "sized for dry steam: a steam main loses heat and condensate forms; fall the main with the flow, \
                 drain it through drip legs and traps at low points and risers, so slugs of water cannot cause \
                 water hammer (common practice)",
            );
        }
        if let Method::HazenWilliams { .. } = self.method {
            let t = self.temperature.get::<degree_celsius>();
            if !matches!(self.fluid, Fluid::Water) || !(5.0..=25.0).contains(&t) {
                out.push(
                    "Hazen–Williams is an empirical fit for water near room temperature \
                     (about 5–25 °C); for this fluid or temperature use Darcy–Weisbach",
                );
            }
        }
        out
    }
}

/// Hydraulic gradient (head loss per length, m/m) by Hazen–Williams in SI:
/// V = k C R^0.63 S^0.54, k = 0.849, R = D/4, so S = (V / (k C R^0.63))^(1/0.54).
///
/// Williams, G. S., Hazen, A. (1905, 1920). *Hydraulic Tables*. Wiley. The SI
/// constant 0.849 is 1.318 (US units) × 0.3048^0.37 (common practice).
pub fn hazen_williams_slope(v: f64, d: f64, c: f64) -> f64 {
    let r = d / 4.0;
    (v / (0.849 * c * r.powf(0.63))).powf(1.0 / 0.54)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn hazen_williams_si_constant_matches_the_us_form() {
        // 1.318 · 0.3048^0.37 = 0.8492: the SI constant is the US one converted.
        assert!((1.318 * 0.3048f64.powf(0.37) - 0.849).abs() < 5e-4);
    }

    #[test]
    fn hazen_williams_against_the_usual_si_head_loss_form() {
        // hf/L = 10.67 Q^1.852 / (C^1.852 D^4.8704), the SI form printed in
        // water-supply texts (common practice). Q = 0.01 m³/s, D = 0.1 m, C = 130.
        let (q, d, c) = (0.01f64, 0.1f64, 130.0f64);
        let v = q / (std::f64::consts::FRAC_PI_4 * d * d);
        let s = hazen_williams_slope(v, d, c);
        let printed = 10.67 * q.powf(1.852) / (c.powf(1.852) * d.powf(4.8704));
        assert!(((s - printed) / printed).abs() < 0.01, "{s} vs {printed}");
    }
}
