//! Fuzz target: arbitrary bytes as a rig file. Loading must return a rig or located
//! errors, never panic or hang; a rig that loads is solved, checked and reported, and
//! a solve that succeeds must give finite ideal, forward and back values.
//!
//! Run (nightly): `cargo +nightly fuzz run load -- -max_len=4096 -timeout=5`.
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    // The CLI refuses non-UTF-8 files before parsing; do the same.
    let Ok(text) = std::str::from_utf8(data) else {
        return;
    };
    let Ok(rig) = reeve::rig::load_str(text, "fuzz.yaml") else {
        return;
    };
    let Ok(solution) = reeve::solve::solve(&rig, &reeve::solve::SolveOptions::default()) else {
        return;
    };
    for sub in &solution.subrigs {
        for value in [sub.ideal.value, sub.forward.value, sub.back.value] {
            assert!(value.is_finite(), "a solved rig gave {value}");
        }
    }
    let warnings = reeve::checks::run(&rig, &solution);
    let report = reeve::report::Report::build(&rig, &solution, warnings);
    let mut sink = Vec::new();
    let _ = reeve::report::text::write_check(&mut sink, &rig, &report, "fuzz.yaml");
    let _ = serde_json::to_string(&report);
});
