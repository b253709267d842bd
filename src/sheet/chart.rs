//! Geometry of the Moody chart the page draws: f against Re on log axes,
//! the laminar line, Colebrook curves for a few relative roughnesses and
//! the operating point of every candidate size. Pure numbers and SVG path
//! text, so it is tested natively; the page only places it.

use crate::hydraulics::digits::clamp;
use crate::hydraulics::digits::{Fixed, Short, ShortExp};
use crate::hydraulics::friction::{colebrook, laminar, RE_LAMINAR_MAX, RE_TURBULENT_MIN};
use crate::hydraulics::sizing::Sizing;

/// Drawing width in SVG user units.
pub const WIDTH: f64 = 640.0;
/// Drawing height in SVG user units.
pub const HEIGHT: f64 = 400.0;
const LEFT: f64 = 56.0;
const RIGHT: f64 = 16.0;
const TOP: f64 = 14.0;
const BOTTOM: f64 = 40.0;
/// Reynolds number range drawn.
pub const RE_RANGE: (f64, f64) = (5e2, 1e8);
/// Friction factor range drawn.
pub const F_RANGE: (f64, f64) = (0.008, 0.1);
/// Relative roughness of the reference curves.
pub const CURVES: [f64; 6] = [0.0, 1e-5, 1e-4, 1e-3, 1e-2, 5e-2];

/// x of a Reynolds number.
pub fn x_of(re: f64) -> f64 {
    let t = (re.log10() - RE_RANGE.0.log10()) / (RE_RANGE.1.log10() - RE_RANGE.0.log10());
    LEFT + t * (WIDTH - LEFT - RIGHT)
}

/// y of a friction factor.
pub fn y_of(f: f64) -> f64 {
    let t = (f.log10() - F_RANGE.0.log10()) / (F_RANGE.1.log10() - F_RANGE.0.log10());
    HEIGHT - BOTTOM - t * (HEIGHT - TOP - BOTTOM)
}

/// The plot area: (x, y, width, height).
pub fn plot_area() -> (f64, f64, f64, f64) {
    (LEFT, TOP, WIDTH - LEFT - RIGHT, HEIGHT - TOP - BOTTOM)
}

fn path(points: impl Iterator<Item = (f64, f64)>) -> String {
    let mut out = String::new();
    for (i, (x, y)) in points.enumerate() {
        out.push_str(if i == 0 { "M" } else { "L" });
        out.push_str(&format!("{} {}", Fixed(x, 1), Fixed(y, 1)));
    }
    out
}

/// A labelled curve.
#[derive(Debug, Clone, PartialEq)]
pub struct Curve {
    /// "ε/D = 1e-4", "smooth".
    pub label: String,
    /// SVG path data.
    pub d: String,
    /// Where to put the label.
    pub label_at: (f64, f64),
}

/// One candidate's operating point.
#[derive(Debug, Clone, PartialEq)]
pub struct Point {
    /// Size name.
    pub nominal: &'static str,
    /// Position.
    pub x: f64,
    /// Position.
    pub y: f64,
    /// The proposed size.
    pub proposed: bool,
    /// Meets every limit.
    pub passes: bool,
    /// Drawn at the edge because it is off the chart.
    pub clipped: bool,
}

/// The part of the chart that is the same for every line.
#[derive(Debug, Clone, PartialEq)]
pub struct Chart {
    /// Laminar line f = 64/Re, to the laminar limit.
    pub laminar: String,
    /// Colebrook curves.
    pub curves: Vec<Curve>,
    /// The transition band, x from and to.
    pub transition: (f64, f64),
    /// Re gridlines: (x, label).
    pub x_ticks: Vec<(f64, String)>,
    /// f gridlines: (y, label).
    pub y_ticks: Vec<(f64, String)>,
}

/// The part of the chart that is the same for every line, computed once.
pub fn background() -> &'static Chart {
    static BACKGROUND: std::sync::OnceLock<Chart> = std::sync::OnceLock::new();
    BACKGROUND.get_or_init(build_background)
}

/// The operating points of a line's candidates.
pub fn points(sizing: &Sizing) -> Vec<Point> {
    sizing
        .candidates
        .iter()
        .enumerate()
        .map(|(i, c)| {
            let (re, f) = (c.point.reynolds, c.point.friction_factor);
            let clipped = re < RE_RANGE.0 || re > RE_RANGE.1 || f < F_RANGE.0 || f > F_RANGE.1;
            Point {
                nominal: c.nominal,
                x: x_of(clamp(re, RE_RANGE.0, RE_RANGE.1)),
                y: y_of(clamp(f, F_RANGE.0, F_RANGE.1)),
                proposed: sizing.proposed == Some(i),
                passes: c.passes(),
                clipped,
            }
        })
        .collect()
}

fn build_background() -> Chart {
    let steps = 60;
    // Start where 64/Re enters the chart (Re = 640), so the line never runs
    // along the top edge.
    let re0 = RE_RANGE.0.max(64.0 / F_RANGE.1);
    let laminar_line = path((0..=steps).map(|i| {
        let re = re0 * (RE_LAMINAR_MAX / re0).powf(i as f64 / steps as f64);
        (x_of(re), y_of(laminar(re)))
    }));
    let curves = CURVES
        .iter()
        .map(|&rr| {
            let pts: Vec<(f64, f64)> = (0..=steps)
                .map(|i| {
                    let re = RE_LAMINAR_MAX * (RE_RANGE.1 / RE_LAMINAR_MAX).powf(i as f64 / steps as f64);
                    let f = clamp(colebrook(re, rr).unwrap_or(F_RANGE.0), F_RANGE.0, F_RANGE.1);
                    (x_of(re), y_of(f))
                })
                .collect();
            let label_at = *pts.last().unwrap_or(&(0.0, 0.0));
            Curve {
                label: if rr == 0.0 { "smooth".to_owned() } else { format!("ε/D {}", ShortExp(rr)) },
                d: path(pts.into_iter()),
                label_at,
            }
        })
        .collect();
    let x_ticks = (3..=8).map(|e| (x_of(10f64.powi(e)), format!("1e{e}"))).collect();
    let y_ticks =
        [0.01, 0.015, 0.02, 0.03, 0.04, 0.05, 0.07, 0.1].iter().map(|&f| (y_of(f), Short(f).to_string())).collect();
    Chart {
        laminar: laminar_line,
        curves,
        transition: (x_of(RE_LAMINAR_MAX), x_of(RE_TURBULENT_MIN)),
        x_ticks,
        y_ticks,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn axes_are_logarithmic_and_inside_the_drawing() {
        let (l, t, w, h) = plot_area();
        assert!((x_of(RE_RANGE.0) - l).abs() < 1e-9 && (x_of(RE_RANGE.1) - (l + w)).abs() < 1e-9);
        assert!((y_of(F_RANGE.1) - t).abs() < 1e-9 && (y_of(F_RANGE.0) - (t + h)).abs() < 1e-9);
        // A decade is the same width everywhere.
        assert!(((x_of(1e4) - x_of(1e3)) - (x_of(1e8) - x_of(1e7))).abs() < 1e-9);
    }
}
