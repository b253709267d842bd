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
    let dist = Path::new(env!("CARGO_MANIFEST_DIR")).join("dist");
    let mut all = Vec::new();
    files(&dist, &mut all);
    all.sort();
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
