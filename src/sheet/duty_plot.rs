//! Geometry of the pump-and-system plot: head against flow on linear axes,
//! the system curve through the duty point, the pump curve through its
//! three points, the duty point and where the pump runs. Pure numbers and
//! SVG point lists, tested natively; the page and the print sheet place it.

use super::file::Units;
use super::system::Summary;
use super::units::show;
use crate::hydraulics::digits::clamp;
use crate::hydraulics::digits::Fixed;

/// Drawing width in SVG user units.
pub const WIDTH: f64 = 360.0;
/// Drawing height in SVG user units.
pub const HEIGHT: f64 = 220.0;
const LEFT: f64 = 58.0;
const RIGHT: f64 = 26.0;
const TOP: f64 = 10.0;
const BOTTOM: f64 = 34.0;

/// What the plot draws.
#[derive(Debug, Clone, PartialEq)]
pub struct Plot {
    /// The system curve, SVG `points`.
    pub system: String,
    /// The pump curve, SVG `points`, when there is one.
    pub pump: Option<String>,
    /// The duty point.
    pub duty: (f64, f64),
    /// Where the pump runs, when there is a pump curve.
    pub operating: Option<(f64, f64)>,
    /// Flow ticks: x and label.
    pub x_ticks: Vec<(f64, String)>,
    /// Head ticks: y and label.
    pub y_ticks: Vec<(f64, String)>,
    /// Words for a screen reader.
    pub description: String,
}

/// The plot of a system with a duty point; `None` without one.
pub fn plot(sum: &Summary, u: &Units) -> Option<Plot> {
    let rho = sum.source_density;
    let (curve, q_duty, h_duty) = (sum.curve?, sum.flow_m3_s?, sum.head_pa?);
    let q_pump = sum.pump_points.iter().map(|p| p.0).fold(0.0, f64::max);
    let q_max = (1.4 * q_duty).max(q_pump).max(sum.operating.map_or(0.0, |o| 1.1 * o.0));
    let pump_top = sum.pump.map_or(0.0, |p| p.head(0.0));
    let h_max = 1.1 * curve.head(q_max).max(pump_top).max(h_duty);
    if !(q_max > 0.0 && h_max > 0.0) {
        return None;
    }
    let x = |q: f64| LEFT + q / q_max * (WIDTH - LEFT - RIGHT);
    let y = |h: f64| HEIGHT - BOTTOM - clamp(h, 0.0, h_max) / h_max * (HEIGHT - TOP - BOTTOM);
    let points = |f: &dyn Fn(f64) -> f64, to: f64| {
        (0..=40)
            .map(|i| {
                let q = to * f64::from(i) / 40.0;
                format!("{},{}", Fixed(x(q), 1), Fixed(y(f(q)), 1))
            })
            .collect::<Vec<_>>()
            .join(" ")
    };
    let system = points(&|q| curve.head(q), q_max);
    let pump = sum.pump.map(|p| points(&move |q| p.head(q), q_max.min(1.15 * q_pump)));
    let ticks = |n: usize| (0..=n).map(move |i| i as f64 / n as f64);
    let x_ticks = ticks(4).map(|t| (x(t * q_max), show(t * q_max, u.flow, rho, 2))).collect();
    let y_ticks = ticks(4).map(|t| (y(t * h_max), show(t * h_max, u.pressure, None, 2))).collect();
    let mut description = format!(
        "System curve through the duty point, {} at {}",
        show(q_duty, u.flow, rho, 3),
        show(h_duty, u.pressure, None, 3)
    );
    if let Some((q, h)) = sum.operating {
        description.push_str(&format!(
            "; the pump curve meets it at {} and {}",
            show(q, u.flow, rho, 3),
            show(h, u.pressure, None, 3)
        ));
    }
    Some(Plot {
        system,
        pump,
        duty: (x(q_duty), y(h_duty)),
        operating: sum.operating.map(|(q, h)| (x(q), y(h))),
        x_ticks,
        y_ticks,
        description,
    })
}

/// Left, top, right and bottom of the plotting area.
pub fn frame() -> (f64, f64, f64, f64) {
    (LEFT, TOP, WIDTH - RIGHT, HEIGHT - BOTTOM)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::hydraulics::pump::{PumpCurve, SystemCurve};
    use crate::sheet::file::{System, Units};

    #[test]
    fn the_duty_point_sits_on_the_system_curve_inside_the_frame() {
        let u = Units::defaults(System::Si);
        let sum = Summary {
            paths: Vec::new(),
            head_pa: Some(100e3),
            flow_m3_s: Some(0.01),
            mirrored: false,
            curve: SystemCurve::through(20e3, 0.01, 100e3),
            residuals: Vec::new(),
            source_pa: None,
            outlet_min_pa: None,
            pump: Some(PumpCurve { a: 160e3, b: 0.0, c: -5e8 }),
            pump_points: vec![(0.0, 160e3), (0.01, 110e3), (0.015, 47.5e3)],
            operating: Some((0.0105, 108e3)),
            npsh: None,
            problems: Vec::new(),
            source_density: Some(1000.0),
            gas_inlet_pa: None,
        };
        let p = plot(&sum, &u).unwrap();
        let (l, t, r, b) = frame();
        assert!(p.duty.0 > l && p.duty.0 < r && p.duty.1 > t && p.duty.1 < b, "{:?}", p.duty);
        // Flows drawn to 0.015 m³/s (the last pump point); the system needs
        // 20 + 80 × 1.5² = 200 kPa there, so heads are drawn to 220 kPa and
        // the curve starts at its static head, 20/220 of the way up.
        let first: Vec<f64> = p.system.split(' ').next().unwrap().split(',').map(|v| v.parse().unwrap()).collect();
        assert!((first[0] - l).abs() < 0.1);
        assert!(((b - first[1]) / (b - t) - 20.0 / 220.0).abs() < 0.002, "{first:?}");
        assert!(p.pump.is_some() && p.operating.is_some());
        assert_eq!(p.x_ticks.len(), 5);
        assert!(p.description.contains("meets it at"));
    }
}
