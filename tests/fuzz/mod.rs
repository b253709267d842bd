//! Mutation fuzzing of everything Headroom reads from outside: worksheet
//! links, sheet files and stored entries, each pushed through the reader,
//! the evaluation and every export. Shared by the bounded test
//! (`tests/fuzzing.rs`) and the long run by hand (`examples/fuzz.rs`).
//!
//! - No fuzzing crate: a small deterministic generator and mutations aimed
//!   at this format (JSON tokens, numbers at the edges of double precision,
//!   repeated arrays), so a run is repeatable from its seed on any machine.
#![allow(dead_code)]

use headroom::sheet::file::SheetFile;
use headroom::sheet::library::{Kv, Library, MemoryKv, SHEET_PREFIX};
use headroom::sheet::{link, report};

/// xorshift64* (Vigna 2016): small, fast, and good enough to pick mutations.
pub struct Rng(u64);

impl Rng {
    pub fn new(seed: u64) -> Rng {
        Rng(seed.max(1))
    }
    pub fn next(&mut self) -> u64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        self.0.wrapping_mul(0x2545_F491_4F6C_DD1D)
    }
    pub fn below(&mut self, n: usize) -> usize {
        (self.next() % n.max(1) as u64) as usize
    }
}

/// Seeds: the demo sheet and variants touching every fluid, pipe and limit.
pub fn seeds() -> Vec<String> {
    let demo = include_str!("../../examples/clinic-chilled-water.json").to_owned();
    let glycol = demo.replacen(
        r#""fluid": { "kind": "water", "temperature": "6 °C", "pressure": "350 kPa" }"#,
        r#""fluid": { "kind": "glycol", "glycol": "ethylene", "percent": "30", "temperature": "-5 °C" }"#,
        1,
    );
    let custom = demo.replacen(
        r#""fluid": { "kind": "water", "temperature": "6 °C", "pressure": "350 kPa" }"#,
        r#""fluid": { "kind": "custom", "density_kg_m3": "870", "kinematic_viscosity_mm2_s": "32" }"#,
        1,
    );
    let bore = demo.replacen(
        r#""pipe": { "series": "steel-sch40" }"#,
        r#""pipe": { "bore": { "diameter": "52.5 mm", "material": "pe" } }"#,
        1,
    );
    let us = demo.replacen(r#""units": { "system": "si" }"#, r#""units": { "system": "us", "flow": "m³/h" }"#, 1);
    let hw = demo.replacen(
        r#""length": "42 m","#,
        r#""length": "42 m", "method": "hazen-williams", "hazen_williams_c": "120", "check_size": "4","#,
        1,
    );
    vec![demo, glycol, custom, bore, us, hw]
}

const TOKENS: &[&str] = &[
    "1e308",
    "-1e308",
    "1e-400",
    "0",
    "-0",
    "NaN",
    "inf",
    "1,000",
    "2,5",
    "99999999999",
    "-1",
    "2.5",
    "1e2",
    "\"\"",
    "null",
    "true",
    "[]",
    "{}",
    "\"x\"",
    "\u{2212}3",
    "°F",
    "gpm",
    "m head",
    "barg",
    "m H₂O",
    "\"basis\": {\"circuit\": \"closed\"}",
    "\"freeze_margin_k\": 300",
    "\"smallest_size\": \"3\"",
    "kg/h",
    "\"count\": 2.5",
    "\"count\": -1",
    "\"version\": 2",
    "\"version\": 0",
    "\"kind\": \"steam\"",
    "\"series\": \"nope\"",
    "\u{0}",
    "\t=cmd",
    "\r@x",
];

/// Text typed into a field, as found in stored sheets and links.
const VALUES: &[&str] = &[
    "1e308 kPa",
    "-1e308",
    "1e-400",
    "0",
    "-0",
    "NaN",
    "inf",
    "1,000 gpm",
    "2,5",
    "99999999999",
    "-1",
    "2.5",
    "1e2",
    "",
    "\u{2212}3 °C",
    "212 °F",
    "-60 °C",
    "400 °C",
    "5 m head",
    "5 barg",
    "-2 psig",
    "10 m H2O",
    "3 kg/h",
    "60 %",
    "100",
    "steel-sch80",
    "copper-k",
    "pe",
    "nope",
    "9 ft/100 ft",
    "0.0001 mm",
    "2 km",
    "1e6 L/s",
    "7 K",
    "   ",
    "12.5 L/s",
    "3",
    "=cmd",
    "\t@x",
];

/// One mutation of `text`.
pub fn mutate(rng: &mut Rng, text: &str) -> String {
    let mut b: Vec<u8> = text.as_bytes().to_vec();
    let rounds = 1 + rng.below(3);
    for _ in 0..rounds {
        let at = rng.below(b.len() + 1);
        // Half the mutations replace a value and keep the JSON well formed,
        // so the evaluation and exports are reached, not only the parser.
        let kind = match rng.below(12) {
            0..=5 => 3,
            k => k - 6,
        };
        match kind {
            0 if !b.is_empty() => {
                let i = at.min(b.len() - 1);
                b[i] ^= 1 << rng.below(8);
            }
            1 if !b.is_empty() => {
                let end = (at + 1 + rng.below(16)).min(b.len());
                b.drain(at.min(end)..end);
            }
            2 => {
                let t = TOKENS[rng.below(TOKENS.len())].as_bytes();
                b.splice(at..at, t.iter().copied());
            }
            3 => {
                // Replace a string value (after `: "`) with a value token,
                // keeping the JSON well formed.
                let from = at.min(b.len());
                if let Some(q) = b[from..].windows(3).position(|w| w == b": \"").map(|q| q + from + 2) {
                    if let Some(e) = b[q + 1..].iter().position(|&c| c == b'"').map(|e| e + q + 1) {
                        let t = VALUES[rng.below(VALUES.len())];
                        b.splice(q + 1..e, t.bytes());
                    }
                }
            }
            4 if b.len() > 2 => {
                // Duplicate a chunk (grows arrays, repeats lines).
                let start = rng.below(b.len());
                let end = (start + 1 + rng.below(400)).min(b.len());
                let chunk = b[start..end].to_vec();
                b.splice(at..at, chunk);
            }
            5 if !b.is_empty() && rng.below(4) == 0 => {
                b.truncate(at);
            }
            _ => {
                let n = rng.below(256) as u8;
                b.insert(at, n);
            }
        }
    }
    String::from_utf8_lossy(&b).into_owned()
}

/// What happened to one input.
#[derive(Debug, Default, Clone, Copy)]
pub struct Tally {
    pub inputs: u64,
    pub read: u64,
    pub refused: u64,
}

/// Reads `text` as a sheet file, a link and a stored entry; everything
/// that reads is evaluated and exported every way. Panics are the bugs.
pub fn exercise(text: &str, tally: &mut Tally) {
    tally.inputs += 1;
    let mut sheets = Vec::new();
    match SheetFile::from_json(text) {
        Ok(s) => sheets.push(s),
        Err(e) => {
            let _ = e.to_string();
            tally.refused += 1;
        }
    }
    // As a link: the text itself (a damaged link), and the text packed.
    let _ = link::decode(text);
    let packed = {
        use base64::Engine as _;
        let z = miniz_oxide::deflate::compress_to_vec(text.as_bytes(), 1);
        format!("h1.{}", base64::engine::general_purpose::URL_SAFE_NO_PAD.encode(z))
    };
    if let Ok(s) = link::decode(&packed) {
        sheets.push(s);
    }
    // As a stored entry.
    let lib = Library::new(MemoryKv::default());
    let _ = lib.kv().set(&format!("{SHEET_PREFIX}f"), text);
    let _ = lib.reconcile();
    if let Ok(Some((s, _))) = lib.load("f") {
        sheets.push(s);
    }
    let _ = lib.aside();
    for s in sheets.iter().take(1) {
        tally.read += 1;
        let reports = report::evaluate(s);
        for r in &reports {
            if let Err(errs) = &r.outcome {
                for e in errs {
                    let _ = e.to_string();
                }
            }
        }
        let _ = report::table(s, &reports);
        let _ = report::csv(s, &reports);
        let _ = report::json(s, &reports);
        let again = SheetFile::from_json(&s.to_json()).expect("what was read is written readable");
        assert_eq!(&again, s, "a sheet survives a save and a reload");
        assert_eq!(link::decode(&link::encode(s)).as_ref(), Ok(s), "a sheet survives a link");
    }
}
