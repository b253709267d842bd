//! Losses other than straight-pipe friction: fittings and valves (the 3-K
//! method), entrance and exit, a directly entered ΣK, and elevation.
//!
//! 3-K method: Darby, R. (2001). "Correlate pressure drops through
//! fittings." Chemical Engineering 108(4), 127–130; table also in Darby,
//! *Chemical Engineering Fluid Mechanics*, 2nd ed. (2001), table 7-3:
//!
//! K = K1/Re + Ki (1 + Kd / Dn^0.3), Dn in inches.
//!
//! Dn is the nominal diameter in inches, as Darby defines it: the NPS, a
//! copper tube's nominal size, a DN as its NPS (DN50 → 2). Sizes named by
//! outside diameter (PE, EN 1057 copper) and custom bores have no nominal
//! inch size; their bore in inches stands in (`pipes::Series::darby_diameter_in`).
//! The choice matters most in small sizes: against the Sch 40 bore, the
//! nominal diameter raises K (threaded elbow, globe valve) by 5.5 % at
//! 1/2 in, 2.3 % at 3/4 in, 1.1 % at 1 in, 0.8 % at 2 in and under 0.2 %
//! from 4 in (worked from Darby's constants). Constants typed from memory of Darby's table and checked
//! one by one against `fluids.fittings.Darby` (fluids 1.3.1) by
//! tests/reference.rs.

use uom::si::f64::{Length, MassDensity, Pressure, Velocity};

/// Standard acceleration of free fall, g_n = 9.80665 m/s² (3rd CGPM, 1901;
/// NIST SP 811 appendix B).
pub const G_N: f64 = 9.806_65;

/// A fitting or valve the 3-K method covers, or a pipe entrance or exit.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Fitting {
    /// Elbow 90°, threaded, standard (r/D = 1).
    Elbow90Threaded,
    /// Elbow 90°, threaded, long radius (r/D = 1.5).
    Elbow90ThreadedLong,
    /// Elbow 90°, flanged or welded (r/D = 1).
    Elbow90Welded,
    /// Bend 90°, r/D = 2. Not a long-radius butt-weld elbow, which is
    /// r/D = 1.5: Darby has no r/D 1.5 row for welded elbows, so those take
    /// the r/D 1 row (the larger K).
    Elbow90LongRadius,
    /// Elbow 45°, threaded, standard.
    Elbow45Threaded,
    /// Elbow 45°, long radius.
    Elbow45LongRadius,
    /// Return bend 180°, flanged (r/D = 1).
    Return180Flanged,
    /// Tee, flow through the branch, threaded.
    TeeBranchThreaded,
    /// Tee, flow through the branch, flanged.
    TeeBranchFlanged,
    /// Tee, flow straight through the run, threaded.
    TeeRunThreaded,
    /// Tee, flow straight through the run, flanged.
    TeeRunFlanged,
    /// Gate valve, full bore, open.
    GateValve,
    /// Ball valve, full bore, open.
    BallValve,
    /// Globe valve, standard, open.
    GlobeValve,
    /// Plug valve, straight through.
    PlugValve,
    /// Diaphragm valve, dam type.
    DiaphragmValve,
    /// Swing check valve.
    SwingCheck,
    /// Lift check valve.
    LiftCheck,
    /// Sharp-edged entrance from a tank.
    EntranceSharp,
    /// Exit into a tank.
    Exit,
}

/// How a fitting's K is found.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum KMethod {
    /// Darby's three constants (K1, Ki, Kd).
    ThreeK(f64, f64, f64),
    /// A constant K.
    Constant(f64),
}

