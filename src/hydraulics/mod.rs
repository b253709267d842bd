//! The hydraulics core: pure functions of physical quantities.
//!
//! Invariant: nothing in here touches the DOM, storage, the network or the
//! clock, and nothing here knows about units of display. Every formula names
//! its source where it is defined.

pub mod compressible;
pub mod demand;
pub mod digits;
pub mod field;
pub mod fluid;
pub mod friction;
pub mod geometry;
pub mod line;
pub mod losses;
pub mod pipes;
pub mod pump;
pub mod sizing;
pub mod velocity;
