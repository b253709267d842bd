//! The pump against the system: a system curve through the duty point, a
//! pump curve through three points, where they cross, and the net positive
//! suction head available. Heads are pressures here (Pa); flows m³/s.
//!
//! - System curve: H = H_static + k·Q², the square law of fully turbulent
//!   flow (common practice; friction factors fall a little as flow rises,
//!   so the real curve lies slightly below it away from the duty point).
//! - Pump curve: the parabola through three points of the maker's curve,
//!   H = a + b·Q + c·Q² (common practice for reading a curve between its
//!   points; not for extrapolating far beyond them).
//! - NPSH available = (p_surface − p_vapour − losses)/(ρ·g) + z_surface
//!   (the definition in e.g. ANSI/HI 9.6.1), the velocity head at the
//!   surface taken as nil.

/// Standard gravity, m/s² (CGPM 1901).
pub const G: f64 = 9.806_65;

/// H = static + k·Q².
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SystemCurve {
    /// Head at no flow, Pa (the static lift of an open system; 0 in a
    /// closed loop).
    pub static_pa: f64,
    /// Pa per (m³/s)².
    pub k: f64,
}

impl SystemCurve {
    /// The curve through a duty point (`q`, `head`) with a static part.
    pub fn through(static_pa: f64, q: f64, head_pa: f64) -> Option<SystemCurve> {
        (q > 0.0 && head_pa.is_finite()).then(|| SystemCurve { static_pa, k: (head_pa - static_pa) / (q * q) })
    }

    /// Head at a flow, Pa.
    pub fn head(&self, q: f64) -> f64 {
        self.static_pa + self.k * q * q
    }
}

/// H = a + b·Q + c·Q².
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PumpCurve {
    /// Shut-off head, Pa.
    pub a: f64,
    /// Pa per m³/s.
    pub b: f64,
    /// Pa per (m³/s)².
    pub c: f64,
}

/// Why three points do not make a pump curve.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum CurveError {
    /// Two points share a flow.
    SameFlow,
    /// Head rises with flow somewhere between the points.
    Rising,
}

impl std::fmt::Display for CurveError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(match self {
            CurveError::SameFlow => "two pump-curve points have the same flow: give three different flows",
            CurveError::Rising => {
                "the pump curve's head rises with flow between the points given: check the points against the \
                 maker's curve"
            }
        })
    }
}

impl PumpCurve {
    /// The parabola through three points (flow, head), in any order.
    ///
    /// # Errors
    /// Two points with one flow, or a head that does not fall as the flow
    /// rises.
    pub fn through(points: [(f64, f64); 3]) -> Result<PumpCurve, CurveError> {
        // Three points in order of flow: swap neighbours (as a sort would,
        // without its code in the module).
        let mut p = points;
        for (i, j) in [(0, 1), (1, 2), (0, 1)] {
            if p[j].0.total_cmp(&p[i].0).is_lt() {
                p.swap(i, j);
            }
        }
        let [(x0, y0), (x1, y1), (x2, y2)] = p;
        if x1 - x0 <= 0.0 || x2 - x1 <= 0.0 {
            return Err(CurveError::SameFlow);
        }
        if y1 > y0 || y2 > y1 {
            return Err(CurveError::Rising);
        }
        // Newton's divided differences.
        let d01 = (y1 - y0) / (x1 - x0);
        let d12 = (y2 - y1) / (x2 - x1);
        let c = (d12 - d01) / (x2 - x0);
        let b = d01 - c * (x0 + x1);
        let a = y0 - b * x0 - c * x0 * x0;
        Ok(PumpCurve { a, b, c })
    }

    /// Head at a flow, Pa.
    pub fn head(&self, q: f64) -> f64 {
        self.a + self.b * q + self.c * q * q
    }
}