impl Fitting {
    /// Every fitting, in the order the page lists them.
    pub const ALL: [Fitting; 20] = [
        Fitting::Elbow90Threaded,
        Fitting::Elbow90ThreadedLong,
        Fitting::Elbow90Welded,
        Fitting::Elbow90LongRadius,
        Fitting::Elbow45Threaded,
        Fitting::Elbow45LongRadius,
        Fitting::Return180Flanged,
        Fitting::TeeBranchThreaded,
        Fitting::TeeBranchFlanged,
        Fitting::TeeRunThreaded,
        Fitting::TeeRunFlanged,
        Fitting::GateValve,
        Fitting::BallValve,
        Fitting::GlobeValve,
        Fitting::PlugValve,
        Fitting::DiaphragmValve,
        Fitting::SwingCheck,
        Fitting::LiftCheck,
        Fitting::EntranceSharp,
        Fitting::Exit,
    ];

    /// Stable identifier for sheet files.
    pub fn id(self) -> &'static str {
        match self {
            Fitting::Elbow90Threaded => "elbow90-threaded",
            Fitting::Elbow90ThreadedLong => "elbow90-threaded-long",
            Fitting::Elbow90Welded => "elbow90-welded",
            Fitting::Elbow90LongRadius => "elbow90-long",
            Fitting::Elbow45Threaded => "elbow45-threaded",
            Fitting::Elbow45LongRadius => "elbow45-long",
            Fitting::Return180Flanged => "return180-flanged",
            Fitting::TeeBranchThreaded => "tee-branch-threaded",
            Fitting::TeeBranchFlanged => "tee-branch-flanged",
            Fitting::TeeRunThreaded => "tee-run-threaded",
            Fitting::TeeRunFlanged => "tee-run-flanged",
            Fitting::GateValve => "valve-gate",
            Fitting::BallValve => "valve-ball",
            Fitting::GlobeValve => "valve-globe",
            Fitting::PlugValve => "valve-plug",
            Fitting::DiaphragmValve => "valve-diaphragm",
            Fitting::SwingCheck => "check-swing",
            Fitting::LiftCheck => "check-lift",
            Fitting::EntranceSharp => "entrance-sharp",
            Fitting::Exit => "exit",
        }
    }

    /// Finds a fitting by identifier.
    pub fn from_id(id: &str) -> Option<Fitting> {
        Fitting::ALL.into_iter().find(|f| f.id() == id)
    }

    /// A plain name for display.
    pub fn label(self) -> &'static str {
        match self {
            Fitting::Elbow90Threaded => "Elbow 90°, threaded, standard (r/D 1)",
            Fitting::Elbow90ThreadedLong => "Elbow 90°, threaded, long radius (r/D 1.5)",
            Fitting::Elbow90Welded => "Elbow 90°, welded or flanged, r/D 1 (safe side for r/D 1.5)",
            Fitting::Elbow90LongRadius => "Bend 90°, welded or flanged, r/D 2",
            Fitting::Elbow45Threaded => "Elbow 45°, threaded, standard (r/D 1)",
            Fitting::Elbow45LongRadius => "Elbow 45°, long radius (r/D 1.5)",
            Fitting::Return180Flanged => "Return bend 180°, flanged (r/D 1)",
            Fitting::TeeBranchThreaded => "Tee through branch, threaded",
            Fitting::TeeBranchFlanged => "Tee through branch, flanged",
            Fitting::TeeRunThreaded => "Tee straight run, threaded",
            Fitting::TeeRunFlanged => "Tee straight run, flanged",
            Fitting::GateValve => "Gate valve, open",
            Fitting::BallValve => "Ball valve, open",
            Fitting::GlobeValve => "Globe valve, open",
            Fitting::PlugValve => "Plug valve, straight through",
            Fitting::DiaphragmValve => "Diaphragm valve, dam type",
            Fitting::SwingCheck => "Swing check valve",
            Fitting::LiftCheck => "Lift check valve",
            Fitting::EntranceSharp => "Entrance, sharp-edged",
            Fitting::Exit => "Exit into a tank",
        }
    }

    /// The row of Darby's table this fitting is (the `fluids` key), or for
    /// entrance and exit the constant and its source.
    pub fn method(self) -> (KMethod, &'static str) {
        use KMethod::{Constant, ThreeK};
        match self {
            Fitting::Elbow90Threaded => (ThreeK(800.0, 0.14, 4.0), "Elbow, 90°, threaded, standard, (r/D = 1)"),
            Fitting::Elbow90ThreadedLong => {
                (ThreeK(800.0, 0.071, 4.2), "Elbow, 90°, threaded, long radius, (r/D = 1.5)")
            }
            Fitting::Elbow90Welded => (ThreeK(800.0, 0.091, 4.0), "Elbow, 90°, flanged, welded, bends, (r/D = 1)"),
            Fitting::Elbow90LongRadius => (ThreeK(800.0, 0.056, 3.9), "Elbow, 90°, (r/D = 2)"),
            Fitting::Elbow45Threaded => (ThreeK(500.0, 0.071, 4.2), "Elbow, 45°, threaded standard, (r/D = 1)"),
            Fitting::Elbow45LongRadius => (ThreeK(500.0, 0.052, 4.0), "Elbow, 45°, long radius, (r/D = 1.5)"),
            Fitting::Return180Flanged => (ThreeK(1000.0, 0.12, 4.0), "Elbow, 180°, flanged, (r/D = 1)"),
            Fitting::TeeBranchThreaded => {
                (ThreeK(500.0, 0.274, 4.0), "Tee, Through-branch, (as elbow), threaded, (r/D = 1)")
            }
            Fitting::TeeBranchFlanged => {
                (ThreeK(800.0, 0.28, 4.0), "Tee, Through-branch, (as elbow), flanged, (r/D = 1)")
            }
            Fitting::TeeRunThreaded => (ThreeK(200.0, 0.091, 4.0), "Tee, Run-through, threaded, (r/D = 1)"),
            Fitting::TeeRunFlanged => (ThreeK(150.0, 0.05, 4.0), "Tee, Run-through, flanged, (r/D = 1)"),
            Fitting::GateValve => (ThreeK(300.0, 0.037, 3.9), "Valve, Gate valve, standard, β = 1"),
            Fitting::BallValve => (ThreeK(300.0, 0.017, 3.5), "Valve, Ball valve, standard, β = 1"),
            Fitting::GlobeValve => (ThreeK(1500.0, 1.7, 3.6), "Valve, Globe valve, standard, β = 1"),
            Fitting::PlugValve => (ThreeK(300.0, 0.084, 3.9), "Valve, Plug valve, straight through"),
            Fitting::DiaphragmValve => (ThreeK(1000.0, 0.69, 4.9), "Valve, Diaphragm, dam type"),
            Fitting::SwingCheck => (ThreeK(1500.0, 0.46, 4.0), "Valve, Swing check"),
            Fitting::LiftCheck => (ThreeK(2000.0, 2.85, 3.8), "Valve, Lift check"),
            Fitting::EntranceSharp => (Constant(0.5), "sharp-edged entrance K = 0.5 (Crane TP-410; common practice)"),
            Fitting::Exit => (Constant(1.0), "exit K = 1.0, all velocity head lost (Crane TP-410; common practice)"),
        }
    }

    /// K at a Reynolds number for a pipe of nominal diameter `dn_in` inches.
    pub fn k(self, re: f64, dn_in: f64) -> f64 {
        match self.method().0 {
            KMethod::ThreeK(k1, ki, kd) => k1 / re + ki * (1.0 + kd / dn_in.powf(0.3)),
            KMethod::Constant(k) => k,
        }
    }
}

