//! End-to-end: the release `dist/` served on 127.0.0.1, driven in headless
//! Chromium over WebDriver. Needs `trunk build --release` first, so the tests
//! are ignored by plain `cargo test`; scripts/test runs them with
//! `--include-ignored` right after the build.
#![cfg(not(target_arch = "wasm32"))]

mod support;

use headroom::sheet::quick::velocity_m_per_s;
use support::Harness;

#[tokio::test(flavor = "multi_thread")]
#[ignore = "needs dist/ and chromedriver: scripts/test runs it"]
async fn typing_a_flow_shows_the_cores_velocity() {
    let mut h = Harness::start(1024, 768).await;
    h.open("/", "quick-flow").await;

    h.type_into("quick-flow", "4,2").await;
    h.type_into("quick-bore", "40.9").await;
    let expected = velocity_m_per_s("4.2", "40.9").unwrap();
    h.expect_text("quick-velocity", &format!("{expected:.3} m/s")).await;
    h.expect_text("quick-flow-error", "").await;

    h.type_into("quick-bore", "0").await;
    h.expect_text("quick-bore-error", "bore '0' must be positive").await;
    h.expect_text("quick-velocity", "—").await;

    h.screenshot("foundation-landscape.png").await;
    h.finish().await;
}
