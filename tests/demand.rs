//! Probable demand from fixtures, checked against sources outside the
//! project.
#![cfg(not(target_arch = "wasm32"))]

use headroom::hydraulics::demand::{hunter_gpm, hunter_model_gpm};

/// Hunter's curve as printed in a plumbing-code appendix ("Table for
/// converting demand in WSFU to gpm", Table B.5.4, read on up.codes): WSFU,
/// gpm with flush tanks, gpm with flush valves (NaN where the table prints
/// none). Typed here from the printed table, apart from the copy in
/// `src/hydraulics/demand.rs`, so a slip in either shows.
const PRINTED: &[(f64, f64, f64)] = &[
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
];

#[test]
fn the_sheet_reads_the_printed_curve_row_for_row() {
    for &(fu, tank, valve) in PRINTED {
        assert_eq!(hunter_gpm(fu, false).unwrap(), tank, "{fu} WSFU, tanks");
        if valve.is_finite() {
            assert_eq!(hunter_gpm(fu, true).unwrap(), valve, "{fu} WSFU, valves");
        }
    }
}

/// Hunter's probability model (BMS65) beside the printed curve. What we
/// found, and what this test holds:
/// - flush valves: within 6 % of the printed curve from 10 WSFU (one
///   valve) to 1000 WSFU, most rows within 3 %;
/// - flush tanks: within 6 % from 300 WSFU up; below that the printed
///   curve lies above the pure-tank model (by up to 18 % at 120 WSFU —
///   the codes' tank curve is drawn for systems *predominantly* of tanks,
///   with the other fixtures' heavier use in it), never below it by more
///   than 3 %. That gap is why the sheet follows the printed curve: the
///   model alone would undersize small branches.
#[test]
fn hunters_probability_model_agrees_with_the_printed_curve() {
    let mut report = Vec::new();
    for &(fu, tank, valve) in PRINTED.iter().filter(|r| r.0 >= 10.0) {
        let mt = hunter_model_gpm(fu, false);
        let dt = mt / tank - 1.0;
        report.push(format!("{fu:>6} WSFU  tanks {tank:>6} printed {mt:>7.1} model {:+.1} %", dt * 100.0));
        assert!(dt <= 0.03, "{fu} WSFU: the printed tank curve is below the model by more than 3 %: {dt}");
        if fu >= 300.0 {
            assert!(dt.abs() <= 0.06, "{fu} WSFU tanks: {dt}");
        }
        if valve.is_finite() {
            let mv = hunter_model_gpm(fu, true);
            let dv = mv / valve - 1.0;
            report.push(format!("{fu:>6} WSFU  valves {valve:>5} printed {mv:>7.1} model {:+.1} %", dv * 100.0));
            assert!(dv.abs() <= 0.06, "{fu} WSFU valves: {dv}");
        }
    }
    println!("{}", report.join("\n"));
}
