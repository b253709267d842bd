//! Probable peak demand of domestic water from the fixtures a line serves.
//!
//! Fixtures are counted in the units of the method the sheet uses, the
//! units add up along the tree, and the flow of every line comes from its
//! own total — never by adding flows, since fixtures are not all open at
//! once.
//!
//! - **Hunter's method** (R. B. Hunter, *Methods of Estimating Loads in
//!   Plumbing Systems*, NBS Building Materials and Structures Report BMS65,
//!   1940): water supply fixture units (WSFU) per fixture from the
//!   International Plumbing Code, Appendix E, Table E103.3(2) (2018
//!   edition), and the probable demand from the tabulated curve the
//!   plumbing codes print (IPC Table E103.3(3) and its counterparts), one
//!   column for systems predominantly of flush tanks, one for flush valves,
//!   read by straight-line interpolation as the codes direct.
//!   [`hunter_model_gpm`] computes the curve from Hunter's probability
//!   model; the reference tests set it beside the table.
//! - **EN 806-3:2006** loading units (LU; 1 LU = 0.1 l/s draw-off) per
//!   outlet from its Table 2, and the design flow from the relation of its
//!   Annex B.
//!
//! The sheet follows the table rather than the model: the model, as Hunter
//! stated it, falls below the printed curve at a few hundred units and
//! fewer (where Hunter drew a smooth curve over a step function), and a
//! flow below the code's would undersize a line.

/// How fixtures become a probable flow.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, serde::Serialize, serde::Deserialize)]
pub enum Method {
    /// Hunter's curve for systems predominantly of flush tanks (the curve
    /// the codes use for hot water and for branches without flush valves).
    #[default]
    #[serde(rename = "hunter-tanks")]
    HunterTanks,
    /// Hunter's curve for systems predominantly of flush valves.
    #[serde(rename = "hunter-valves")]
    HunterValves,
    /// EN 806-3 loading units.
    #[serde(rename = "en806-3")]
    En806,
}

impl Method {
    /// Every method, in picker order.
    pub const ALL: [Method; 3] = [Method::HunterTanks, Method::HunterValves, Method::En806];

    /// Stable id, as in sheet files.
    pub fn id(self) -> &'static str {
        match self {
            Method::HunterTanks => "hunter-tanks",
            Method::HunterValves => "hunter-valves",
            Method::En806 => "en806-3",
        }
    }

    /// Finds a method by id.
    pub fn by_id(id: &str) -> Option<Method> {
        Method::ALL.into_iter().find(|m| m.id() == id)
    }

    /// What the sheet says about the method it uses.
    pub fn label(self) -> &'static str {
        match self {
            Method::HunterTanks => {
                "Hunter's method (NBS BMS65, 1940), flush-tank curve, WSFU of IPC 2018 Table E103.3(2)"
            }
            Method::HunterValves => {
                "Hunter's method (NBS BMS65, 1940), flush-valve curve, WSFU of IPC 2018 Table E103.3(2)"
            }
            Method::En806 => "EN 806-3:2006 loading units, design flow from its Annex B",
        }
    }

    /// The unit fixtures are counted in.
    pub fn unit(self) -> &'static str {
        match self {
            Method::HunterTanks | Method::HunterValves => "WSFU",
            Method::En806 => "LU",
        }
    }

    /// The fixture kinds of this method.
    pub fn kinds(self) -> &'static [Kind] {
        match self {
            Method::HunterTanks | Method::HunterValves => WSFU_KINDS,
            Method::En806 => LU_KINDS,
        }
    }
}

/// Which supply a line carries: the codes give each fixture a cold, a hot
/// and a total (both) load.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum Supply {
    /// Cold and hot together (a service before it divides).
    #[default]
    Total,
    /// Cold water only.
    Cold,
    /// Hot water only.
    Hot,
}

/// One kind of fixture or outlet.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Kind {
    /// Stable id in sheet files.
    pub id: &'static str,
    /// Name for the picker.
    pub label: &'static str,
    /// Units on the cold supply (`None`: it takes no cold water).
    pub cold: Option<f64>,
    /// Units on the hot supply (`None`: it takes no hot water).
    pub hot: Option<f64>,
    /// Units on the combined supply.
    pub total: f64,
}

