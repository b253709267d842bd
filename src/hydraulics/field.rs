//! The inputs of a worksheet, named once. The core's errors, the sheet
//! reader's field errors, the page's error placement and the file format
//! documentation all use this one list.
//!
//! - A type, not strings: an error is routed to its input by matching a
//!   variant, never by the words of its message, and a renamed input fails
//!   to compile instead of silently losing its error.
//! - The path is the field's place in the sheet file (`docs/sheet-format.md`
//!   lists the same paths; `tests/catalogues.rs` holds the two together).

/// One input of a line or of the sheet.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Field {
    /// The line as a whole (no single input is at fault).
    Line,
    /// The line's name.
    Name,
    /// The line it is fed from.
    FedFrom,
    /// Diversity on the loads its branches bring.
    Diversity,
    /// Design flow.
    Flow,
    /// A heat load the flow is derived from.
    LoadPower,
    /// The temperature difference across the load.
    LoadDeltaT,
    /// The fixture rows (a kind not of the sheet's method).
    Fixtures,
    /// The count of a fixture row.
    FixtureCount,
    /// A continuous flow added to the fixtures' probable demand.
    ContinuousFlow,
    /// The fluid as a whole (its properties could not be found).
    Fluid,
    /// Fluid temperature.
    FluidTemperature,
    /// Water's absolute pressure.
    FluidPressure,
    /// Glycol strength.
    FluidPercent,
    /// A custom fluid's density.
    FluidDensity,
    /// A custom fluid's dynamic viscosity.
    FluidViscosity,
    /// A custom fluid's kinematic viscosity.
    FluidKinematicViscosity,
    /// A natural gas's relative density to air.
    FluidRelativeDensity,
    /// A custom gas's molar mass.
    FluidMolarMass,
    /// A custom gas's compressibility factor.
    FluidZ,
    /// The pipe as a whole.
    Pipe,
    /// The pipe series id.
    PipeSeries,
    /// A custom bore's inside diameter.
    PipeDiameter,
    /// A custom bore's material id.
    PipeMaterial,
    /// Absolute roughness.
    Roughness,
    /// Length of straight pipe.
    Length,
    /// The fitting rows (a kind not known).
    Fittings,
    /// The count of a fitting row.
    FittingCount,
    /// Extra ΣK.
    ExtraK,
    /// Equivalent length for other losses.
    EquivalentLength,
    /// Rise from start to end.
    Rise,
    /// Hazen–Williams C.
    HazenWilliamsC,
    /// The limits as a whole (none set, or set against each other).
    Limits,
    /// Largest friction drop per length.
    MaxDropPerLength,
    /// Largest total drop.
    MaxTotalDrop,
    /// Largest velocity.
    MaxVelocity,
    /// Smallest velocity.
    MinVelocity,
    /// Largest drop as a percentage of the inlet pressure.
    MaxDropPercent,
    /// The velocity-by-size table.
    VelocityBySize,
    /// Check mode's pinned size.
    CheckSize,
    /// Valves and equipment by Kv, rated drop, butterfly valve or reducer.
    Components,
    /// The smallest size the search may propose.
    SmallestSize,
    /// The sheet's flow unit.
    UnitsFlow,
    /// The sheet's pressure unit.
    UnitsPressure,
    /// The sheet's drop-per-length unit.
    UnitsDropPerLength,
    /// The sheet's length unit.
    UnitsLength,
    /// The sheet's velocity unit.
    UnitsVelocity,
    /// The sheet's temperature unit.
    UnitsTemperature,
    /// The sheet's roughness unit.
    UnitsRoughness,
    /// The sheet's heat-load unit.
    UnitsPower,
    /// The sheet's temperature-difference unit.
    UnitsTemperatureDifference,
    /// Open system: pressure available at the source.
    SourcePressure,
    /// Open system: least pressure an outlet needs.
    OutletMinimum,
    /// A point of the pump curve.
    PumpPoint,
    /// Absolute pressure on the pump's suction surface.
    SuctionPressure,
    /// Height of the suction surface above the pump inlet.
    SuctionHeight,
    /// Losses in the suction pipe.
    SuctionLoss,
}

