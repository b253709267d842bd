//! A fluid whose density and viscosity the engineer types in (an oil, a
//! brine from a supplier's sheet): checked, never computed.

use super::properties::{FluidError, Properties};

/// Where a custom fluid's numbers come from.
pub const SOURCES: &str = "entered by the user";

/// The typed properties, if they are positive and finite.
///
/// # Errors
/// [`FluidError::Custom`] naming the property that is not.
pub fn properties(props: Properties) -> Result<Properties, FluidError> {
    if !(props.density_kg_m3().is_finite() && props.density_kg_m3() > 0.0) {
        return Err(FluidError::Custom("density"));
    }
    if !(props.viscosity_pa_s().is_finite() && props.viscosity_pa_s() > 0.0) {
        return Err(FluidError::Custom("viscosity"));
    }
    Ok(props)
}
