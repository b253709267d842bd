//! Speed of the sizing search (`cargo bench --bench sizing`). Numbers are
//! reported in the README beside tests/reference/bench_fluids.py, which
//! does the same work with the `fluids` package; never asserted in a test.

use headroom::sheet::file::SheetFile;
use headroom::sheet::report;

fn main() {
    divan::main();
}

/// The demo's CHW main: Sch 40 steel, 23 sizes, 9 fittings of 3 kinds.
fn one_line_sheet() -> SheetFile {
    SheetFile::from_json(
        r#"{"format":"headroom-sheet","version":1,"lines":[{
        "name":"bench","flow":"18.5 L/s","fluid":{"kind":"water","temperature":"6 °C","pressure":"350 kPa"},
        "pipe":{"series":"steel-sch40"},"length":"42 m",
        "fittings":[{"fitting":"elbow90-long","count":6},{"fitting":"valve-ball","count":2},{"fitting":"check-swing","count":1}],
        "limits":{"max_drop_per_length":"400 Pa/m","max_velocity":"2.4 m/s"}}]}"#,
    )
    .unwrap()
}

/// One line across every size of its series, from parsed sheet text.
#[divan::bench]
fn size_one_line_all_sizes(bencher: divan::Bencher) {
    let sheet = one_line_sheet();
    let units = sheet.units();
    let line = sheet.lines[0].to_line(&units).unwrap();
    bencher.bench(|| headroom::hydraulics::sizing::size(divan::black_box(&line)).unwrap());
}

/// A 1,000-line sheet: text → quantities → sizing for every line.
#[divan::bench(sample_count = 20)]
fn size_a_1000_line_sheet(bencher: divan::Bencher) {
    let mut sheet = one_line_sheet();
    let template = sheet.lines[0].clone();
    sheet.lines = (0..1000)
        .map(|i| {
            let mut l = template.clone();
            l.flow = format!("{:.2} L/s", 0.5 + (i % 97) as f64 * 0.4);
            l
        })
        .collect();
    bencher.bench(|| report::evaluate(divan::black_box(&sheet)));
}
