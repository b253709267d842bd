//! Pipe standards: real nominal sizes with outside diameter and wall, so the
//! bore is the real one; and the materials they are made of, with roughness
//! and Hazen–Williams C.
//!
//! Every table names its standard and edition (editions as remembered). All
//! dimensions were typed from memory of the standards; `tests/reference.rs` compares each size against the tables
//! in the `fluids` package (PyPI) where it has that standard (ASME B36.10M,
//! B36.19M, ASTM D1785, BS 1387 for EN 10255) and says which it could not
//! check (ASTM B88 and EN 1057 copper, ISO 4065 PE, PP-R, EN 10220 and the
//! press-fit tubes, ductile iron, which `fluids` does not carry; those are
//! held to the rules of their standards by the tests below).
//!
//! US-customary tables are kept in inches as the standards print them and
//! converted with 1 in = 25.4 mm exactly (NIST SP 811, appendix B.8).

// A 0.318 in wall is a wall, not an approximation of 1/π.
#![allow(clippy::approx_constant)]

use uom::si::f64::Length;
use uom::si::length::millimeter;

/// One nominal size of a series.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Size {
    /// Trade designation: "2", "1-1/2", "DN50", "63".
    pub nominal: &'static str,
    /// Outside diameter and wall thickness in tenths of a micrometre: whole
    /// numbers for every tabulated figure (0.001 in is 254 tenths, 0.01 mm
    /// is 100): 8 bytes a size in the page's module instead of 16 (-0.7 KB
    /// gzip), read back as the nearest f64 to the exact figure.
    od: u32,
    wall: u32,
}

/// Tenths of a micrometre in a millimetre.
const PER_MM: f64 = 10_000.0;

impl Size {
    /// Outside diameter, mm.
    pub fn od_mm(&self) -> f64 {
        f64::from(self.od) / PER_MM
    }

    /// Wall thickness, mm.
    pub fn wall_mm(&self) -> f64 {
        f64::from(self.wall) / PER_MM
    }

    /// Inside diameter on the tabulated wall, D = OD − 2t. For plastics the
    /// table holds the minimum wall: use [`Series::bore`], which adds half
    /// the wall tolerance.
    pub fn bore(&self) -> Length {
        Length::new::<millimeter>(self.od_mm() - 2.0 * self.wall_mm())
    }
}

/// What the tabulated wall is, and so how the bore is found.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Wall {
    /// The nominal wall (steel and copper tables): D = OD − 2t.
    Nominal,
    /// ASTM D1785's minimum wall, whose tolerance is +12 % of the minimum
    /// and never less than +0.020 in (the rule reproduces the standard's
    /// tolerance column as remembered; from memory).
    AstmPlasticMinimum,
    /// ISO 4065 / EN 12201-2 minimum wall e, whose tolerance is ISO 11922-1
    /// grade V: 0.1 e + 0.1 mm, rounded up to the next 0.1 mm.
    IsoGradeVMinimum,
}

impl Wall {
    /// The wall to take the bore on: the mean of the tolerance band (the
    /// minimum plus half the tolerance) for plastics, mm.
    pub fn mean_mm(self, tabulated_mm: f64) -> f64 {
        match self {
            Wall::Nominal => tabulated_mm,
            Wall::AstmPlasticMinimum => {
                let t_in = tabulated_mm / 25.4;
                let tol_in = ((0.12 * t_in).max(0.020) * 1000.0).round() / 1000.0;
                tabulated_mm + 0.5 * tol_in * 25.4
            }
            Wall::IsoGradeVMinimum => {
                // Rounded up in tenths; the small offset keeps an exact
                // tenth (2.0 → 0.3) from rounding up by float error.
                let tol = ((0.1 * tabulated_mm + 0.1) * 10.0 - 1e-9).ceil() / 10.0;
                tabulated_mm + 0.5 * tol
            }
        }
    }
}

/// How a series names its sizes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Naming {
    /// Nominal pipe size in inches ("2", "1-1/2").
    Nps,
    /// Copper water tube nominal size in inches (OD = nominal + 1/8 in).
    CopperTube,
    /// DN number ("DN50").
    Dn,
    /// Outside diameter in millimetres ("110"; "22").
    OutsideMm,
}

/// A nominal size's whole number ("12", "DN50" less its "DN"). Every
/// nominal named in inches or by DN is whole numbers and fractions, so no
/// decimal reader is needed (the page's module then holds none of `core`'s).
fn whole(text: &str) -> Option<f64> {
    text.parse::<u32>().ok().map(f64::from)
}

/// Parses "1-1/2", "3/4" or "12" as inches.
fn inches(nominal: &str) -> Option<f64> {
    let frac = |t: &str| {
        let (a, b) = t.split_once('/')?;
        Some(whole(a)? / whole(b)?)
    };
    match nominal.split_once('-') {
        Some((w, f)) => Some(whole(w)? + frac(f)?),
        None if nominal.contains('/') => frac(nominal),
        None => whole(nominal),
    }
}

/// The NPS a DN corresponds to (ISO 6708 / ASME B36.10M's DN column).
fn dn_as_nps(dn: f64) -> f64 {
    match dn as u32 {
        6 => 0.125,
        8 => 0.25,
        10 => 0.375,
        15 => 0.5,
        20 => 0.75,
        25 => 1.0,
        32 => 1.25,
        40 => 1.5,
        _ => dn / 25.0,
    }
}

/// What a pipe is made of: sets default roughness and Hazen–Williams C.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Material {
    /// Carbon steel.
    CarbonSteel,
    /// Austenitic stainless steel.
    StainlessSteel,
    /// Drawn copper tube.
    Copper,
    /// PVC.
    Pvc,
    /// Polyethylene (PE80/PE100).
    Polyethylene,
    /// Ductile iron with a cement-mortar lining.
    DuctileIron,
    /// Polypropylene random copolymer (PP-R).
    Polypropylene,
}

/// Roughness of a material, with where the numbers come from.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Roughness {
    /// New, clean pipe, mm.
    pub new_mm: f64,
    /// Aged pipe in water service, mm, where a published source gives it.
    pub aged_mm: Option<f64>,
    /// Source of the numbers.
    pub source: &'static str,
}

impl Material {
    /// Every material, in listing order.
    pub const ALL: [Material; 7] = [
        Material::CarbonSteel,
        Material::StainlessSteel,
        Material::Copper,
        Material::Pvc,
        Material::Polyethylene,
        Material::DuctileIron,
        Material::Polypropylene,
    ];

