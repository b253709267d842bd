//! Velocity limits that depend on the size of the pipe: small bores run
//! slower (noise in occupied rooms, erosion–corrosion of thin copper), large
//! mains may run faster. Every table here is common practice — the shape of
//! the bands printed in design guides and office standards, values from
//! memory, not from one source — and says so; a line's own maximum
//! velocity, when it has one too, still applies (the lower of the two).

/// One band: sizes up to `up_to_in` (nominal inches, inclusive) may run at
/// most `max_m_s`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Band {
    /// Largest nominal diameter of the band, inches.
    pub up_to_in: f64,
    /// Largest mean velocity, m/s.
    pub max_m_s: f64,
}

/// A velocity-by-size table.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct VelocityRule {
    /// Stable id in sheet files.
    pub id: &'static str,
    /// Name for the picker.
    pub label: &'static str,
    /// Where the numbers come from.
    pub source: &'static str,
    /// Bands, smallest first; the last covers every larger size.
    pub bands: &'static [Band],
    /// A lower ceiling for water hotter than a threshold, whatever the size.
    pub hot: Option<HotCap>,
}

/// A ceiling for hot water: above `above_c` °C no size may run faster than
/// `max_m_s`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct HotCap {
    /// Threshold temperature, °C (the cap applies above it).
    pub above_c: f64,
    /// Largest mean velocity above the threshold, m/s.
    pub max_m_s: f64,
}

impl VelocityRule {
    /// The limit for a size of nominal diameter `dn_in` inches carrying
    /// fluid at `t_c` °C.
    pub fn max_at(&self, dn_in: f64, t_c: f64) -> f64 {
        let by_size = self
            .bands
            .iter()
            .find(|b| dn_in <= b.up_to_in + 1e-9)
            .or(self.bands.last())
            .map_or(f64::INFINITY, |b| b.max_m_s);
        match self.hot {
            Some(h) if t_c > h.above_c => by_size.min(h.max_m_s),
            _ => by_size,
        }
    }
}

/// Every velocity-by-size table, in picker order.
pub const RULES: &[VelocityRule] = &[
    VelocityRule {
        id: "hydronic",
        label: "Closed-loop water in occupied buildings",
        source: "common practice (from memory): 1.2 m/s to 1-1/2 in, 1.5 m/s to 3 in, 2.1 m/s to 6 in, \
                 2.4 m/s above; lower in small bores to keep flow noise out of occupied rooms",
        bands: &[
            Band { up_to_in: 1.5, max_m_s: 1.2 },
            Band { up_to_in: 3.0, max_m_s: 1.5 },
            Band { up_to_in: 6.0, max_m_s: 2.1 },
            Band { up_to_in: f64::INFINITY, max_m_s: 2.4 },
        ],
        hot: None,
    },
    VelocityRule {
        id: "copper-cold",
        label: "Copper, domestic cold water",
        source: "common practice (from memory): 1.5 m/s to 3/4 in, 2.0 m/s to 2 in, 2.4 m/s above — under \
                 the 8 ft/s (2.4 m/s) ceiling the Copper Development Association's Copper Tube Handbook gives \
                 for cold water, lower in small tube against erosion–corrosion",
        bands: &[
            Band { up_to_in: 0.75, max_m_s: 1.5 },
            Band { up_to_in: 2.0, max_m_s: 2.0 },
            Band { up_to_in: f64::INFINITY, max_m_s: 2.4 },
        ],
        hot: None,
    },
    VelocityRule {
        id: "copper-hot",
        label: "Copper, domestic hot water",
        source: "Copper Development Association, The Copper Tube Handbook (guidance from memory; check the \
                 current edition): hot water at most 5 ft/s (1.5 m/s) up to about 140 °F (60 °C), and 2 to \
                 3 ft/s where it routinely runs hotter — 0.9 m/s used here above 60 °C; 1.2 m/s in tube up to \
                 3/4 in is common practice against erosion–corrosion",
        bands: &[Band { up_to_in: 0.75, max_m_s: 1.2 }, Band { up_to_in: f64::INFINITY, max_m_s: 1.5 }],
        hot: Some(HotCap { above_c: 60.0, max_m_s: 0.9 }),
    },
];

/// Finds a rule by id.
pub fn rule(id: &str) -> Option<&'static VelocityRule> {
    RULES.iter().find(|r| r.id == id)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn bands_run_upward_and_cover_every_size() {
        for r in RULES {
            for w in r.bands.windows(2) {
                assert!(w[0].up_to_in < w[1].up_to_in && w[0].max_m_s <= w[1].max_m_s, "{}", r.id);
            }
            assert_eq!(r.bands.last().unwrap().up_to_in, f64::INFINITY);
            assert_eq!(rule(r.id).map(|x| x.id), Some(r.id));
        }
        let h = rule("hydronic").unwrap();
        assert_eq!(h.max_at(1.5, 10.0), 1.2);
        assert_eq!(h.max_at(2.0, 10.0), 1.5);
        assert_eq!(h.max_at(48.0, 90.0), 2.4);
    }

    #[test]
    fn hot_copper_slows_down_above_60_c() {
        // Copper Tube Handbook (CDA): 5 ft/s to 140 °F, 2–3 ft/s hotter.
        let r = rule("copper-hot").unwrap();
        assert_eq!(r.max_at(2.0, 55.0), 1.5);
        assert_eq!(r.max_at(0.5, 55.0), 1.2);
        assert_eq!(r.max_at(2.0, 65.0), 0.9);
        assert!((r.max_at(2.0, 59.9) * 3.2808 - 5.0).abs() < 0.1, "1.5 m/s is 5 ft/s");
    }
}
