//! End-to-end: the release `dist/` served on 127.0.0.1, driven in headless
//! Chromium over WebDriver as a new user would drive it. Needs `trunk build
//! --release` first, so the tests are ignored by plain `cargo test`;
//! scripts/test runs them with `--include-ignored` right after the build.
#![cfg(not(target_arch = "wasm32"))]

mod support;

use fantoccini::Locator;
use headroom::sheet::file::{FluidFile, LimitsFile, LineFile, MethodName, PipeFile, System, Units};
use headroom::sheet::report::{evaluate_line, Outcome};
use headroom::sheet::units;
use support::Harness;

/// The line the test types, as the core sees it.
fn typed_line() -> LineFile {
    LineFile {
        name: "CHW main, plant room".into(),
        flow: "18.5".into(),
        fluid: FluidFile::Water { temperature: "6".into(), pressure: Some("350".into()) },
        pipe: PipeFile::Series("steel-sch40".into()),
        roughness: None,
        aged: false,
        length: "42".into(),
        fittings: vec![],
        extra_k: None,
        equivalent_length: None,
        rise: None,
        method: MethodName::DarcyWeisbach,
        hazen_williams_c: None,
        limits: LimitsFile {
            max_drop_per_length: Some("400".into()),
            max_total_drop: None,
            max_velocity: Some("2.4".into()),
            min_velocity: None,
        },
        check_size: None,
    }
}

fn core(line: &LineFile, system: System) -> Outcome {
    evaluate_line(1, line, &Units::defaults(system)).outcome.expect("the typed line is valid")
}

#[tokio::test(flavor = "multi_thread")]
#[ignore = "needs dist/ and chromedriver: scripts/test runs it"]
async fn a_new_user_sizes_a_line_adds_another_and_switches_units() {
    let mut h = Harness::start(1024, 768).await;
    h.open("/", "empty").await;

    // One full line, typed field by field.
    h.click("add-line").await;
    h.type_into("line-name", "CHW main, plant room").await;
    h.type_into("flow", "18.5").await;
    h.select("fluid-kind", "water").await;
    h.type_into("fluid-temperature", "6").await;
    h.type_into("fluid-pressure", "350").await;
    h.select("pipe-series", "steel-sch40").await;
    h.type_into("length", "42").await;
    h.type_into("max-drop-per-length", "400").await;
    h.type_into("max-velocity", "2.4").await;

    let si = Units::defaults(System::Si);
    let o = core(&typed_line(), System::Si);
    let c = &o.sizing.candidates[o.shown.unwrap()];
    let rho = o.sizing.properties.density_kg_m3();
    h.expect_text("proposed-size", c.nominal).await;
    h.expect_text("answer-drop-per-length", &units::show(c.point.drop_per_length.value, si.drop_per_length, Some(rho), 3)).await;
    h.expect_text("answer-velocity", &units::show(c.point.velocity.value, si.velocity, Some(rho), 3)).await;

    // A second line.
    h.click("add-line").await;
    h.type_into("flow", "3").await;
    h.type_into("length", "20").await;
    let rows = h.client.find_all(Locator::Css("[data-testid=roster-row]")).await.unwrap();
    assert_eq!(rows.len(), 2);
    let sizes = h.client.find_all(Locator::Css("[data-testid=row-size]")).await.unwrap();
    assert_eq!(sizes[0].text().await.unwrap(), c.nominal);
    assert_ne!(sizes[1].text().await.unwrap(), "check inputs");

    // Back to the first line, then US units: displayed values convert.
    let picks = h.client.find_all(Locator::Css("[data-testid=roster-row] .pick")).await.unwrap();
    picks[0].click().await.unwrap();
    h.expect_text("proposed-size", c.nominal).await;
    h.click("units-us").await;
    let us = Units::defaults(System::Us);
    h.expect_text("answer-velocity", &units::show(c.point.velocity.value, us.velocity, Some(rho), 3)).await;
    h.expect_text("answer-drop-per-length", &units::show(c.point.drop_per_length.value, us.drop_per_length, Some(rho), 3)).await;
    assert!(h.text("answer-velocity").await.ends_with("ft/s"));
    // The typed flow was rewritten in gpm, meaning the same flow.
    let flow = h.value("flow").await;
    // 18.5 L/s × 60 s/min ÷ 3.785411784 L/gal = 293.2309 US gpm, shown to 6 figures.
    assert_eq!(flow, "293.231", "18.5 L/s in US gpm");
    h.expect_text("proposed-size", c.nominal).await;

    for (name, w, hgt) in [("tablet-portrait.png", 768, 1024), ("tablet-landscape.png", 1024, 768), ("phone.png", 390, 844)] {
        h.client.set_window_size(w, hgt).await.unwrap();
        h.screenshot(name).await;
        h.client.execute("document.querySelector('[data-testid=results]').scrollIntoView()", vec![]).await.unwrap();
        h.screenshot(&format!("results-{name}")).await;
        h.client.execute("window.scrollTo(0, 0)", vec![]).await.unwrap();
    }
    h.finish().await;
}

#[tokio::test(flavor = "multi_thread")]
#[ignore = "needs dist/ and chromedriver: scripts/test runs it"]
async fn edit_to_results_time_on_a_200_line_sheet() {
    let mut h = Harness::start(1280, 900).await;
    h.open("/", "open-demo").await;
    h.click("open-demo").await;
    h.wait_for("proposed-size").await;
    let n = h.client.find_all(Locator::Css("[data-testid=roster-row]")).await.unwrap().len();
    for _ in n..200 {
        // Duplicate the selected (first) line's copy chain: every line sized.
        h.client
            .execute("document.querySelector('[data-testid=row-duplicate]').click()", vec![])
            .await
            .unwrap();
    }
    let rows = h.client.find_all(Locator::Css("[data-testid=roster-row]")).await.unwrap();
    assert_eq!(rows.len(), 200);
    // Time from an edit to the updated results, inside the page: dispatch
    // the input, then wait one task turn (setTimeout 0), after which the
    // reactive updates have run. An upper bound: it includes that turn.
    let script = r#"
        const done = arguments[arguments.length - 1];
        const input = document.querySelector('[data-testid=flow]');
        const out = document.querySelector('[data-testid=proposed-size]');
        const times = [];
        let k = 0;
        function step() {
            if (k === 25) { done(times); return; }
            const t0 = performance.now();
            input.value = String(10 + k);
            input.dispatchEvent(new Event('input', { bubbles: true }));
            setTimeout(() => { times.push(performance.now() - t0); k++; step(); }, 0);
        }
        step();
    "#;
    let v = h.client.execute_async(script, vec![]).await.unwrap();
    let mut times: Vec<f64> = v.as_array().unwrap().iter().map(|t| t.as_f64().unwrap()).collect();
    times.sort_by(f64::total_cmp);
    println!(
        "200-line sheet, release build, edit → updated results: median {:.1} ms, worst {:.1} ms over {} edits",
        times[times.len() / 2],
        times[times.len() - 1],
        times.len()
    );
    // The page still shows the core's answer for the last flow typed.
    let last = h.value("flow").await;
    assert_eq!(last, "34");
    h.finish().await;
}