/// Water's reference density in the definition of Kv, kg/m³ (IEC 60534-2-1:
/// ρ₀ = 1000 kg/m³, water at 5–40 °C).
pub const KV_RHO0: f64 = 1000.0;

/// Cv (US gal/min at 1 psi) per Kv (m³/h at 1 bar): Cv = 1.156 Kv
/// (IEC 60534-1 / ISA-75.01.01; 1.156 is the rounded ratio of the units).
pub const CV_PER_KV: f64 = 1.156;

/// A valve or piece of equipment in a line, given as the trade gives it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Component {
    /// Flow coefficient Kv, m³/h of water at 1 bar drop (a Cv is entered as
    /// Kv = Cv / 1.156): Δp = ρ/ρ₀ · (Q/Kv)² bar (IEC 60534-2-1, the
    /// non-choked liquid form).
    Kv(f64),
    /// A drop measured or rated at a flow (a coil, heat exchanger, meter,
    /// backflow device or strainer from the maker's data): Δp = Δp_r ·
    /// (Q/Q_r)², the square law of turbulent flow (common practice).
    Rated {
        /// The rated drop, Pa.
        drop_pa: f64,
        /// The flow it was rated at, m³/s.
        flow_m3_s: f64,
    },
    /// A centric (concentric, resilient-seated) butterfly valve, fully open:
    /// K = c · fT (Crane TP-410, 2009: c = 45 for 2–8 in, 35 for 10–14 in,
    /// 25 for 16–24 in; fT Crane's full-turbulence friction factor for the
    /// nominal size).
    Butterfly,
    /// The line's bore changing to another bore with an included angle
    /// (180° for a sudden change): a contraction when the other bore is
    /// smaller, an enlargement when it is larger (Crane TP-410 formulas;
    /// the sudden enlargement is Borda–Carnot).
    Reducer {
        /// The bore the flow goes to, m.
        to_bore_m: f64,
        /// Included angle, degrees (0 < θ ≤ 180).
        angle_deg: f64,
    },
}

