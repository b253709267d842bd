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
}

impl VelocityRule {
    /// The limit for a size of nominal diameter `dn_in` inches.
    pub fn max_at(&self, dn_in: f64) -> f64 {
        self.bands
            .iter()
            .find(|b| dn_in <= b.up_to_in + 1e-9)
            .or(self.bands.last())
            .map_or(f64::INFINITY, |b| b.max_m_s)
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
        assert_eq!(h.max_at(1.5), 1.2);
        assert_eq!(h.max_at(2.0), 1.5);
        assert_eq!(h.max_at(48.0), 2.4);
    }
}
