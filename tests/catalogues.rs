//! The catalogues' ids are a file format: the documentation lists exactly
//! the ids the code reads, in the code's order.
#![cfg(not(target_arch = "wasm32"))]

use headroom::hydraulics::field::Field;
use headroom::hydraulics::losses::Fitting;
use headroom::hydraulics::pipes::{Material, SERIES};

const DOC: &str = include_str!("../docs/sheet-format.md");

/// The `backticked` words between `<!-- NAME -->` and `<!-- end NAME -->`.
fn listed(name: &str) -> Vec<&'static str> {
    let start = DOC.find(&format!("<!-- {name} -->")).unwrap_or_else(|| panic!("no {name} list in the docs"));
    let end = DOC.find(&format!("<!-- end {name} -->")).unwrap_or_else(|| panic!("no end of {name}"));
    DOC[start..end].split('`').skip(1).step_by(2).collect()
}

#[test]
fn the_docs_list_every_series_material_fitting_and_field_id() {
    assert_eq!(listed("series ids"), SERIES.iter().map(|s| s.id).collect::<Vec<_>>());
    assert_eq!(listed("material ids"), Material::ALL.map(Material::id));
    assert_eq!(listed("fitting ids"), Fitting::ALL.map(Fitting::id));
    assert_eq!(listed("field paths"), Field::ALL.map(Field::path));
    assert_eq!(
        listed("velocity rules"),
        headroom::hydraulics::velocity::RULES.iter().map(|r| r.id).collect::<Vec<_>>()
    );
    assert_eq!(
        listed("component kinds"),
        headroom::sheet::file::ComponentKind::ALL.map(headroom::sheet::file::ComponentKind::id)
    );
}

#[test]
fn every_id_reads_back_to_its_entry() {
    for m in Material::ALL {
        assert_eq!(Material::from_id(m.id()), Some(m));
    }
    for f in Fitting::ALL {
        assert_eq!(Fitting::from_id(f.id()), Some(f));
    }
    for s in SERIES {
        assert_eq!(headroom::hydraulics::pipes::series(s.id).map(|x| x.id), Some(s.id));
    }
}

#[test]
fn the_ids_are_the_names_sheet_files_use() {
    use headroom::hydraulics::fluid::Glycol;
    use headroom::sheet::file::MethodName;
    for g in Glycol::ALL {
        assert_eq!(serde_json::to_string(&g).unwrap(), format!("\"{}\"", g.id()));
        assert_eq!(Glycol::from_id(g.id()), Some(g));
    }
    for m in MethodName::ALL {
        assert_eq!(serde_json::to_string(&m).unwrap(), format!("\"{}\"", m.id()));
        assert_eq!(MethodName::from_id(m.id()), Some(m));
    }
}

#[test]
fn the_docs_units_table_lists_every_unit_and_default() {
    use headroom::sheet::file::{System, Units};
    use headroom::sheet::units::{self, Dimension};
    let (si, us) = (Units::defaults(System::Si), Units::defaults(System::Us));
    for d in Dimension::ALL {
        let row = DOC
            .lines()
            .find(|l| l.starts_with(&format!("| {} |", d.key())))
            .unwrap_or_else(|| panic!("no row for {} in the units table", d.key()));
        let cells: Vec<&str> = row.trim_matches('|').split('|').map(str::trim).collect();
        assert_eq!(cells[1], si.of(d).symbol, "{}: SI default", d.key());
        assert_eq!(cells[2], us.of(d).symbol, "{}: US default", d.key());
        // The accepted units, without a trailing remark in brackets.
        let listed: Vec<&str> = cells[3].split(" (").next().unwrap().split(", ").collect();
        assert_eq!(listed, units::of(d).map(|u| u.symbol).collect::<Vec<_>>(), "{}", d.key());
    }
}