/// Crane TP-410's friction factor at full turbulence for clean commercial
/// steel, by nominal size in inches (table on page A-27 of the 2009 edition;
/// values from memory, checked against `fluids.fittings.ft_Crane` in
/// tests/reference.rs).
pub fn crane_ft(dn_in: f64) -> f64 {
    const TABLE: [(f64, f64); 19] = [
        (0.5, 0.027),
        (0.75, 0.025),
        (1.0, 0.023),
        (1.25, 0.022),
        (1.5, 0.021),
        (2.0, 0.019),
        (2.5, 0.018),
        (3.0, 0.018),
        (4.0, 0.017),
        (5.0, 0.016),
        (6.0, 0.015),
        (8.0, 0.014),
        (10.0, 0.014),
        (12.0, 0.013),
        (14.0, 0.013),
        (16.0, 0.013),
        (18.0, 0.012),
        (20.0, 0.012),
        (24.0, 0.012),
    ];
    // The row of the nearest tabulated size at or below, the first row below it.
    TABLE.iter().rev().find(|(d, _)| dn_in >= d - 1e-9).unwrap_or(&TABLE[0]).1
}

impl Component {
    /// The pressure lost across it, Pa: flow `q` (m³/s) of density `rho`
    /// (kg/m³) in a bore `bore` (m) of nominal diameter `dn_in` inches.
    pub fn drop(&self, q: f64, rho: f64, bore: f64, dn_in: f64) -> f64 {
        let area = |d: f64| std::f64::consts::FRAC_PI_4 * d * d;
        match *self {
            Component::Kv(kv) => 1e5 * rho / KV_RHO0 * (q * 3600.0 / kv).powi(2),
            Component::Rated { drop_pa, flow_m3_s } => drop_pa * (q / flow_m3_s).powi(2),
            Component::Butterfly => {
                let v = q / area(bore);
                Component::butterfly_k(dn_in) * 0.5 * rho * v * v
            }
            Component::Reducer { to_bore_m, angle_deg } => {
                let (small, large) = (bore.min(to_bore_m), bore.max(to_bore_m));
                let v_small = q / area(small);
                Component::reducer_k(small / large, angle_deg, to_bore_m < bore) * 0.5 * rho * v_small * v_small
            }
        }
    }

