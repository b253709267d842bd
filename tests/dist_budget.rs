//! Size budget: gzip -9 (and brotli, quality 11, for the record) of every
//! file in the release `dist/`, printed, and the gzip total held under `dist_gzip_budget_bytes` in Cargo.toml (the one
//! place the number lives). Ignored by plain `cargo test` because it needs
//! the release build; scripts/test runs it after `trunk build --release`.
#![cfg(not(target_arch = "wasm32"))]

use std::io::Write;
use std::path::{Path, PathBuf};

use flate2::write::GzEncoder;
use flate2::Compression;

fn budget() -> u64 {
    let manifest = include_str!("../Cargo.toml");
    manifest
        .lines()
        .find_map(|l| l.trim().strip_prefix("dist_gzip_budget_bytes"))
        .and_then(|rest| rest.trim().strip_prefix('='))
        .and_then(|n| n.trim().parse().ok())
        .expect("Cargo.toml [package.metadata.headroom] dist_gzip_budget_bytes")
}

/// The release build's folder and every file in it, sorted.
fn dist() -> (PathBuf, Vec<PathBuf>) {
    let dist = Path::new(env!("CARGO_MANIFEST_DIR")).join("dist");
    let mut all = Vec::new();
    files(&dist, &mut all);
    all.sort();
    (dist, all)
}

fn files(dir: &Path, out: &mut Vec<PathBuf>) {
    for entry in std::fs::read_dir(dir).expect("read dist/") {
        let path = entry.unwrap().path();
        if path.is_dir() {
            files(&path, out);
        } else {
            out.push(path);
        }
    }
}

fn brotli_len(bytes: &[u8]) -> u64 {
    let mut out = Vec::new();
    let params = brotli::enc::BrotliEncoderParams { quality: 11, lgwin: 22, ..Default::default() };
    brotli::BrotliCompress(&mut &bytes[..], &mut out, &params).unwrap();
    out.len() as u64
}

fn gzip_len(bytes: &[u8]) -> u64 {
    let mut enc = GzEncoder::new(Vec::new(), Compression::best());
    enc.write_all(bytes).unwrap();
    enc.finish().unwrap().len() as u64
}

#[test]
#[ignore = "needs the release dist/: scripts/test runs it"]
fn dist_fits_the_gzip_budget() {
    let (dist, all) = dist();
    assert!(
        all.iter().any(|p| p.extension().is_some_and(|e| e == "wasm")),
        "no .wasm in {}: run `trunk build --release`",
        dist.display()
    );
    let (mut raw_total, mut gz_total, mut br_total) = (0u64, 0u64, 0u64);
    println!("{:<48} {:>10} {:>10} {:>10}", "dist/ file", "bytes", "gzip -9", "brotli 11");
    for path in &all {
        let bytes = std::fs::read(path).unwrap();
        let (gz, br) = (gzip_len(&bytes), brotli_len(&bytes));
        assert!(gz > 0 && br > 0);
        raw_total += bytes.len() as u64;
        gz_total += gz;
        br_total += br;
        let name = path.strip_prefix(&dist).unwrap().display().to_string();
        println!("{name:<48} {:>10} {gz:>10} {br:>10}", bytes.len());
    }
    let budget = budget();
    println!("{:<48} {raw_total:>10} {gz_total:>10} {br_total:>10}", "total");
    println!("budget (gzip total): {budget} bytes; headroom {} bytes", budget as i64 - gz_total as i64);
    assert!(gz_total <= budget, "dist/ is {gz_total} bytes gzipped, over the {budget}-byte budget");
}

/// The size goal for all of `dist/` (the issue that set it: at most 150 KB
/// gzip -9, every landed feature included).
const GOAL_GZIP_BYTES: u64 = 150_000;

/// The gzip -9 total of some files.
fn gzip_total(files: &[PathBuf]) -> u64 {
    files.iter().map(|p| gzip_len(&std::fs::read(p).unwrap())).sum()
}

/// A yardstick page's release build under `target/` (scripts/test builds
/// it), its files sorted.
fn yardstick(folder: &str) -> Vec<PathBuf> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("target").join(folder);
    assert!(dir.join("index.html").is_file(), "{} missing: scripts/test build makes it", dir.display());
    let mut all = Vec::new();
    files(&dir, &mut all);
    all.sort();
    all
}