impl Kind {
    /// Units of one fixture on a supply (0 when it takes none of it).
    pub fn units(&self, supply: Supply) -> f64 {
        match supply {
            Supply::Total => self.total,
            Supply::Cold => self.cold.unwrap_or(0.0),
            Supply::Hot => self.hot.unwrap_or(0.0),
        }
    }
}

const fn k(id: &'static str, label: &'static str, cold: Option<f64>, hot: Option<f64>, total: f64) -> Kind {
    Kind { id, label, cold, hot, total }
}

/// WSFU per fixture, IPC 2018 Appendix E Table E103.3(2). The rows down to
/// the service sink were read from the printed table; the rows from the
/// shower on are from memory of the same table — check them against the
/// code in force.
pub const WSFU_KINDS: &[Kind] = &[
    k("bathroom-group-tank", "Bathroom group, private, flush tank", Some(2.7), Some(1.5), 3.6),
    k("bathroom-group-valve", "Bathroom group, private, flush valve", Some(6.0), Some(3.0), 8.0),
    k("bathtub-private", "Bathtub, private", Some(1.0), Some(1.0), 1.4),
    k("bathtub-public", "Bathtub, public", Some(3.0), Some(3.0), 4.0),
    k("bidet-private", "Bidet, private", Some(1.5), Some(1.5), 2.0),
    k("combination-fixture", "Combination fixture, private", Some(2.25), Some(2.25), 3.0),
    k("dishwasher-private", "Dishwashing machine, private", None, Some(1.4), 1.4),
    k("drinking-fountain", "Drinking fountain, offices etc.", Some(0.25), None, 0.25),
    k("kitchen-sink-private", "Kitchen sink, private", Some(1.0), Some(1.0), 1.4),
    k("kitchen-sink-commercial", "Kitchen sink, hotel or restaurant", Some(3.0), Some(3.0), 4.0),
    k("laundry-tray", "Laundry trays (1 to 3), private", Some(1.0), Some(1.0), 1.4),
    k("lavatory-private", "Lavatory, private", Some(0.5), Some(0.5), 0.7),
    k("lavatory-public", "Lavatory, public", Some(1.5), Some(1.5), 2.0),
    k("service-sink", "Service sink, offices etc.", Some(2.25), Some(2.25), 3.0),
    k("shower-public", "Shower head, public", Some(3.0), Some(3.0), 4.0),
    k("shower-private", "Shower head, private", Some(1.0), Some(1.0), 1.4),
    k("urinal-valve-1in", "Urinal, public, 1 in flush valve", Some(10.0), None, 10.0),
    k("urinal-valve-3-4in", "Urinal, public, 3/4 in flush valve", Some(5.0), None, 5.0),
    k("urinal-tank", "Urinal, public, flush tank", Some(3.0), None, 3.0),
    k("washer-private", "Washing machine (8 lb), private", Some(1.0), Some(1.0), 1.4),
    k("washer-public", "Washing machine (8 lb), public", Some(2.25), Some(2.25), 3.0),
    k("washer-public-15lb", "Washing machine (15 lb), public", Some(3.0), Some(3.0), 4.0),
    k("wc-private-valve", "Water closet, private, flush valve", Some(6.0), None, 6.0),
    k("wc-private-tank", "Water closet, private, flush tank", Some(2.2), None, 2.2),
    k("wc-public-valve", "Water closet, public, flush valve", Some(10.0), None, 10.0),
    k("wc-public-tank", "Water closet, public, flush tank", Some(5.0), None, 5.0),
    k("wc-flushometer-tank", "Water closet, flushometer tank", Some(2.0), None, 2.0),
];

/// LU per outlet, EN 806-3:2006 Table 2 (read from the printed table). The
/// standard gives one value per outlet, the same on cold and hot.
pub const LU_KINDS: &[Kind] = &[
    k("washbasin", "Washbasin, handbasin, bidet, WC cistern", Some(1.0), Some(1.0), 1.0),
    k(
        "sink-domestic",
        "Domestic kitchen sink, washing or dishwashing machine, sink, shower head",
        Some(2.0),
        Some(2.0),
        2.0,
    ),
    k("urinal-valve", "Urinal flush valve", Some(3.0), Some(3.0), 3.0),
    k("bath-domestic", "Bath, domestic", Some(4.0), Some(4.0), 4.0),
    k("tap-garden", "Taps (garden, garage)", Some(5.0), Some(5.0), 5.0),
    k("sink-non-domestic", "Non-domestic kitchen sink DN 20, bath non-domestic", Some(8.0), Some(8.0), 8.0),
    k("flush-valve-dn20", "Flush valve DN 20", Some(15.0), Some(15.0), 15.0),
];

