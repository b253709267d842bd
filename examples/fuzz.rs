//! The long mutation-fuzzing run, by hand:
//!
//! ```text
//! cargo run --profile fuzz --example fuzz -- 1000000 [SEED]
//! ```
//! Feeds mutated links, sheet files and stored entries through the reader,
//! the evaluation and every export (see `tests/fuzz/mod.rs`), counting
//! panics; the inputs that panicked are written under `target/fuzz-crashes/`.

#[path = "../tests/fuzz/mod.rs"]
mod fuzz;

fn main() {
    let mut args = std::env::args().skip(1);
    let n: u64 = args.next().and_then(|a| a.parse().ok()).unwrap_or(100_000);
    let seed: u64 = args.next().and_then(|a| a.parse().ok()).unwrap_or(1);
    let seeds = fuzz::seeds();
    let mut rng = fuzz::Rng::new(seed);
    let mut tally = fuzz::Tally::default();
    let mut panics = 0u64;
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("target/fuzz-crashes");
    std::panic::set_hook(Box::new(|_| {}));
    let start = std::time::Instant::now();
    for i in 0..n {
        // Half the inputs mutate a seed, half mutate a mutant again.
        let base = seeds[(i as usize) % seeds.len()].clone();
        let mut input = fuzz::mutate(&mut rng, &base);
        if rng.below(2) == 0 {
            input = fuzz::mutate(&mut rng, &input);
        }
        let kept = input.clone();
        let mut t = tally;
        let outcome = std::panic::catch_unwind(move || {
            fuzz::exercise(&input, &mut t);
            t
        });
        match outcome {
            Ok(t) => tally = t,
            Err(_) => {
                panics += 1;
                let _ = std::fs::create_dir_all(&dir);
                let _ = std::fs::write(dir.join(format!("seed-{seed}-input-{i}.txt")), kept);
            }
        }
    }
    println!(
        "{n} inputs (seed {seed}) in {:.1} s: {} read and evaluated, {} refused by the reader, {panics} panics",
        start.elapsed().as_secs_f64(),
        tally.read,
        tally.refused
    );
    if panics > 0 {
        std::process::exit(1);
    }
}