    /// Crane's centric butterfly valve K for a nominal size (c · fT).
    pub fn butterfly_k(dn_in: f64) -> f64 {
        let c = if dn_in < 9.0 {
            45.0
        } else if dn_in < 15.0 {
            35.0
        } else {
            25.0
        };
        c * crane_ft(dn_in)
    }

    /// Crane TP-410's K for a contraction or an enlargement, referred to
    /// the velocity in the smaller bore; β = d_small / d_large, θ the
    /// included angle.
    /// Contraction: θ < 45°: 0.8 sin(θ/2)(1 − β²); else 0.5 √sin(θ/2) (1 − β²).
    /// Enlargement: θ < 45°: 2.6 sin(θ/2)(1 − β²)²; else (1 − β²)² (Borda–Carnot).
    pub fn reducer_k(beta: f64, angle_deg: f64, contraction: bool) -> f64 {
        let half = (0.5 * angle_deg).to_radians();
        let b2 = beta * beta;
        match (contraction, angle_deg < 45.0) {
            (true, true) => 0.8 * sin(half) * (1.0 - b2),
            (true, false) => 0.5 * sin(half).sqrt() * (1.0 - b2),
            (false, true) => 2.6 * sin(half) * (1.0 - b2).powi(2),
            (false, false) => (1.0 - b2).powi(2),
        }
    }
}

/// sin x by its Taylor series after reducing x to [−π, π]: within 1e-11 of
/// the true value there, and a few hundred bytes of module where the
/// standard library's `sin` (libm's, built for any argument) is 6 KB.
/// Only the reducers' half angles (0 to π/2) come here.
fn sin(x: f64) -> f64 {
    use std::f64::consts::{PI, TAU};
    let x = if x.abs() > PI { x - (x / TAU).round() * TAU } else { x };
    let x2 = x * x;
    // x − x³/3! + x⁵/5! − …, to x²³/23!, summed from the smallest term.
    let mut term = 1.0;
    for n in (1..=11).rev() {
        let k = f64::from(2 * n);
        term = 1.0 - x2 / (k * (k + 1.0)) * term;
    }
    x * term
}

/// Fittings counted on one line, plus a directly entered ΣK and an
/// equivalent length of straight pipe.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Fittings {
    /// Each fitting with how many of it the line has.
    pub counts: Vec<(Fitting, u32)>,
    /// Valves and equipment given by Kv, rated drop, or as a butterfly
    /// valve or reducer.
    pub components: Vec<Component>,
    /// Extra ΣK entered directly (dimensionless).
    pub extra_k: f64,
    /// Equivalent length of straight pipe for anything else, m.
    pub equivalent_length: Option<Length>,
}

impl Fittings {
    /// ΣK of the counted fittings plus the extra K, in a pipe of nominal
    /// diameter `dn_in` inches.
    pub fn sum_k(&self, re: f64, dn_in: f64) -> f64 {
        self.extra_k + self.counts.iter().map(|&(f, n)| f.k(re, dn_in) * n as f64).sum::<f64>()
    }
}

/// Pressure lost in fittings of total ΣK at velocity V: Δp = ΣK ρ V²/2.
pub fn minor_loss(sum_k: f64, density: MassDensity, velocity: Velocity) -> Pressure {
    sum_k * 0.5 * density * velocity * velocity
}

/// Static pressure to lift a liquid by `rise` (negative for a fall):
/// Δp = ρ g Δz.
pub fn static_pressure(rise: Length, density: MassDensity) -> Pressure {
    use uom::si::acceleration::meter_per_second_squared;
    use uom::si::f64::Acceleration;
    density * Acceleration::new::<meter_per_second_squared>(G_N) * rise
}

#[cfg(test)]
mod tests {
    use super::*;
    use uom::si::length::meter;
    use uom::si::mass_density::kilogram_per_cubic_meter;
    use uom::si::pressure::pascal;