/// Where the pump curve meets the system curve, (flow, head), looking only
/// at flows from 0 to `q_max`: `None` when they do not meet there (the
/// pump cannot lift the static head, or runs off its curve).
pub fn operating_point(pump: &PumpCurve, system: &SystemCurve, q_max: f64) -> Option<(f64, f64)> {
    // (c − k)Q² + bQ + (a − Hs) = 0
    let (qa, qb, qc) = (pump.c - system.k, pump.b, pump.a - system.static_pa);
    let roots: Vec<f64> = if qa.abs() < 1e-300 {
        if qb == 0.0 {
            vec![]
        } else {
            vec![-qc / qb]
        }
    } else {
        let disc = qb * qb - 4.0 * qa * qc;
        if disc < 0.0 {
            vec![]
        } else {
            let s = disc.sqrt();
            vec![(-qb + s) / (2.0 * qa), (-qb - s) / (2.0 * qa)]
        }
    };
    roots
        .into_iter()
        .filter(|q| q.is_finite() && *q >= 0.0 && *q <= q_max)
        .min_by(|a, b| a.total_cmp(b))
        .map(|q| (q, system.head(q)))
}

/// NPSH available at the pump inlet, m of the fluid pumped.
pub fn npsh_available_m(surface_abs_pa: f64, vapour_pa: f64, rho: f64, height_m: f64, loss_pa: f64) -> f64 {
    (surface_abs_pa - vapour_pa - loss_pa) / (rho * G) + height_m
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_parabola_goes_through_its_three_points() {
        let pts = [(0.004, 150e3), (0.0, 200e3), (0.008, 40e3)];
        let c = PumpCurve::through(pts).unwrap();
        for (q, h) in pts {
            assert!((c.head(q) - h).abs() < 1e-6, "{q}: {}", c.head(q));
        }
        // The points may come in any order.
        for [i, j, k] in [[0, 1, 2], [0, 2, 1], [1, 0, 2], [1, 2, 0], [2, 0, 1], [2, 1, 0]] {
            assert_eq!(PumpCurve::through([pts[i], pts[j], pts[k]]), Ok(c));
        }
        assert_eq!(PumpCurve::through([(1.0, 3.0), (1.0, 2.0), (2.0, 1.0)]), Err(CurveError::SameFlow));
        assert_eq!(PumpCurve::through([(0.0, 1.0), (1.0, 2.0), (2.0, 0.5)]), Err(CurveError::Rising));
    }

    #[test]
    fn the_operating_point_is_where_the_curves_cross() {
        // Worked by hand: pump H = 200e3 − 1e9·Q², system H = 50e3 +
        // 2e9·Q² (Pa, m³/s). They meet where 150e3 = 3e9·Q², so
        // Q = √(5e-5) = 7.0711e-3 m³/s and H = 50e3 + 2e9 × 5e-5 = 150e3 Pa.
        let pump = PumpCurve { a: 200e3, b: 0.0, c: -1e9 };
        let sys = SystemCurve { static_pa: 50e3, k: 2e9 };
        let (q, h) = operating_point(&pump, &sys, 1.0).unwrap();
        assert!((q - 5e-5f64.sqrt()).abs() < 1e-12 && (h - 150e3).abs() < 1e-6, "{q} {h}");
        // A pump whose shut-off head is below the static lift never meets it.
        let weak = PumpCurve { a: 40e3, b: 0.0, c: -1e9 };
        assert_eq!(operating_point(&weak, &sys, 1.0), None);
        // The system curve goes through its duty point.
        let s = SystemCurve::through(10e3, 0.005, 60e3).unwrap();
        assert!((s.head(0.005) - 60e3).abs() < 1e-9);
    }

    #[test]
    fn npsh_available_of_an_open_tank_at_sea_level() {
        // Water at 20 °C, p_v = 2339 Pa (IAPWS-IF97 saturation line),
        // ρ = 998.2 kg/m³; surface 101 325 Pa, 2 m above the inlet, 5 kPa
        // of suction loss: (101325 − 2339 − 5000)/(998.2 × 9.80665) + 2
        // = 93986/9789.0 + 2 = 11.601 m.
        let n = npsh_available_m(101_325.0, 2339.0, 998.2, 2.0, 5000.0);
        assert!((n - 11.601).abs() < 0.001, "{n}");
    }
}