impl Field {
    /// Every field, in the order of the sheet file.
    pub const ALL: [Field; 57] = [
        Field::Line,
        Field::Name,
        Field::FedFrom,
        Field::Diversity,
        Field::Flow,
        Field::LoadPower,
        Field::LoadDeltaT,
        Field::Fixtures,
        Field::FixtureCount,
        Field::ContinuousFlow,
        Field::Fluid,
        Field::FluidTemperature,
        Field::FluidPressure,
        Field::FluidPercent,
        Field::FluidDensity,
        Field::FluidViscosity,
        Field::FluidKinematicViscosity,
        Field::FluidRelativeDensity,
        Field::FluidMolarMass,
        Field::FluidZ,
        Field::Pipe,
        Field::PipeSeries,
        Field::PipeDiameter,
        Field::PipeMaterial,
        Field::Roughness,
        Field::Length,
        Field::Fittings,
        Field::FittingCount,
        Field::ExtraK,
        Field::EquivalentLength,
        Field::Rise,
        Field::HazenWilliamsC,
        Field::Limits,
        Field::MaxDropPerLength,
        Field::MaxTotalDrop,
        Field::MaxVelocity,
        Field::MinVelocity,
        Field::MaxDropPercent,
        Field::VelocityBySize,
        Field::CheckSize,
        Field::Components,
        Field::SmallestSize,
        Field::UnitsFlow,
        Field::UnitsPressure,
        Field::UnitsDropPerLength,
        Field::UnitsLength,
        Field::UnitsVelocity,
        Field::UnitsTemperature,
        Field::UnitsRoughness,
        Field::UnitsPower,
        Field::UnitsTemperatureDifference,
        Field::SourcePressure,
        Field::OutletMinimum,
        Field::PumpPoint,
        Field::SuctionPressure,
        Field::SuctionHeight,
        Field::SuctionLoss,
    ];