/// Finds a kind of a method by id.
pub fn kind(method: Method, id: &str) -> Option<&'static Kind> {
    method.kinds().iter().find(|k| k.id == id)
}

/// Why a probable flow cannot be given.
#[derive(Debug, Clone, PartialEq)]
pub enum DemandError {
    /// More units than the method's curve covers.
    BeyondCurve {
        /// The total.
        units: f64,
        /// WSFU or LU.
        unit: &'static str,
        /// Short name of the method.
        method: &'static str,
        /// Where its curve ends.
        max: f64,
    },
}

impl std::fmt::Display for DemandError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            DemandError::BeyondCurve { units, unit, method, max } => write!(
                f,
                "{} {unit} is beyond the {method} curve, which ends at {} {unit}: size this main by another \
                 method",
                crate::hydraulics::digits::Short(*units),
                crate::hydraulics::digits::Short(*max)
            ),
        }
    }
}

impl std::error::Error for DemandError {}

/// Hunter's curve as the plumbing codes print it: (WSFU, gpm with flush
/// tanks, gpm with flush valves). Rows 3–14 and 120–1000 were read from a
/// printed code-appendix table ("Table for converting demand in WSFU to
/// gpm"); rows 15–100 and 1250–3000 are from memory of IPC Table E103.3(3)
/// — the reference tests check the upper ones against Hunter's model.
/// Below 5 WSFU the flush-valve column is not printed: one flush valve is
/// 10 WSFU on its own.
pub const HUNTER_TABLE: &[(f64, f64, f64)] = &[
    (3.0, 3.0, f64::NAN),
    (4.0, 4.0, f64::NAN),
    (5.0, 4.5, 22.0),
    (6.0, 5.0, 23.0),
    (7.0, 6.0, 24.0),
    (8.0, 7.0, 25.0),
    (9.0, 7.5, 26.0),
    (10.0, 8.0, 27.0),
    (11.0, 8.5, 28.0),
    (12.0, 9.0, 29.0),
    (13.0, 10.0, 29.5),
    (14.0, 10.5, 30.0),
    (15.0, 11.0, 31.0),
    (16.0, 12.0, 32.0),
    (18.0, 13.0, 33.0),
    (20.0, 14.0, 35.0),
    (25.0, 17.0, 38.0),
    (30.0, 20.0, 41.0),
    (35.0, 22.5, 43.0),
    (40.0, 25.0, 46.0),
    (45.0, 27.0, 48.0),
    (50.0, 29.0, 51.0),
    (60.0, 32.0, 55.0),
    (70.0, 35.0, 58.5),
    (80.0, 38.0, 62.0),
    (90.0, 41.0, 64.5),
    (100.0, 43.5, 67.5),
    (120.0, 49.0, 74.0),
    (140.0, 53.0, 78.0),
    (160.0, 57.0, 83.0),
    (180.0, 61.0, 87.0),
    (200.0, 65.0, 91.0),
    (225.0, 70.0, 95.0),
    (250.0, 75.0, 100.0),
    (300.0, 85.0, 110.0),
    (400.0, 105.0, 125.0),
    (500.0, 125.0, 140.0),
    (750.0, 170.0, 175.0),
    (1000.0, 210.0, 210.0),
    (1250.0, 240.0, 240.0),
    (1500.0, 270.0, 270.0),
    (1750.0, 297.0, 297.0),
    (2000.0, 325.0, 325.0),
    (2500.0, 380.0, 380.0),
    (3000.0, 433.0, 433.0),
];

const GPM: f64 = 3.785_411_784e-3 / 60.0;

/// Probable demand, US gpm, from Hunter's curve as tabulated, by
/// straight-line interpolation between rows. Below the first row the first
/// row's flow (no fewer than one fixture's worth: conservative); zero
/// units, zero flow.
///
/// # Errors
/// Beyond the last row.
pub fn hunter_gpm(wsfu: f64, valves: bool) -> Result<f64, DemandError> {
    if wsfu <= 0.0 {
        return Ok(0.0);
    }
    let col = |r: &(f64, f64, f64)| if valves { r.2 } else { r.1 };
    let rows: Vec<(f64, f64)> = HUNTER_TABLE.iter().filter(|r| col(r).is_finite()).map(|r| (r.0, col(r))).collect();
    let (first, last) = (rows[0], rows[rows.len() - 1]);
    if wsfu > last.0 {
        return Err(DemandError::BeyondCurve { units: wsfu, unit: "WSFU", method: "Hunter", max: last.0 });
    }
    if wsfu <= first.0 {
        return Ok(first.1);
    }
    let i = rows.iter().position(|r| r.0 >= wsfu).unwrap_or(rows.len() - 1);
    let (a, b) = (rows[i - 1], rows[i]);
    Ok(a.1 + (b.1 - a.1) * (wsfu - a.0) / (b.0 - a.0))
}

