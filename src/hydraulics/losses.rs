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
//! The choice matters more than it looks: for a 2 in Sch 40 elbow,
//! Dn = 2 against the bore 2.067 moves K by about 2 %. Constants typed from memory of Darby's table and checked
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
            Fitting::Elbow90Welded => {
                "Elbow 90°, welded or flanged, r/D 1 (also for r/D 1.5 long-radius: conservative)"
            }
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

/// Fittings counted on one line, plus a directly entered ΣK and an
/// equivalent length of straight pipe.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Fittings {
    /// Each fitting with how many of it the line has.
    pub counts: Vec<(Fitting, u32)>,
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
    fn three_k_by_hand() {
        // Darby (2001): 90° threaded elbow, Dn = 2 in, at Re = 1e5:
        // 2^0.3 = 1.231144, so K = 800/1e5 + 0.14 (1 + 4.0/1.231144) = 0.008 + 0.14 · 4.249014 = 0.602862.
        let k = Fitting::Elbow90Threaded.k(1e5, 2.0);
        assert!((k - 0.602862).abs() < 1e-5, "{k}");
    }
}
