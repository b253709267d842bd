//! Headroom: an offline, in-browser pipe sizing worksheet.
//!
//! The crate has three rooms and the arrows between them point one way:
//!
//! - [`hydraulics`]: pure Rust, quantities with dimensions in their types
//!   (`uom`); no web crates, no DOM, no storage, no clock. Builds and tests
//!   natively.
//! - [`sheet`]: the worksheet model. Text typed by a person becomes
//!   quantities here (units live only at this boundary) and results become
//!   text again.
//! - `ui` (wasm32 only): Leptos components that read and write the sheet.
//!
//! Keeping the web crates behind `cfg(target_arch = "wasm32")` is the design
//! choice that lets `cargo test` check every number on the host, fast, with no
//! browser.

pub mod hydraulics;
pub mod sheet;

#[cfg(target_arch = "wasm32")]
pub mod ui;