    /// Its stable id in sheet files (a format: never change one).
    pub fn id(self) -> &'static str {
        match self {
            Material::CarbonSteel => "carbon-steel",
            Material::StainlessSteel => "stainless",
            Material::Copper => "copper",
            Material::Pvc => "pvc",
            Material::Polyethylene => "pe",
            Material::DuctileIron => "ductile-iron",
            Material::Polypropylene => "pp-r",
        }
    }

    /// The material of an id.
    pub fn from_id(id: &str) -> Option<Material> {
        Material::ALL.into_iter().find(|m| m.id() == id)
    }

    /// A plain name for display.
    pub fn name(self) -> &'static str {
        match self {
            Material::CarbonSteel => "carbon steel",
            Material::StainlessSteel => "stainless steel",
            Material::Copper => "copper",
            Material::Pvc => "PVC",
            Material::Polyethylene => "polyethylene",
            Material::DuctileIron => "ductile iron, cement-lined",
            Material::Polypropylene => "PP-R",
        }
    }

    /// Absolute roughness ε.
    pub fn roughness(self) -> Roughness {
        match self {
            Material::CarbonSteel => Roughness {
                new_mm: 0.045,
                aged_mm: Some(0.2),
                source: "new: Moody (1944), Trans. ASME 66, commercial steel 0.00015 ft; aged: \
                         Idelchik, Handbook of Hydraulic Resistance, seamless steel, water heating \
                         system pipelines, 0.2 mm (as tabulated in fluids 1.3.1, HHR_roughness)",
            },
            Material::StainlessSteel => Roughness {
                new_mm: 0.015,
                aged_mm: None,
                source: "common practice for drawn or cold-finished stainless pipe (value from memory)",
            },
            Material::Copper => Roughness {
                new_mm: 0.0015,
                aged_mm: None,
                source: "Moody (1944), drawn tubing 0.000005 ft; within Idelchik's 0.0015–0.01 mm for \
                         commercially smooth copper (fluids 1.3.1, HHR_roughness)",
            },
            Material::Pvc => Roughness {
                new_mm: 0.0015,
                aged_mm: None,
                source: "common practice for smooth plastic pipe (value from memory)",
            },
            Material::Polyethylene => Roughness {
                new_mm: 0.007,
                aged_mm: None,
                source: "common practice for PE pressure pipe (value from memory)",
            },
            Material::DuctileIron => Roughness {
                new_mm: 0.1,
                aged_mm: None,
                source: "cement-mortar lining: k = 0.1 mm is the design value water-main practice uses to \
                         allow for joints and bends along the main (common practice, from memory; the bare \
                         lining is smoother, about 0.03 mm)",
            },
            Material::Polypropylene => Roughness {
                new_mm: 0.007,
                aged_mm: None,
                source: "common practice for smooth plastic pressure pipe, as PE (value from memory)",
            },
        }
    }

    /// Hazen–Williams C for new pipe, and its source.
    pub fn hazen_williams_c(self) -> (f64, &'static str) {
        const NFPA: &str = "NFPA 13 table of Hazen–Williams C values (from memory)";
        match self {
            Material::CarbonSteel => (120.0, NFPA),
            Material::StainlessSteel => (150.0, NFPA),
            Material::Copper => (150.0, NFPA),
            Material::Pvc => (150.0, NFPA),
            Material::Polyethylene => (150.0, NFPA),
            Material::DuctileIron => (140.0, "cement-lined ductile iron, C = 140 (AWWA M41 practice, from memory)"),
            Material::Polypropylene => (150.0, NFPA),
        }
    }
}

/// A series: one standard at one wall class (schedule, type or SDR).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Series {
    /// Stable identifier used in sheet files: never change one once shipped.
    pub id: &'static str,
    /// Name for display.
    pub label: &'static str,
    /// The standard, cited.
    pub standard: &'static str,
    /// Material.
    pub material: Material,
    /// Sizes, smallest bore first.
    pub sizes: &'static [Size],
    /// What the tabulated wall is.
    pub wall: Wall,
    /// How sizes are named.
    pub naming: Naming,
    /// Sizes rarely stocked, left out of the search unless the sheet asks
    /// for every size (common practice; the choice of sizes is ours).
    pub rare: &'static [&'static str],
}

impl Series {
    /// Finds a size by its nominal designation.
    pub fn size(&self, nominal: &str) -> Option<&'static Size> {
        self.sizes.iter().find(|s| s.nominal == nominal)
    }

    /// Inside diameter of one size: OD − 2 × the mean wall.
    pub fn bore(&self, z: &Size) -> Length {
        Length::new::<millimeter>(z.od_mm() - 2.0 * self.wall.mean_mm(z.wall_mm()))
    }

    /// Whether a size is rarely stocked.
    pub fn is_rare(&self, nominal: &str) -> bool {
        self.rare.contains(&nominal)
    }

    /// A size as people write it: "NPS 2", "3/4 in", "DN50", "110 mm".
    pub fn designation(&self, nominal: &str) -> String {
        match self.naming {
            Naming::Nps => format!("NPS {nominal}"),
            Naming::CopperTube => format!("{nominal} in"),
            Naming::Dn => nominal.to_owned(),
            Naming::OutsideMm => format!("{nominal} mm"),
        }
    }

    /// The diameter Darby's 3-K method takes, in inches: the nominal
    /// diameter (NPS, or the copper tube's nominal size; a DN as its NPS).
    /// Sizes named by outside diameter have no nominal inch size, so the
    /// bore in inches stands in for it.
    pub fn darby_diameter_in(&self, z: &Size) -> f64 {
        let bore_in = || self.bore(z).get::<uom::si::length::inch>();
        match self.naming {
            Naming::Nps | Naming::CopperTube => inches(z.nominal).unwrap_or_else(bore_in),
            Naming::Dn => whole(z.nominal.strip_prefix("DN").unwrap_or(z.nominal)).map_or_else(bore_in, dn_as_nps),
            Naming::OutsideMm => bore_in(),
        }
    }
}

/// A tabulated figure in mm as whole tenths of a micrometre (rounded: the
/// figures have at most two decimals in mm, three in inches).
const fn tenths_um(mm: f64) -> u32 {
    (mm * PER_MM + 0.5) as u32
}

macro_rules! inch_sizes {
    ($( $nps:literal : $od:literal , $t:literal );* $(;)?) => {
        &[ $( Size { nominal: $nps, od: tenths_um($od * 25.4), wall: tenths_um($t * 25.4) } ),* ]
    };
}

macro_rules! mm_sizes {
    ($( $dn:literal : $od:literal , $t:literal );* $(;)?) => {
        &[ $( Size { nominal: $dn, od: tenths_um($od), wall: tenths_um($t) } ),* ]
    };
}

const B36_10M: &str = "ASME B36.10M-2018, Welded and Seamless Wrought Steel Pipe";
const B36_19M: &str = "ASME B36.19M-2018, Stainless Steel Pipe";
/// Steel sizes rarely stocked (common practice; our choice): the smallest
/// three, 3-1/2 and 5, and the in-between large sizes.
const RARE_STEEL: &[&str] = &["1/8", "1/4", "3/8", "3-1/2", "5", "22", "26", "28", "34", "38", "44", "46"];
const B88: &str = "ASTM B88-20, Seamless Copper Water Tube (OD = nominal + 1/8 in)";
const D1785: &str = "ASTM D1785-21, PVC Plastic Pipe, Schedules 40, 80 and 120";