/// How much of the size goal Leptos and Headroom's core take before a
/// field of the worksheet is drawn: the bare Leptos page carrying the core
/// (benches/core-page: every line sized, the system, the CSV, the printed
/// sheet, the sheet file, a link) weighed beside the bare page and `dist/`.
/// A report, held to two facts that keep it honest: the yardstick carries
/// the core (every source the printed sheet cites, and every pipe series'
/// label, is in its module), and it is a part of what `dist/` carries
/// (smaller than `dist/`, larger than the bare page).
#[test]
#[ignore = "needs dist/, target/bare-dist and target/core-page-dist: scripts/test builds them"]
fn the_core_on_a_bare_leptos_page_beside_the_goal() {
    let app = gzip_total(&dist().1);
    let bare = gzip_total(&yardstick("bare-dist"));
    let files = yardstick("core-page-dist");
    let core = gzip_total(&files);
    let wasm = files.iter().find(|p| p.extension().is_some_and(|e| e == "wasm")).expect("a .wasm in core-page-dist");
    let module = std::fs::read(wasm).unwrap();
    let has = |text: &str| module.windows(text.len()).any(|w| w == text.as_bytes());
    for source in headroom::sheet::review::SOURCES {
        assert!(has(source), "the core yardstick's module lacks the printed source {source:?}: is the core linked in?");
    }
    for series in headroom::hydraulics::pipes::SERIES {
        assert!(has(series.label), "the core yardstick's module lacks the series {:?}", series.label);
    }
    assert!(bare < core && core < app, "bare page {bare}, core page {core}, dist/ {app} bytes gzip");
    println!("bare Leptos page (benches/bare): {bare} bytes gzip -9");
    println!("bare Leptos page carrying Headroom's core (benches/core-page): {core} bytes gzip -9");
    println!(
        "the {GOAL_GZIP_BYTES}-byte goal leaves {} bytes beside it for every view of the worksheet, its style sheet, icons and offline worker; dist/ is {app} bytes, {} over the goal",
        GOAL_GZIP_BYTES as i64 - core as i64,
        app as i64 - GOAL_GZIP_BYTES as i64
    );
}

/// The yardstick pages are built the way Headroom is: their rust links ask
/// wasm-opt for what `www/index.html` asks (each page needs its own link,
/// so the settings are written four times; this holds them together).
#[test]
fn the_yardsticks_are_optimised_as_the_page_is() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let settings = |page: &str| -> Vec<String> {
        let html = std::fs::read_to_string(root.join(page)).unwrap();
        ["data-wasm-opt=\"", "data-wasm-opt-params=\""]
            .iter()
            .map(|attr| {
                let at = html.find(attr).unwrap_or_else(|| panic!("{page} has no {attr}")) + attr.len();
                html[at..].split('"').next().unwrap().to_owned()
            })
            .collect()
    };
    let page = settings("www/index.html");
    for yardstick in ["benches/bare/index.html", "benches/first-screen/index.html", "benches/core-page/index.html"] {
        assert_eq!(settings(yardstick), page, "{yardstick} asks wasm-opt for other settings than www/index.html");
    }
}