    #[test]
    fn the_series_sine_agrees_with_the_standard_librarys() {
        // Reference: Rust's f64::sin (libm). Every half angle a reducer can
        // have, and beyond.
        for k in -4000..=4000 {
            let x = f64::from(k) * 1e-3 * std::f64::consts::PI;
            assert!((sin(x) - x.sin()).abs() < 1e-10, "{x}: {} vs {}", sin(x), x.sin());
        }
        assert_eq!(sin(0.0), 0.0);
        assert!((sin(std::f64::consts::FRAC_PI_2) - 1.0).abs() < 1e-15);
    }

    #[test]
    fn ids_round_trip_and_are_unique() {
        for f in Fitting::ALL {
            assert_eq!(Fitting::from_id(f.id()), Some(f));
        }
    }

    #[test]
    fn ten_metres_of_water_is_about_one_bar() {
        // ρ g h with ρ = 1000 kg/m³, h = 10 m: 98 066.5 Pa by definition of g_n.
        let p = static_pressure(Length::new::<meter>(10.0), MassDensity::new::<kilogram_per_cubic_meter>(1000.0));
        assert!((p.get::<pascal>() - 98_066.5).abs() < 1e-9);
    }

    #[test]
    fn kv_by_the_definition() {
        // IEC 60534: Kv is the flow in m³/h of water (ρ₀ = 1000 kg/m³) at a
        // 1 bar drop. Kv 10 at 10 m³/h of water of 1000 kg/m³: exactly 1 bar;
        // at 5 m³/h of a 1050 kg/m³ glycol: 0.25 × 1.05 bar = 26 250 Pa.
        let c = Component::Kv(10.0);
        assert!((c.drop(10.0 / 3600.0, 1000.0, 0.05, 2.0) - 1e5).abs() < 1e-6);
        assert!((c.drop(5.0 / 3600.0, 1050.0, 0.05, 2.0) - 26_250.0).abs() < 1e-6);
        // A coil rated 30 kPa at 2 L/s passes 3 L/s: 30 × 1.5² = 67.5 kPa.
        let coil = Component::Rated { drop_pa: 30e3, flow_m3_s: 2e-3 };
        assert!((coil.drop(3e-3, 998.0, 0.05, 2.0) - 67_500.0).abs() < 1e-6);
    }

    #[test]
    fn crane_reducers_by_hand() {
        // Sudden enlargement 50 → 100 mm (β 0.5): Borda–Carnot (1 − 0.25)² = 0.5625.
        assert!((Component::reducer_k(0.5, 180.0, false) - 0.5625).abs() < 1e-12);
        // 30° conical enlargement: 2.6 sin 15° × 0.5625 = 0.378523.
        assert!((Component::reducer_k(0.5, 30.0, false) - 0.378_523).abs() < 1e-6);
        // 30° conical contraction: 0.8 sin 15° × 0.75 = 0.155291.
        assert!((Component::reducer_k(0.5, 30.0, true) - 0.155_291).abs() < 1e-6);
        // Sudden contraction: 0.5 × √1 × 0.75 = 0.375.
        assert!((Component::reducer_k(0.5, 180.0, true) - 0.375).abs() < 1e-12);
        // Crane butterfly 6 in: 45 × 0.015 = 0.675; 12 in: 35 × 0.013 = 0.455.
        assert!((Component::butterfly_k(6.0) - 0.675).abs() < 1e-12);
        assert!((Component::butterfly_k(12.0) - 0.455).abs() < 1e-12);
    }

    #[test]
    fn three_k_by_hand() {
        // Darby (2001): 90° threaded elbow, Dn = 2 in, at Re = 1e5:
        // 2^0.3 = 1.231144, so K = 800/1e5 + 0.14 (1 + 4.0/1.231144) = 0.008 + 0.14 · 4.249014 = 0.602862.
        let k = Fitting::Elbow90Threaded.k(1e5, 2.0);
        assert!((k - 0.602862).abs() < 1e-5, "{k}");
    }
}