    /// Its place in the sheet file, e.g. "limits.max_velocity".
    pub fn path(self) -> &'static str {
        match self {
            Field::Line => "line",
            Field::Name => "name",
            Field::FedFrom => "fed_from",
            Field::Diversity => "diversity",
            Field::Flow => "flow",
            Field::LoadPower => "load.power",
            Field::LoadDeltaT => "load.delta_t",
            Field::Fixtures => "fixtures.items",
            Field::FixtureCount => "fixtures.items.count",
            Field::ContinuousFlow => "fixtures.continuous",
            Field::SourcePressure => "system.source_pressure",
            Field::OutletMinimum => "system.outlet_minimum",
            Field::PumpPoint => "system.pump",
            Field::SuctionPressure => "system.suction.pressure",
            Field::SuctionHeight => "system.suction.height",
            Field::SuctionLoss => "system.suction.loss",
            Field::Fluid => "fluid",
            Field::FluidTemperature => "fluid.temperature",
            Field::FluidPressure => "fluid.pressure",
            Field::FluidPercent => "fluid.percent",
            Field::FluidDensity => "fluid.density_kg_m3",
            Field::FluidViscosity => "fluid.viscosity_mpa_s",
            Field::FluidKinematicViscosity => "fluid.kinematic_viscosity_mm2_s",
            Field::FluidRelativeDensity => "fluid.relative_density",
            Field::FluidMolarMass => "fluid.molar_mass",
            Field::FluidZ => "fluid.z",
            Field::Pipe => "pipe",
            Field::PipeSeries => "pipe.series",
            Field::PipeDiameter => "pipe.diameter",
            Field::PipeMaterial => "pipe.material",
            Field::Roughness => "roughness",
            Field::Length => "length",
            Field::Fittings => "fittings",
            Field::FittingCount => "fittings.count",
            Field::ExtraK => "extra_k",
            Field::EquivalentLength => "equivalent_length",
            Field::Rise => "rise",
            Field::HazenWilliamsC => "hazen_williams_c",
            Field::Limits => "limits",
            Field::MaxDropPerLength => "limits.max_drop_per_length",
            Field::MaxTotalDrop => "limits.max_total_drop",
            Field::MaxVelocity => "limits.max_velocity",
            Field::MinVelocity => "limits.min_velocity",
            Field::MaxDropPercent => "limits.max_drop_percent",
            Field::VelocityBySize => "limits.velocity_by_size",
            Field::CheckSize => "check_size",
            Field::Components => "components",
            Field::SmallestSize => "smallest_size",
            Field::UnitsFlow => "units.flow",
            Field::UnitsPressure => "units.pressure",
            Field::UnitsDropPerLength => "units.drop_per_length",
            Field::UnitsLength => "units.length",
            Field::UnitsVelocity => "units.velocity",
            Field::UnitsTemperature => "units.temperature",
            Field::UnitsRoughness => "units.roughness",
            Field::UnitsPower => "units.power",
            Field::UnitsTemperatureDifference => "units.temperature_difference",
        }
    }

    /// How the core's messages name it ("inside diameter must be …").
    pub fn label(self) -> &'static str {
        match self {
            Field::Line => "the line",
            Field::Name => "line name",
            Field::FedFrom => "fed from",
            Field::Diversity => "diversity",
            Field::Flow => "flow",
            Field::LoadPower => "heat load",
            Field::LoadDeltaT => "temperature difference",
            Field::Fixtures => "fixtures",
            Field::FixtureCount => "fixture count",
            Field::ContinuousFlow => "continuous flow",
            Field::SourcePressure => "pressure at the source",
            Field::OutletMinimum => "least outlet pressure",
            Field::PumpPoint => "pump curve point",
            Field::SuctionPressure => "suction surface pressure",
            Field::SuctionHeight => "suction surface height",
            Field::SuctionLoss => "suction pipe loss",
            Field::Fluid => "the fluid",
            Field::FluidTemperature => "temperature",
            Field::FluidPressure => "pressure",
            Field::FluidPercent => "glycol strength",
            Field::FluidDensity => "density",
            Field::FluidViscosity | Field::FluidKinematicViscosity => "viscosity",
            Field::FluidRelativeDensity => "relative density",
            Field::FluidMolarMass => "molar mass",
            Field::FluidZ => "compressibility factor Z",
            Field::Pipe | Field::PipeSeries => "the pipe",
            Field::PipeDiameter => "inside diameter",
            Field::PipeMaterial => "material",
            Field::Roughness => "roughness",
            Field::Length => "length",
            Field::Fittings => "fittings",
            Field::FittingCount => "count",
            Field::ExtraK => "ΣK",
            Field::EquivalentLength => "equivalent length",
            Field::Rise => "rise",
            Field::HazenWilliamsC => "Hazen–Williams C",
            Field::Limits => "limits",
            Field::MaxDropPerLength => "drop-per-length limit",
            Field::MaxTotalDrop => "total-drop limit",
            Field::MaxVelocity => "maximum velocity",
            Field::MinVelocity => "minimum velocity",
            Field::MaxDropPercent => "drop limit as % of inlet pressure",
            Field::VelocityBySize => "velocity by size",
            Field::CheckSize => "checked size",
            Field::Components => "component",
            Field::SmallestSize => "smallest size",
            Field::UnitsFlow => "flow unit",
            Field::UnitsPressure => "pressure unit",
            Field::UnitsDropPerLength => "drop-per-length unit",
            Field::UnitsLength => "length unit",
            Field::UnitsVelocity => "velocity unit",
            Field::UnitsTemperature => "temperature unit",
            Field::UnitsRoughness => "roughness unit",
            Field::UnitsPower => "heat-load unit",
            Field::UnitsTemperatureDifference => "temperature-difference unit",
        }
    }

    /// The field of a path, if it is one.
    pub fn from_path(path: &str) -> Option<Field> {
        Field::ALL.into_iter().find(|f| f.path() == path)
    }
}

impl std::fmt::Display for Field {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.path())
    }
}

impl PartialEq<&str> for Field {
    fn eq(&self, other: &&str) -> bool {
        self.path() == *other
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn paths_are_unique_and_read_back() {
        for f in Field::ALL {
            assert_eq!(Field::from_path(f.path()), Some(f));
        }
        let mut paths: Vec<&str> = Field::ALL.iter().map(|f| f.path()).collect();
        paths.sort_unstable();
        paths.dedup();
        assert_eq!(paths.len(), Field::ALL.len());
    }
}
