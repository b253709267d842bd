//! Bore geometry: flow area and mean velocity.

use std::f64::consts::FRAC_PI_4;

use uom::si::f64::{Area, Length, Velocity, VolumeRate};

/// Flow area of a full circular bore, A = π·D²/4.
pub fn flow_area(bore: Length) -> Area {
    FRAC_PI_4 * bore * bore
}

/// Mean (bulk) velocity of a volume flow through a full circular bore,
/// V = Q / A, the continuity equation for incompressible flow.
pub fn mean_velocity(flow: VolumeRate, bore: Length) -> Velocity {
    flow / flow_area(bore)
}

#[cfg(test)]
mod tests {
    use super::*;
    use uom::si::area::square_meter;
    use uom::si::length::millimeter;
    use uom::si::velocity::meter_per_second;
    use uom::si::volume_rate::{cubic_meter_per_second, liter_per_second};

    #[test]
    fn area_of_a_one_metre_bore_is_a_quarter_pi() {
        let a = flow_area(Length::new::<uom::si::length::meter>(1.0));
        assert!((a.get::<square_meter>() - std::f64::consts::PI / 4.0).abs() < 1e-15);
    }

    #[test]
    fn velocity_by_hand() {
        // Hand check: 2.5 L/s through a 52.5 mm bore.
        // A = π/4 · 0.0525² = 2.164754e-3 m²; V = 0.0025 / A = 1.154866 m/s.
        let v = mean_velocity(VolumeRate::new::<liter_per_second>(2.5), Length::new::<millimeter>(52.5));
        assert!((v.get::<meter_per_second>() - 1.154_866).abs() < 1e-6);
    }

    #[test]
    fn velocity_scales_with_the_inverse_square_of_the_bore() {
        let q = VolumeRate::new::<cubic_meter_per_second>(0.01);
        let v1 = mean_velocity(q, Length::new::<millimeter>(100.0));
        let v2 = mean_velocity(q, Length::new::<millimeter>(200.0));
        assert!(((v1 / v2).value - 4.0).abs() < 1e-12);
    }
}