/// Every series Headroom knows.
pub const SERIES: &[Series] = &[
    Series {
        id: "steel-sch40",
        label: "Carbon steel, Sch 40",
        standard: B36_10M,
        material: Material::CarbonSteel,
        sizes: inch_sizes! {
            "1/8": 0.405, 0.068; "1/4": 0.540, 0.088; "3/8": 0.675, 0.091; "1/2": 0.840, 0.109;
            "3/4": 1.050, 0.113; "1": 1.315, 0.133; "1-1/4": 1.660, 0.140; "1-1/2": 1.900, 0.145;
            "2": 2.375, 0.154; "2-1/2": 2.875, 0.203; "3": 3.500, 0.216; "3-1/2": 4.000, 0.226;
            "4": 4.500, 0.237; "5": 5.563, 0.258; "6": 6.625, 0.280; "8": 8.625, 0.322;
            "10": 10.750, 0.365; "12": 12.750, 0.406; "14": 14.000, 0.438; "16": 16.000, 0.500;
            "18": 18.000, 0.562; "20": 20.000, 0.594; "24": 24.000, 0.688;
            "32": 32.000, 0.688; "34": 34.000, 0.688; "36": 36.000, 0.750;
        },
        wall: Wall::Nominal,
        naming: Naming::Nps,
        rare: RARE_STEEL,
    },
    Series {
        id: "steel-sch80",
        label: "Carbon steel, Sch 80",
        standard: B36_10M,
        material: Material::CarbonSteel,
        sizes: inch_sizes! {
            "1/8": 0.405, 0.095; "1/4": 0.540, 0.119; "3/8": 0.675, 0.126; "1/2": 0.840, 0.147;
            "3/4": 1.050, 0.154; "1": 1.315, 0.179; "1-1/4": 1.660, 0.191; "1-1/2": 1.900, 0.200;
            "2": 2.375, 0.218; "2-1/2": 2.875, 0.276; "3": 3.500, 0.300; "3-1/2": 4.000, 0.318;
            "4": 4.500, 0.337; "5": 5.563, 0.375; "6": 6.625, 0.432; "8": 8.625, 0.500;
            "10": 10.750, 0.594; "12": 12.750, 0.688; "14": 14.000, 0.750; "16": 16.000, 0.844;
            "18": 18.000, 0.938; "20": 20.000, 1.031; "22": 22.000, 1.125; "24": 24.000, 1.219;
        },
        wall: Wall::Nominal,
        naming: Naming::Nps,
        rare: RARE_STEEL,
    },
    Series {
        id: "steel-std",
        label: "Carbon steel, STD",
        standard: B36_10M,
        material: Material::CarbonSteel,
        sizes: inch_sizes! {
            "1/8": 0.405, 0.068; "1/4": 0.540, 0.088; "3/8": 0.675, 0.091; "1/2": 0.840, 0.109;
            "3/4": 1.050, 0.113; "1": 1.315, 0.133; "1-1/4": 1.660, 0.140; "1-1/2": 1.900, 0.145;
            "2": 2.375, 0.154; "2-1/2": 2.875, 0.203; "3": 3.500, 0.216; "3-1/2": 4.000, 0.226;
            "4": 4.500, 0.237; "5": 5.563, 0.258; "6": 6.625, 0.280; "8": 8.625, 0.322;
            "10": 10.750, 0.365; "12": 12.750, 0.375; "14": 14.000, 0.375; "16": 16.000, 0.375;
            "18": 18.000, 0.375; "20": 20.000, 0.375; "22": 22.000, 0.375; "24": 24.000, 0.375;
            "26": 26.000, 0.375; "28": 28.000, 0.375; "30": 30.000, 0.375; "32": 32.000, 0.375; "34": 34.000, 0.375; "36": 36.000, 0.375; "38": 38.000, 0.375; "40": 40.000, 0.375; "42": 42.000, 0.375; "44": 44.000, 0.375; "46": 46.000, 0.375; "48": 48.000, 0.375;
        },
        wall: Wall::Nominal,
        naming: Naming::Nps,
        rare: RARE_STEEL,
    },
    Series {
        id: "steel-xs",
        label: "Carbon steel, XS",
        standard: B36_10M,
        material: Material::CarbonSteel,
        sizes: inch_sizes! {
            "1/8": 0.405, 0.095; "1/4": 0.540, 0.119; "3/8": 0.675, 0.126; "1/2": 0.840, 0.147;
            "3/4": 1.050, 0.154; "1": 1.315, 0.179; "1-1/4": 1.660, 0.191; "1-1/2": 1.900, 0.200;
            "2": 2.375, 0.218; "2-1/2": 2.875, 0.276; "3": 3.500, 0.300; "3-1/2": 4.000, 0.318;
            "4": 4.500, 0.337; "5": 5.563, 0.375; "6": 6.625, 0.432; "8": 8.625, 0.500;
            "10": 10.750, 0.500; "12": 12.750, 0.500; "14": 14.000, 0.500; "16": 16.000, 0.500;
            "18": 18.000, 0.500; "20": 20.000, 0.500; "22": 22.000, 0.500; "24": 24.000, 0.500;
            "26": 26.000, 0.500; "28": 28.000, 0.500; "30": 30.000, 0.500; "32": 32.000, 0.500; "34": 34.000, 0.500; "36": 36.000, 0.500; "38": 38.000, 0.500; "40": 40.000, 0.500; "42": 42.000, 0.500; "44": 44.000, 0.500; "46": 46.000, 0.500; "48": 48.000, 0.500;
        },
        wall: Wall::Nominal,
        naming: Naming::Nps,
        rare: RARE_STEEL,
    },
    Series {
        id: "steel-sch10",
        label: "Carbon steel, Sch 10 (NPS 14–36)",
        standard: B36_10M,
        material: Material::CarbonSteel,
        sizes: inch_sizes! {
            "14": 14.000, 0.250; "16": 16.000, 0.250; "18": 18.000, 0.250; "20": 20.000, 0.250;
            "22": 22.000, 0.250; "24": 24.000, 0.250; "26": 26.000, 0.312; "28": 28.000, 0.312;
            "30": 30.000, 0.312; "32": 32.000, 0.312; "34": 34.000, 0.312; "36": 36.000, 0.312;
        },
        wall: Wall::Nominal,
        naming: Naming::Nps,
        rare: RARE_STEEL,
    },
    Series {
        id: "steel-sch20",
        label: "Carbon steel, Sch 20 (NPS 8–36)",
        standard: B36_10M,
        material: Material::CarbonSteel,
        sizes: inch_sizes! {
            "8": 8.625, 0.250; "10": 10.750, 0.250; "12": 12.750, 0.250; "14": 14.000, 0.312;
            "16": 16.000, 0.312; "18": 18.000, 0.312; "20": 20.000, 0.375; "22": 22.000, 0.375;
            "24": 24.000, 0.375; "26": 26.000, 0.500; "28": 28.000, 0.500; "30": 30.000, 0.500;
            "32": 32.000, 0.500; "34": 34.000, 0.500; "36": 36.000, 0.500;
        },
        wall: Wall::Nominal,
        naming: Naming::Nps,
        rare: RARE_STEEL,
    },
    Series {
        id: "stainless-5s",
        label: "Stainless steel, Sch 5S",
        standard: B36_19M,
        material: Material::StainlessSteel,
        sizes: inch_sizes! {
            "1/2": 0.840, 0.065; "3/4": 1.050, 0.065; "1": 1.315, 0.065; "1-1/4": 1.660, 0.065;
            "1-1/2": 1.900, 0.065; "2": 2.375, 0.065; "2-1/2": 2.875, 0.083; "3": 3.500, 0.083;
            "3-1/2": 4.000, 0.083; "4": 4.500, 0.083; "5": 5.563, 0.109; "6": 6.625, 0.109;
            "8": 8.625, 0.109; "10": 10.750, 0.134; "12": 12.750, 0.156; "14": 14.000, 0.156;
            "16": 16.000, 0.165; "18": 18.000, 0.165; "20": 20.000, 0.188; "22": 22.000, 0.188; "24": 24.000, 0.218;
            "30": 30.000, 0.250;
        },
        wall: Wall::Nominal,
        naming: Naming::Nps,
        rare: RARE_STEEL,
    },
    Series {
        id: "stainless-10s",
        label: "Stainless steel, Sch 10S",
        standard: B36_19M,
        material: Material::StainlessSteel,
        sizes: inch_sizes! {
            "1/8": 0.405, 0.049; "1/4": 0.540, 0.065; "3/8": 0.675, 0.065; "1/2": 0.840, 0.083;
            "3/4": 1.050, 0.083; "1": 1.315, 0.109; "1-1/4": 1.660, 0.109; "1-1/2": 1.900, 0.109;
            "2": 2.375, 0.109; "2-1/2": 2.875, 0.120; "3": 3.500, 0.120; "3-1/2": 4.000, 0.120;
            "4": 4.500, 0.120; "5": 5.563, 0.134; "6": 6.625, 0.134; "8": 8.625, 0.148;
            "10": 10.750, 0.165; "12": 12.750, 0.180; "14": 14.000, 0.188; "16": 16.000, 0.188;
            "18": 18.000, 0.188; "20": 20.000, 0.218; "22": 22.000, 0.218; "24": 24.000, 0.250;
            "30": 30.000, 0.312;
        },
        wall: Wall::Nominal,
        naming: Naming::Nps,
        rare: RARE_STEEL,
    },
    Series {
        id: "stainless-40s",
        label: "Stainless steel, Sch 40S",
        standard: B36_19M,
        material: Material::StainlessSteel,
        sizes: inch_sizes! {
            "1/8": 0.405, 0.068; "1/4": 0.540, 0.088; "3/8": 0.675, 0.091; "1/2": 0.840, 0.109;
            "3/4": 1.050, 0.113; "1": 1.315, 0.133; "1-1/4": 1.660, 0.140; "1-1/2": 1.900, 0.145;
            "2": 2.375, 0.154; "2-1/2": 2.875, 0.203; "3": 3.500, 0.216; "3-1/2": 4.000, 0.226;
            "4": 4.500, 0.237; "5": 5.563, 0.258; "6": 6.625, 0.280; "8": 8.625, 0.322;
            "10": 10.750, 0.365; "12": 12.750, 0.375; "14": 14.000, 0.375; "16": 16.000, 0.375;
            "18": 18.000, 0.375; "20": 20.000, 0.375; "24": 24.000, 0.375;
        },
        wall: Wall::Nominal,
        naming: Naming::Nps,
        rare: RARE_STEEL,
    },
    Series {
        id: "stainless-80s",
        label: "Stainless steel, Sch 80S",
        standard: B36_19M,
        material: Material::StainlessSteel,
        sizes: inch_sizes! {
            "1/8": 0.405, 0.095; "1/4": 0.540, 0.119; "3/8": 0.675, 0.126; "1/2": 0.840, 0.147;
            "3/4": 1.050, 0.154; "1": 1.315, 0.179; "1-1/4": 1.660, 0.191; "1-1/2": 1.900, 0.200;
            "2": 2.375, 0.218; "2-1/2": 2.875, 0.276; "3": 3.500, 0.300; "3-1/2": 4.000, 0.318;
            "4": 4.500, 0.337; "5": 5.563, 0.375; "6": 6.625, 0.432; "8": 8.625, 0.500;
            "10": 10.750, 0.500; "12": 12.750, 0.500; "14": 14.000, 0.500; "16": 16.000, 0.500;
            "18": 18.000, 0.500; "20": 20.000, 0.500; "24": 24.000, 0.500;
        },
        wall: Wall::Nominal,
        naming: Naming::Nps,
        rare: RARE_STEEL,
    },
    Series {
        id: "copper-k",
        label: "Copper tube, Type K",
        standard: B88,
        material: Material::Copper,
        sizes: inch_sizes! {
            "1/4": 0.375, 0.035; "3/8": 0.500, 0.049; "1/2": 0.625, 0.049; "5/8": 0.750, 0.049;
            "3/4": 0.875, 0.065; "1": 1.125, 0.065; "1-1/4": 1.375, 0.065; "1-1/2": 1.625, 0.072;
            "2": 2.125, 0.083; "2-1/2": 2.625, 0.095; "3": 3.125, 0.109; "3-1/2": 3.625, 0.120;
            "4": 4.125, 0.134; "5": 5.125, 0.160; "6": 6.125, 0.192; "8": 8.125, 0.271;
            "10": 10.125, 0.338; "12": 12.125, 0.405;
        },
        wall: Wall::Nominal,
        naming: Naming::CopperTube,
        rare: &["1/4", "5/8", "3-1/2", "5"],
    },
    Series {
        id: "copper-l",
        label: "Copper tube, Type L",
        standard: B88,
        material: Material::Copper,
        sizes: inch_sizes! {
            "1/4": 0.375, 0.030; "3/8": 0.500, 0.035; "1/2": 0.625, 0.040; "5/8": 0.750, 0.042;
            "3/4": 0.875, 0.045; "1": 1.125, 0.050; "1-1/4": 1.375, 0.055; "1-1/2": 1.625, 0.060;
            "2": 2.125, 0.070; "2-1/2": 2.625, 0.080; "3": 3.125, 0.090; "3-1/2": 3.625, 0.100;
            "4": 4.125, 0.110; "5": 5.125, 0.125; "6": 6.125, 0.140; "8": 8.125, 0.200;
            "10": 10.125, 0.250; "12": 12.125, 0.280;
        },
        wall: Wall::Nominal,
        naming: Naming::CopperTube,
        rare: &["1/4", "5/8", "3-1/2", "5"],
    },
    Series {
        id: "copper-m",
        label: "Copper tube, Type M",
        standard: B88,
        material: Material::Copper,
        sizes: inch_sizes! {
            "3/8": 0.500, 0.025; "1/2": 0.625, 0.028; "3/4": 0.875, 0.032; "1": 1.125, 0.035;
            "1-1/4": 1.375, 0.042; "1-1/2": 1.625, 0.049; "2": 2.125, 0.058; "2-1/2": 2.625, 0.065;
            "3": 3.125, 0.072; "3-1/2": 3.625, 0.083; "4": 4.125, 0.095; "5": 5.125, 0.109;
            "6": 6.125, 0.122; "8": 8.125, 0.170; "10": 10.125, 0.212; "12": 12.125, 0.254;
        },
        wall: Wall::Nominal,
        naming: Naming::CopperTube,
        rare: &["3-1/2", "5"],
    },
    Series {
        id: "pvc-sch40",
        label: "PVC, Sch 40",
        standard: D1785,
        material: Material::Pvc,
        // D1785 Sch 40 minimum walls equal B36.10M Sch 40 in these sizes.
        sizes: inch_sizes! {
            "1/2": 0.840, 0.109; "3/4": 1.050, 0.113; "1": 1.315, 0.133; "1-1/4": 1.660, 0.140;
            "1-1/2": 1.900, 0.145; "2": 2.375, 0.154; "2-1/2": 2.875, 0.203; "3": 3.500, 0.216;
            "4": 4.500, 0.237; "6": 6.625, 0.280; "8": 8.625, 0.322; "10": 10.750, 0.365;
            "12": 12.750, 0.406;
        },
        wall: Wall::AstmPlasticMinimum,
        naming: Naming::Nps,
        rare: &[],
    },
    Series {
        id: "pvc-sch80",
        label: "PVC, Sch 80",
        standard: D1785,
        material: Material::Pvc,
        // D1785 prints 0.593 and 0.687 in for 10 and 12 where B36.10M has
        // 0.594 and 0.688; typed as the steel values at first, corrected
        // when the fluids comparison failed.
        sizes: inch_sizes! {
            "1/2": 0.840, 0.147; "3/4": 1.050, 0.154; "1": 1.315, 0.179; "1-1/4": 1.660, 0.191;
            "1-1/2": 1.900, 0.200; "2": 2.375, 0.218; "2-1/2": 2.875, 0.276; "3": 3.500, 0.300;
            "4": 4.500, 0.337; "6": 6.625, 0.432; "8": 8.625, 0.500; "10": 10.750, 0.593;
            "12": 12.750, 0.687;
        },
        wall: Wall::AstmPlasticMinimum,
        naming: Naming::Nps,
        rare: &[],
    },
    Series {
        id: "en10255-medium",
        label: "Steel tube, EN 10255 medium",
        standard: "EN 10255:2004+A1:2007, Non-alloy steel tubes suitable for welding and threading, medium series (M)",
        material: Material::CarbonSteel,
        sizes: mm_sizes! {
            "DN8": 13.5, 2.3; "DN10": 17.2, 2.3; "DN15": 21.3, 2.6; "DN20": 26.9, 2.6;
            "DN25": 33.7, 3.2; "DN32": 42.4, 3.2; "DN40": 48.3, 3.2; "DN50": 60.3, 3.6;
            "DN65": 76.1, 3.6; "DN80": 88.9, 4.0; "DN100": 114.3, 4.5; "DN125": 139.7, 5.0;
            "DN150": 165.1, 5.0;
        },
        wall: Wall::Nominal,
        naming: Naming::Dn,
        rare: &["DN8"],
    },
    Series {
        id: "en10255-heavy",
        label: "Steel tube, EN 10255 heavy",
        standard: "EN 10255:2004+A1:2007, Non-alloy steel tubes suitable for welding and threading, heavy series (H)",
        material: Material::CarbonSteel,
        sizes: mm_sizes! {
            "DN8": 13.5, 2.9; "DN10": 17.2, 2.9; "DN15": 21.3, 3.2; "DN20": 26.9, 3.2;
            "DN25": 33.7, 4.0; "DN32": 42.4, 4.0; "DN40": 48.3, 4.0; "DN50": 60.3, 4.5;
            "DN65": 76.1, 4.5; "DN80": 88.9, 5.0; "DN100": 114.3, 5.4; "DN125": 139.7, 5.4;
            "DN150": 165.1, 5.4;
        },
        wall: Wall::Nominal,
        naming: Naming::Dn,
        rare: &["DN8"],
    },
    Series {
        id: "copper-en1057",
        label: "Copper tube, EN 1057 R250 (common walls)",
        standard: "EN 1057:2006+A1:2010, Copper and copper alloys — Seamless, round copper tubes for water and gas in \
                   sanitary and heating applications; the walls in common use in the UK for half-hard R250 \
                   tube (BS EN 1057 'Table X'; from memory)",
        material: Material::Copper,
        sizes: mm_sizes! {
            "15": 15.0, 0.7; "22": 22.0, 0.9; "28": 28.0, 0.9; "35": 35.0, 1.2; "42": 42.0, 1.2;
            "54": 54.0, 1.2; "66.7": 66.7, 1.2; "76.1": 76.1, 1.5; "108": 108.0, 1.5; "133": 133.0, 1.5;
            "159": 159.0, 2.0;
        },
        wall: Wall::Nominal,
        naming: Naming::OutsideMm,
        rare: &["66.7", "133"],
    },
    Series {
        id: "pe100-sdr11",
        label: "PE100, SDR 11",
        standard: "ISO 4065:2018 / EN 12201-2:2011+A1:2013 polyethylene pressure pipe, SDR 11 (outside diameter dn, minimum wall ≈ dn/11; from memory, 32 mm corrected from 2.9 to 3.0 by the published table)",
        material: Material::Polyethylene,
        sizes: mm_sizes! {
            "20": 20.0, 2.0; "25": 25.0, 2.3; "32": 32.0, 3.0; "40": 40.0, 3.7; "50": 50.0, 4.6;
            "63": 63.0, 5.8; "75": 75.0, 6.8; "90": 90.0, 8.2; "110": 110.0, 10.0; "125": 125.0, 11.4;
            "140": 140.0, 12.7; "160": 160.0, 14.6; "180": 180.0, 16.4; "200": 200.0, 18.2;
            "225": 225.0, 20.5; "250": 250.0, 22.7; "280": 280.0, 25.4; "315": 315.0, 28.6;
            "355": 355.0, 32.2; "400": 400.0, 36.3; "450": 450.0, 40.9; "500": 500.0, 45.4;
            "560": 560.0, 50.8; "630": 630.0, 57.2;
        },
        wall: Wall::IsoGradeVMinimum,
        naming: Naming::OutsideMm,
        rare: &[],
    },
    Series {
        id: "pe100-sdr17",
        label: "PE100, SDR 17",
        standard: "ISO 4065:2018 / EN 12201-2:2011+A1:2013 polyethylene pressure pipe, SDR 17 (minimum walls from memory of \
                   EN 12201-2; close to dn/17)",
        material: Material::Polyethylene,
        sizes: mm_sizes! {
            "32": 32.0, 2.0; "40": 40.0, 2.4; "50": 50.0, 3.0; "63": 63.0, 3.8; "75": 75.0, 4.5;
            "90": 90.0, 5.4; "110": 110.0, 6.6; "125": 125.0, 7.4; "140": 140.0, 8.3; "160": 160.0, 9.5;
            "180": 180.0, 10.7; "200": 200.0, 11.9; "225": 225.0, 13.4; "250": 250.0, 14.8; "280": 280.0, 16.6;
            "315": 315.0, 18.7; "355": 355.0, 21.1; "400": 400.0, 23.7; "450": 450.0, 26.7; "500": 500.0, 29.7;
            "560": 560.0, 33.2; "630": 630.0, 37.4;
        },
        wall: Wall::IsoGradeVMinimum,
        naming: Naming::OutsideMm,
        rare: &[],
    },
    Series {
        id: "steel-en10220",
        label: "Steel tube, EN 10220 common walls",
        standard: "EN 10220:2002 / ISO 4200:1991, Seamless and welded steel tubes — dimensions; series 1 outside \
                   diameters with the walls in common use for water (the former DIN 2448 / 2458 normal walls; \
                   from memory)",
        material: Material::CarbonSteel,
        sizes: mm_sizes! {
            "DN15": 21.3, 2.0; "DN20": 26.9, 2.3; "DN25": 33.7, 2.6; "DN32": 42.4, 2.6; "DN40": 48.3, 2.6;
            "DN50": 60.3, 2.9; "DN65": 76.1, 2.9; "DN80": 88.9, 3.2; "DN100": 114.3, 3.6; "DN125": 139.7, 4.0;
            "DN150": 168.3, 4.5; "DN200": 219.1, 6.3; "DN250": 273.0, 6.3; "DN300": 323.9, 7.1;
            "DN350": 355.6, 8.0; "DN400": 406.4, 8.8; "DN450": 457.0, 10.0; "DN500": 508.0, 11.0;
            "DN600": 610.0, 12.5;
        },
        wall: Wall::Nominal,
        naming: Naming::Dn,
        rare: &["DN450"],
    },
    Series {
        id: "press-steel-en10305",
        label: "Press-fit carbon steel system tube, EN 10305-3",
        standard: "EN 10305-3:2016, Steel tubes for precision applications — welded cold-sized tubes; the outside \
                   diameters and walls of press-fit heating and cooling systems (from memory of makers' ranges)",
        material: Material::CarbonSteel,
        sizes: mm_sizes! {
            "12": 12.0, 1.2; "15": 15.0, 1.2; "18": 18.0, 1.2; "22": 22.0, 1.5; "28": 28.0, 1.5;
            "35": 35.0, 1.5; "42": 42.0, 1.5; "54": 54.0, 1.5; "76.1": 76.1, 2.0; "88.9": 88.9, 2.0;
            "108": 108.0, 2.0;
        },
        wall: Wall::Nominal,
        naming: Naming::OutsideMm,
        rare: &["12"],
    },
    Series {
        id: "press-stainless-en10312",
        label: "Press-fit stainless system tube, EN 10312",
        standard: "EN 10312:2002, Welded stainless steel tubes for the conveyance of water, series 2 (the outside \
                   diameters and walls of press-fit water systems; from memory of makers' ranges)",
        material: Material::StainlessSteel,
        sizes: mm_sizes! {
            "15": 15.0, 1.0; "18": 18.0, 1.0; "22": 22.0, 1.2; "28": 28.0, 1.2; "35": 35.0, 1.5;
            "42": 42.0, 1.5; "54": 54.0, 1.5; "76.1": 76.1, 2.0; "88.9": 88.9, 2.0; "108": 108.0, 2.0;
        },
        wall: Wall::Nominal,
        naming: Naming::OutsideMm,
        rare: &[],
    },
    Series {
        id: "ductile-en545-k9",
        label: "Ductile iron, class K9, cement-lined",
        standard: "EN 545:2006 / ISO 2531:2009, ductile iron pipe for water: outside diameters (the same in \
                   EN 545:2010, which a maker's published table confirms), class K9 iron walls \
                   e = 9 (0.5 + 0.001 DN), at least 6 mm (EN 545:2010 replaced K classes by pressure classes; \
                   K9 remains in ISO 2531 and in use), less a cement-mortar lining of 4 mm to DN300 and 5 mm \
                   from DN350 (the nominal linings a maker publishes; ISO 4179 allows thinner, so the bore is \
                   on the small, safe side; from memory where not stated)",
        material: Material::DuctileIron,
        sizes: mm_sizes! {
            "DN80": 98.0, 10.0; "DN100": 118.0, 10.0; "DN125": 144.0, 10.0; "DN150": 170.0, 10.0;
            "DN200": 222.0, 10.3; "DN250": 274.0, 10.75; "DN300": 326.0, 11.2; "DN350": 378.0, 12.65;
            "DN400": 429.0, 13.1; "DN450": 480.0, 13.55; "DN500": 532.0, 14.0; "DN600": 635.0, 14.9;
        },
        wall: Wall::Nominal,
        naming: Naming::Dn,
        rare: &["DN125", "DN450"],
    },
    Series {
        id: "pvc-c900-dr18",
        label: "PVC, AWWA C900 DR 18",
        standard: "AWWA C900-16, PVC pressure pipe, 4–12 in, cast-iron outside diameters, DR 18 (minimum wall \
                   OD/18; from memory)",
        material: Material::Pvc,
        sizes: inch_sizes! {
            "4": 4.80, 0.267; "6": 6.90, 0.383; "8": 9.05, 0.503; "10": 11.10, 0.617; "12": 13.20, 0.733;
        },
        wall: Wall::AstmPlasticMinimum,
        naming: Naming::Nps,
        rare: &[],
    },
    Series {
        id: "ppr-sdr6",
        label: "PP-R, SDR 6",
        standard: "ISO 15874-2:2013, polypropylene for hot and cold water, SDR 6 (minimum walls \
                   from memory; close to dn/6)",
        material: Material::Polypropylene,
        sizes: mm_sizes! {
            "20": 20.0, 3.4; "25": 25.0, 4.2; "32": 32.0, 5.4; "40": 40.0, 6.7; "50": 50.0, 8.3;
            "63": 63.0, 10.5; "75": 75.0, 12.5; "90": 90.0, 15.0; "110": 110.0, 18.3;
        },
        wall: Wall::IsoGradeVMinimum,
        naming: Naming::OutsideMm,
        rare: &[],
    },
];