/// wasm-opt is told the first 1 KB of memory is unused
/// (`--low-memory-unused` in www/index.html): it then folds a constant C
/// under 1 KB into a load's or store's offset without proving that the
/// address x + C cannot wrap past 4 GB, since a wrapped sum would land
/// below C, in memory nothing uses. (A stack grown down into that
/// kilobyte is no exception: its addresses do not wrap.) That holds while
/// the linker places nothing there: every data segment at 1,024 or above,
/// and the stack's top (the module's first global, `__stack_pointer`)
/// too. A layout that broke this would make the setting unsound. And the
/// names the functions were sorted by are not shipped. And wasm-opt is
/// told to take some exports out (`--remove-exports`: the stream classes
/// of Leptos's server-function client): every export the glue calls
/// (`wasm.name`) is still there.
#[test]
#[ignore = "needs the release dist/: scripts/test runs it"]
fn the_module_suits_the_settings_it_was_optimised_with() {
    let (_, all) = dist();
    let wasm = all.iter().find(|p| p.extension().is_some_and(|e| e == "wasm")).expect("a .wasm in dist/");
    let bytes = std::fs::read(wasm).unwrap();
    assert_eq!(&bytes[..8], b"\0asm\x01\0\0\0", "a wasm module, version 1");
    let (mut stack_top, mut segments, mut exports) = (None, Vec::new(), Vec::new());
    let mut at = 8;
    while at < bytes.len() {
        let id = bytes[at];
        at += 1;
        let size = leb(&bytes, &mut at) as usize;
        let end = at + size;
        let mut p = at;
        match id {
            // A custom section: its name. The function names wasm-opt
            // sorts the functions by (www/index.html) stay out of the
            // download.
            0 => {
                let len = leb(&bytes, &mut p) as usize;
                let name = String::from_utf8_lossy(&bytes[p..p + len]);
                assert_ne!(name, "name", "the module carries its function names ({size} bytes)");
            }
            // Globals: the first is the stack pointer, a mutable i32 set
            // by `i32.const`.
            6 => {
                assert!(leb(&bytes, &mut p) > 0, "the module has globals");
                assert_eq!(
                    (bytes[p], bytes[p + 1], bytes[p + 2]),
                    (0x7f, 1, 0x41),
                    "first global: mut i32 = i32.const"
                );
                p += 3;
                stack_top = Some(sleb(&bytes, &mut p));
            }
            // Exports: each one's name, then its kind and index.
            7 => {
                for _ in 0..leb(&bytes, &mut p) {
                    let len = leb(&bytes, &mut p) as usize;
                    exports.push(String::from_utf8(bytes[p..p + len].to_vec()).unwrap());
                    p += len + 1;
                    leb(&bytes, &mut p);
                }
                assert_eq!(p, end, "the export section read to its end");
            }
            // Data: each active segment's place in memory, `i32.const` N.
            11 => {
                for _ in 0..leb(&bytes, &mut p) {
                    let kind = leb(&bytes, &mut p);
                    assert!(
                        kind == 0 || kind == 1,
                        "data segment kind {kind}: only 0 (active, memory 0) and 1 (passive)"
                    );
                    if kind == 0 {
                        assert_eq!(bytes[p], 0x41, "an active segment placed by i32.const");
                        p += 1;
                        let offset = sleb(&bytes, &mut p);
                        assert_eq!(bytes[p], 0x0b, "a constant expression's end");
                        p += 1;
                        segments.push(offset);
                    }
                    let len = leb(&bytes, &mut p) as usize;
                    p += len;
                }
                assert_eq!(p, end, "the data section read to its end");
            }
            _ => {}
        }
        at = end;
    }
    let stack_top = stack_top.expect("a global section");
    assert!(!segments.is_empty(), "the module has data");
    let lowest = *segments.iter().min().unwrap();
    println!("stack top {stack_top}, lowest data segment {lowest} ({} segments)", segments.len());
    assert!(lowest >= 1024, "a data segment at {lowest}, inside the first 1 KB");
    assert!(stack_top >= 1024, "the stack's top at {stack_top}, inside the first 1 KB");
    let glue = all
        .iter()
        .find(|p| {
            let name = p.file_name().unwrap().to_string_lossy();
            name.starts_with("headroom-") && name.ends_with(".js")
        })
        .expect("the module's glue in dist/");
    let glue = std::fs::read_to_string(glue).unwrap();
    let mut called: Vec<&str> = glue
        .match_indices("wasm.")
        .filter(|(i, _)| !glue[..*i].ends_with(|c: char| c.is_ascii_alphanumeric() || c == '_' || c == '$' || c == '.'))
        .map(|(i, _)| {
            let rest = &glue[i + 5..];
            &rest[..rest.find(|c: char| !(c.is_ascii_alphanumeric() || c == '_' || c == '$')).unwrap_or(rest.len())]
        })
        .collect();
    called.sort_unstable();
    called.dedup();
    println!("the glue calls {} of the module's {} exports", called.len(), exports.len());
    assert!(called.len() > 10, "the glue's calls into the module found ({called:?})");
    let missing: Vec<&&str> = called.iter().filter(|c| !exports.iter().any(|e| e == *c)).collect();
    assert!(missing.is_empty(), "the glue calls what the module does not export: {missing:?}");
}

fn leb(bytes: &[u8], at: &mut usize) -> u64 {
    let (mut value, mut shift) = (0u64, 0);
    loop {
        let b = bytes[*at];
        *at += 1;
        value |= u64::from(b & 0x7f) << shift;
        shift += 7;
        if b & 0x80 == 0 {
            return value;
        }
    }
}

/// A signed LEB128 number: the unsigned reading, less 2^bits when the
/// last byte's sign bit is set.
fn sleb(bytes: &[u8], at: &mut usize) -> i64 {
    let start = *at;
    let value = leb(bytes, at) as i64;
    let bits = 7 * (*at - start);
    if bits < 64 && bytes[*at - 1] & 0x40 != 0 {
        value - (1i64 << bits)
    } else {
        value
    }
}