/// Hunter's probability model: `n` fixtures each drawing `q_gpm` for `t_s`
/// seconds once every `period_s` seconds in the busiest period; `q` times
/// the number of fixtures `m` so large that more than `m` run at once no
/// more than 1 % of the time (the binomial distribution with p = t/T) is
/// a step function of `n`, and Hunter drew his curve smoothly through its
/// steps: here, straight through each step's first point (the fewest
/// fixtures that need `m`). For the two curves Hunter took, as reported
/// from BMS65 (from memory): a flush valve 27 gpm for 9 s every 5 min,
/// 10 WSFU; a flush tank 4 gpm for 60 s every 5 min, 5 WSFU.
pub fn hunter_model_gpm(wsfu: f64, valves: bool) -> f64 {
    let (q, t, period, weight) = if valves { (27.0, 9.0, 300.0, 10.0) } else { (4.0, 60.0, 300.0, 5.0) };
    let p = t / period;
    let n = (wsfu / weight).floor().max(1.0) as u64;
    let m = binomial_percentile(n, p, 0.99);
    // The first n of this step, and of the next.
    let mut lo = n;
    while lo > 1 && binomial_percentile(lo - 1, p, 0.99) == m {
        lo -= 1;
    }
    let mut hi = n + 1;
    while binomial_percentile(hi, p, 0.99) == m {
        hi += 1;
    }
    let (x0, x1) = (lo as f64 * weight, hi as f64 * weight);
    let (y0, y1) = (m as f64 * q, (m + 1) as f64 * q);
    y0 + (y1 - y0) * (wsfu.max(x0) - x0) / (x1 - x0)
}

/// The smallest `m` with P(X ≤ m) ≥ `level` for X ~ Binomial(n, p).
pub fn binomial_percentile(n: u64, p: f64, level: f64) -> u64 {
    // Terms by the recurrence P(k+1) = P(k)·(n−k)/(k+1)·p/(1−p), in logs
    // so large n does not underflow the first term.
    let mut log_term = n as f64 * (1.0 - p).ln();
    let mut cumulative = log_term.exp();
    let mut m = 0;
    while cumulative < level && m < n {
        log_term += ((n - m) as f64).ln() - ((m + 1) as f64).ln() + p.ln() - (1.0 - p).ln();
        m += 1;
        cumulative += log_term.exp();
    }
    m
}

/// EN 806-3 design flow, l/s, from the total loading units of a section
/// and the largest single outlet's: the standard's Annex B chart, a
/// straight line on log–log axes from the largest outlet's own draw-off
/// (its LU / 10 l/s) to 1.7 l/s at 300 LU, then one line on to 9 l/s at
/// 5000 LU. The standard gives the relation as a chart, not an equation;
/// these anchor points were read from a description of the chart, not from
/// the standard itself — check them against your copy.
///
/// # Errors
/// Beyond 5000 LU.
pub fn en806_l_s(total_lu: f64, largest_lu: f64) -> Result<f64, DemandError> {
    if total_lu <= 0.0 {
        return Ok(0.0);
    }
    if total_lu > 5000.0 {
        return Err(DemandError::BeyondCurve { units: total_lu, unit: "LU", method: "EN 806-3", max: 5000.0 });
    }
    let largest = crate::hydraulics::digits::clamp(largest_lu, f64::MIN_POSITIVE, total_lu);
    let line = |(x0, y0): (f64, f64), (x1, y1): (f64, f64), x: f64| {
        (y0.ln() + (y1.ln() - y0.ln()) * (x.ln() - x0.ln()) / (x1.ln() - x0.ln())).exp()
    };
    let own = (largest, largest / 10.0);
    Ok(if total_lu <= largest {
        own.1
    } else if total_lu <= 300.0 {
        line(own, (300.0, 1.7), total_lu)
    } else {
        line((300.0, 1.7), (5000.0, 9.0), total_lu)
    })
}

