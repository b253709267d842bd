//! The worksheet model: where typed text becomes quantities and results
//! become text.
//!
//! Units appear only here, at the boundary; the hydraulics core below speaks
//! of quantities.

pub mod chart;
pub mod convert;
pub mod duty_plot;
pub mod edit;
pub mod file;
pub mod json;
pub mod library;
pub mod link;
pub mod markup;
pub mod number;
pub mod order;
pub mod panes;
pub mod presets;
pub mod reader;
pub mod records;
pub mod report;
pub mod review;
pub mod system;
pub mod units;
