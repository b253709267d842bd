//! Bounded mutation fuzzing in the test command (the long run is
//! `examples/fuzz.rs`, by hand; its counts are in the README).
#![cfg(not(target_arch = "wasm32"))]

mod fuzz;

use proptest::prelude::*;

#[test]
fn mutated_inputs_never_panic_a_fixed_seed_run() {
    let seeds = fuzz::seeds();
    let mut rng = fuzz::Rng::new(0x4845_4144_524f_4f4d);
    let mut tally = fuzz::Tally::default();
    for i in 0..3000 {
        let base = &seeds[i % seeds.len()];
        let input = fuzz::mutate(&mut rng, base);
        fuzz::exercise(&input, &mut tally);
    }
    // The mutations must reach both outcomes, or the run tests nothing.
    assert!(tally.read > 500 && tally.refused > 500, "{tally:?}");
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    #[test]
    fn any_seeded_mutation_is_read_or_refused(seed in any::<u64>(), which in 0usize..6) {
        let seeds = fuzz::seeds();
        let mut rng = fuzz::Rng::new(seed);
        let input = fuzz::mutate(&mut rng, &seeds[which]);
        fuzz::exercise(&input, &mut fuzz::Tally::default());
    }
}