/// Probable flow, m³/s, of `units` (WSFU or LU) whose largest single
/// fixture has `largest` units.
///
/// # Errors
/// Beyond the method's curve.
pub fn probable_flow(method: Method, units: f64, largest: f64) -> Result<f64, DemandError> {
    match method {
        Method::HunterTanks => hunter_gpm(units, false).map(|g| g * GPM),
        Method::HunterValves => hunter_gpm(units, true).map(|g| g * GPM),
        Method::En806 => en806_l_s(units, largest).map(|l| l * 1e-3),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_table_reads_its_rows_and_interpolates_between_them() {
        assert_eq!(hunter_gpm(10.0, false), Ok(8.0));
        assert_eq!(hunter_gpm(10.0, true), Ok(27.0));
        assert_eq!(hunter_gpm(1000.0, true), Ok(210.0));
        // Halfway between 200 (65) and 225 (70).
        assert!((hunter_gpm(212.5, false).unwrap() - 67.5).abs() < 1e-12);
        // Below the first row: the first row's flow.
        assert_eq!(hunter_gpm(1.0, false), Ok(3.0));
        assert_eq!(hunter_gpm(2.0, true), Ok(22.0));
        assert_eq!(hunter_gpm(0.0, true), Ok(0.0));
        assert!(matches!(hunter_gpm(3500.0, true), Err(DemandError::BeyondCurve { .. })));
    }

    #[test]
    fn both_columns_rise_with_the_load_and_meet_at_1000_wsfu() {
        for w in HUNTER_TABLE.windows(2) {
            assert!(w[1].0 > w[0].0 && w[1].1 > w[0].1, "{w:?}");
            if w[0].2.is_finite() {
                assert!(w[1].2 > w[0].2, "{w:?}");
            }
        }
        for r in HUNTER_TABLE.iter().filter(|r| r.2.is_finite()) {
            assert!(r.2 >= r.1, "flush valves never demand less than tanks: {r:?}");
        }
    }

    #[test]
    fn the_binomial_percentile_counts_right() {
        // One tank (p = 0.2): P(0) = 0.8 < 0.99, so m = 1.
        assert_eq!(binomial_percentile(1, 0.2, 0.99), 1);
        // Two tanks: P(X ≤ 1) = 0.64 + 0.32 = 0.96 < 0.99 → m = 2.
        assert_eq!(binomial_percentile(2, 0.2, 0.99), 2);
        // Ten valves (p = 0.03): P(X ≤ 2) = 0.9972 ≥ 0.99 and P(X ≤ 1) = 0.9655.
        assert_eq!(binomial_percentile(10, 0.03, 0.99), 2);
        assert_eq!(binomial_percentile(0, 0.5, 0.99), 0);
    }

    #[test]
    fn en806_starts_at_the_largest_outlet_and_grows_slower_than_the_sum() {
        // A single shower head (2 LU) draws its own 0.2 l/s.
        assert!((en806_l_s(2.0, 2.0).unwrap() - 0.2).abs() < 1e-12);
        assert!((en806_l_s(300.0, 1.0).unwrap() - 1.7).abs() < 1e-12);
        assert!((en806_l_s(5000.0, 4.0).unwrap() - 9.0).abs() < 1e-9);
        let mut last = 0.0;
        for lu in [2.0, 5.0, 10.0, 40.0, 100.0, 299.0, 301.0, 1000.0, 4000.0] {
            let q = en806_l_s(lu, 2.0).unwrap();
            assert!(q > last && q <= lu / 10.0 + 1e-12, "{lu}: {q}");
            last = q;
        }
        assert!(en806_l_s(6000.0, 2.0).is_err());
    }

    #[test]
    fn kinds_are_found_by_id_and_have_their_supplies() {
        assert_eq!(kind(Method::HunterTanks, "lavatory-public").map(|k| k.units(Supply::Hot)), Some(1.5));
        assert_eq!(kind(Method::HunterValves, "wc-public-valve").map(|k| k.units(Supply::Hot)), Some(0.0));
        assert_eq!(kind(Method::En806, "bath-domestic").map(|k| k.total), Some(4.0));
        assert!(kind(Method::En806, "lavatory-public").is_none());
        for m in Method::ALL {
            assert_eq!(Method::by_id(m.id()), Some(m));
        }
    }
}