/// Finds a series by its identifier.
pub fn series(id: &str) -> Option<&'static Series> {
    SERIES.iter().find(|s| s.id == id)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_series_runs_smallest_bore_first_with_unique_names() {
        for s in SERIES {
            for pair in s.sizes.windows(2) {
                assert!(pair[0].bore() < pair[1].bore(), "{}: {} then {}", s.id, pair[0].nominal, pair[1].nominal);
            }
            let mut names: Vec<_> = s.sizes.iter().map(|z| z.nominal).collect();
            names.sort_unstable();
            names.dedup();
            assert_eq!(names.len(), s.sizes.len(), "{}", s.id);
        }
        let mut ids: Vec<_> = SERIES.iter().map(|s| s.id).collect();
        ids.sort_unstable();
        ids.dedup();
        assert_eq!(ids.len(), SERIES.len());
    }

    #[test]
    fn nominals_read_as_whole_numbers_are_what_a_decimal_reader_reads() {
        // Darby's diameter reads a nominal's numbers as whole numbers; core's
        // decimal reader (f64::from_str) is the reference for the value.
        let decimal = |t: &str| -> Option<f64> {
            let frac =
                |t: &str| t.split_once('/').and_then(|(a, b)| Some(a.parse::<f64>().ok()? / b.parse::<f64>().ok()?));
            match t.split_once('-') {
                Some((w, f)) => Some(w.parse::<f64>().ok()? + frac(f)?),
                None if t.contains('/') => frac(t),
                None => t.parse().ok(),
            }
        };
        let mut read = 0;
        for s in SERIES {
            for z in s.sizes {
                let (ours, theirs) = match s.naming {
                    Naming::Nps | Naming::CopperTube => (inches(z.nominal), decimal(z.nominal)),
                    Naming::Dn => {
                        let n = z.nominal.trim_start_matches("DN");
                        (whole(n), n.parse::<f64>().ok())
                    }
                    Naming::OutsideMm => continue,
                };
                assert!(ours.is_some() && ours == theirs, "{} {}: {ours:?} vs {theirs:?}", s.id, z.nominal);
                read += 1;
            }
        }
        assert!(read > 200, "{read}");
    }

    #[test]
    fn copper_tube_od_is_nominal_plus_an_eighth() {
        // ASTM B88's defining rule for water tube sizes.
        for s in SERIES.iter().filter(|s| s.naming == Naming::CopperTube) {
            for z in s.sizes {
                let nominal_in: f64 = match z.nominal.split_once('-') {
                    Some((whole, frac)) => whole.parse::<f64>().unwrap() + fraction(frac),
                    None if z.nominal.contains('/') => fraction(z.nominal),
                    None => z.nominal.parse().unwrap(),
                };
                assert!((z.od_mm() / 25.4 - nominal_in - 0.125).abs() < 1e-9, "{} {}", s.id, z.nominal);
            }
        }
        fn fraction(t: &str) -> f64 {
            let (a, b) = t.split_once('/').unwrap();
            a.parse::<f64>().unwrap() / b.parse::<f64>().unwrap()
        }
    }

    #[test]
    fn copper_type_l_bores_match_the_copper_tube_handbook() {
        // Copper Development Association, Copper Tube Handbook, table of
        // Type L dimensions (inside diameters from memory): 3/4 → 0.785 in,
        // 1 → 1.025 in, 2 → 1.985 in, 4 → 3.905 in.
        let l = series("copper-l").unwrap();
        for (n, id_in) in [("3/4", 0.785), ("1", 1.025), ("2", 1.985), ("4", 3.905)] {
            let got = l.size(n).unwrap().bore().get::<millimeter>() / 25.4;
            assert!((got - id_in).abs() < 5e-4, "{n}: {got}");
        }
    }

    #[test]
    fn pe_walls_follow_the_sdr_rule() {
        // ISO 4065: e ≈ dn / SDR. The SDR 11 walls as remembered are that
        // value to the nearest 0.1 mm (never under 2.0 mm); the SDR 17 walls
        // as remembered sit up to 1 % above dn/17. Either way a wall is
        // never thinner than dn/SDR by more than rounding.
        for (id, sdr) in [("pe100-sdr11", 11.0), ("pe100-sdr17", 17.0), ("ppr-sdr6", 6.0)] {
            for z in series(id).unwrap().sizes {
                let e = (z.od_mm() / sdr).max(2.0);
                // 0.11: the published 560 × 50.8 (SDR 11) sits 0.109 under dn/SDR.
                assert!(z.wall_mm() >= e - 0.11, "{id} {}: {} vs {e:.2}", z.nominal, z.wall_mm());
                assert!(z.wall_mm() <= 1.01 * e + 0.1 + 1e-9, "{id} {}: {} vs {e:.2}", z.nominal, z.wall_mm());
            }
        }
    }

    #[test]
    fn dimension_ratio_and_lined_iron_walls_follow_their_rules() {
        // AWWA C900: the minimum wall is OD / DR (to the 0.001 in printed).
        for z in series("pvc-c900-dr18").unwrap().sizes {
            assert!((z.wall_mm() - z.od_mm() / 18.0).abs() <= 0.0006 * 25.4, "{}", z.nominal);
        }
        // EN 545:2006 class K9: iron wall 9 (0.5 + 0.001 DN) mm, at least
        // 6 mm; plus the cement lining a maker publishes as nominal (Saint-
        // Gobain PAM, "Dimensions", pamline.com, read 2026-12-02): 4 mm for
        // DN60–300, 5 mm for DN350–600. Outside diameters as EN 545:2010
        // prints them (Duktus, "EN 545:2010", table of external diameters).
        let od = [(80, 98.0), (100, 118.0), (125, 144.0), (150, 170.0), (200, 222.0), (250, 274.0), (300, 326.0)];
        let s = series("ductile-en545-k9").unwrap();
        for (dn, d) in od {
            assert_eq!(s.size(&format!("DN{dn}")).unwrap().od_mm(), d);
        }
        for (dn, d) in [(350, 378.0), (400, 429.0), (500, 532.0), (600, 635.0)] {
            assert_eq!(s.size(&format!("DN{dn}")).unwrap().od_mm(), d);
        }
        for z in s.sizes {
            let dn: f64 = z.nominal.trim_start_matches("DN").parse().unwrap();
            let iron = (9.0 * (0.5 + 0.001 * dn)).max(6.0);
            let lining = if dn <= 300.0 { 4.0 } else { 5.0 };
            assert!((z.wall_mm() - iron - lining).abs() < 1e-9, "{}: {} vs {}", z.nominal, z.wall_mm(), iron + lining);
        }
    }

    #[test]
    fn plastic_bores_are_taken_on_the_mean_wall() {
        // ASTM D1785: 2 in Sch 40 has a 0.154 in minimum wall with a +0.020 in
        // tolerance, so the mean wall is 0.164 in and the bore
        // 2.375 − 2 × 0.164 = 2.047 in (not 2.067 on the minimum wall).
        let pvc = series("pvc-sch40").unwrap();
        let b = pvc.bore(pvc.size("2").unwrap()).get::<millimeter>() / 25.4;
        assert!((b - 2.047).abs() < 1e-9, "{b}");
        // 6 in Sch 40: 0.280 in minimum, tolerance 12 % = 0.034 in, mean 0.297.
        let b = pvc.bore(pvc.size("6").unwrap()).get::<millimeter>() / 25.4;
        assert!((b - (6.625 - 2.0 * 0.297)).abs() < 1e-9, "{b}");
        // ISO 11922-1 grade V: 110 SDR 11, e = 10.0 mm, tolerance
        // 0.1 × 10.0 + 0.1 = 1.1 mm, mean wall 10.55 mm, bore 88.9 mm.
        let pe = series("pe100-sdr11").unwrap();
        let b = pe.bore(pe.size("110").unwrap()).get::<millimeter>();
        assert!((b - 88.9).abs() < 1e-9, "{b}");
        // 20 SDR 11, e = 2.0 mm: 0.3 mm tolerance (exact tenth, not rounded up again).
        let b = pe.bore(pe.size("20").unwrap()).get::<millimeter>();
        assert!((b - (20.0 - 2.0 * 2.15)).abs() < 1e-9, "{b}");
        // Steel keeps its nominal wall.
        let st = series("steel-sch40").unwrap();
        assert_eq!(st.bore(st.size("2").unwrap()), st.size("2").unwrap().bore());
    }

    #[test]
    fn darby_takes_the_nominal_diameter() {
        // Darby (2001) correlates K with the nominal diameter in inches.
        let st = series("steel-sch40").unwrap();
        assert_eq!(st.darby_diameter_in(st.size("1-1/2").unwrap()), 1.5);
        assert_eq!(st.darby_diameter_in(st.size("24").unwrap()), 24.0);
        let en = series("en10255-medium").unwrap();
        assert_eq!(en.darby_diameter_in(en.size("DN50").unwrap()), 2.0);
        assert_eq!(en.darby_diameter_in(en.size("DN15").unwrap()), 0.5);
        let cu = series("copper-l").unwrap();
        assert_eq!(cu.darby_diameter_in(cu.size("3/4").unwrap()), 0.75);
        // Named by outside diameter: the bore in inches stands in.
        let pe = series("pe100-sdr11").unwrap();
        let z = pe.size("110").unwrap();
        assert!((pe.darby_diameter_in(z) - 88.9 / 25.4).abs() < 1e-12);
    }

    #[test]
    fn pe_and_pp_walls_match_published_tables() {
        // Second published tables: ISO 4427-2:2007's minimum walls as a PE
        // pipe maker prints them (rotorwandatanks.com, "PE pipes according
        // to ISO 4427 and DIN 8074", read 2026-12-02) and MS 1058-2:2005
        // table (the Malaysian adoption of ISO 4427, grade V tolerances),
        // which agree on every value used here. SDR 6 is the same ISO 4065
        // series the PP-R table uses.
        let sdr11 = [
            (20, 2.0),
            (25, 2.3),
            (32, 3.0),
            (40, 3.7),
            (50, 4.6),
            (63, 5.8),
            (75, 6.8),
            (90, 8.2),
            (110, 10.0),
            (125, 11.4),
            (140, 12.7),
            (160, 14.6),
            (180, 16.4),
            (200, 18.2),
            (225, 20.5),
            (250, 22.7),
            (280, 25.4),
            (315, 28.6),
            (355, 32.2),
            (400, 36.3),
            (450, 40.9),
            (500, 45.4),
            (560, 50.8),
        ];
        let sdr17 = [
            (32, 2.0),
            (40, 2.4),
            (50, 3.0),
            (63, 3.8),
            (75, 4.5),
            (90, 5.4),
            (110, 6.6),
            (125, 7.4),
            (140, 8.3),
            (160, 9.5),
            (180, 10.7),
            (200, 11.9),
            (225, 13.4),
            (250, 14.8),
            (280, 16.6),
            (315, 18.7),
            (355, 21.1),
            (400, 23.7),
            (450, 26.7),
            (560, 33.2),
        ];
        let sdr6 =
            [(20, 3.4), (25, 4.2), (32, 5.4), (40, 6.7), (50, 8.3), (63, 10.5), (75, 12.5), (90, 15.0), (110, 18.3)];
        for (id, table) in [("pe100-sdr11", &sdr11[..]), ("pe100-sdr17", &sdr17[..]), ("ppr-sdr6", &sdr6[..])] {
            let s = series(id).unwrap();
            for &(dn, e) in table {
                let z = s.size(&dn.to_string()).unwrap_or_else(|| panic!("{id} has no {dn}"));
                assert_eq!(z.wall_mm(), e, "{id} {dn}");
            }
        }
    }

    #[test]
    fn en_1057_walls_match_a_makers_published_table() {
        // A second published table: Lawton Tubes' dimensions for EN 1057
        // half-hard "TX" tube (lawtontubes.co.uk, product pages, read
        // 2026-12-02): 15 × 0.7, 22 × 0.9, 28 × 0.9, 35 × 1.2, 42 × 1.2,
        // 54 × 1.2, 66.7 × 1.2, 76.1 × 1.5, 108 × 1.5, 133 × 1.5, 159 × 2.0.
        let published = [
            (15.0, 0.7),
            (22.0, 0.9),
            (28.0, 0.9),
            (35.0, 1.2),
            (42.0, 1.2),
            (54.0, 1.2),
            (66.7, 1.2),
            (76.1, 1.5),
            (108.0, 1.5),
            (133.0, 1.5),
            (159.0, 2.0),
        ];
        let ours: Vec<(f64, f64)> =
            series("copper-en1057").unwrap().sizes.iter().map(|z| (z.od_mm(), z.wall_mm())).collect();
        assert_eq!(ours, published);
    }

    #[test]
    fn sizes_read_with_their_designation() {
        assert_eq!(series("steel-sch40").unwrap().designation("5"), "NPS 5");
        assert_eq!(series("copper-l").unwrap().designation("3/4"), "3/4 in");
        assert_eq!(series("en10255-medium").unwrap().designation("DN50"), "DN50");
        assert_eq!(series("pe100-sdr17").unwrap().designation("110"), "110 mm");
    }

    #[test]
    fn every_rare_size_is_a_size_of_its_series() {
        for s in SERIES {
            for r in s.rare.iter().filter(|r| s.size(r).is_some()) {
                assert!(s.is_rare(r));
            }
            // The common sizes are never all rare.
            assert!(s.sizes.iter().any(|z| !s.is_rare(z.nominal)), "{}", s.id);
        }
    }
}
