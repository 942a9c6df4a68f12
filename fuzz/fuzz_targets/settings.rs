//! Fuzz target, fast: the ways a rig is changed before it is solved, loaded only (no
//! solve), so that it runs at the loader's speed. `--set` overrides, the file's
//! `variants` (each loaded as `compare --variants` loads it), its ranges (`spread`), a
//! bearing as `rank --to` takes it (set on every sheave and drum shaft in turn, as the
//! ranking does, and `--to rolling`'s settings), and `sweep --vary` text.
//!
//! The input is rig text; lines that start with `#%` are settings (YAML comments, so
//! the rig's line numbers stay as written):
//!
//! ```text
//! #% set KEY=VALUE      an override (at most 8)
//! #% to BEARING         `rolling` or a bearing in YAML flow text
//! #% vary KEY=FROM..TO
//! #% variants           load each variant
//! #% ranges             load each range at its nominal value
//! #% frictionless       load the rig with each part made frictionless, as `rank` does
//! ```
//!
//! Only what a line asks for is loaded beyond the rig itself, so that an input costs
//! about one load.
//!
//! Oracles: no panic; every load error names the file and locates each problem (a line
//! and column, or the key or part it concerns); a loaded rig's values are finite.
//!
//! Run (nightly): `cargo +nightly fuzz run settings corpus/settings -- -dict=rig.dict
//! -max_len=4096 -timeout=5`.
#![no_main]

use libfuzzer_sys::fuzz_target;
use reeve::model::PartKind;
use reeve::model::Rig;
use reeve::rig::{LoadError, RigText};
use reeve::study::rank::{self, Alternative};
use reeve::study::{sweep, RigSource, StudyError};

const SOURCE: &str = "fuzz.yaml";
const MAX_SETS: usize = 8;
/// Variants and parts tried per input, at most.
const MAX_TRIES: usize = 3;

fuzz_target!(|data: &[u8]| {
    let Ok(text) = std::str::from_utf8(data) else {
        return;
    };
    let mut sets = Vec::new();
    let mut to = None;
    let mut vary = None;
    let (mut variants, mut ranges, mut frictionless) = (false, false, false);
    for line in text.lines() {
        let Some(command) = line.strip_prefix("#%") else {
            continue;
        };
        let command = command.trim();
        if let Some(set) = command.strip_prefix("set ") {
            if let Some((k, v)) = set.split_once('=') {
                if sets.len() < MAX_SETS {
                    sets.push((k.trim().to_string(), v.trim().to_string()));
                }
            }
        } else if let Some(t) = command.strip_prefix("to ") {
            to = Some(Alternative::parse(t));
        } else if let Some(v) = command.strip_prefix("vary ") {
            vary = Some(v.to_string());
        } else {
            match command {
                "variants" => variants = true,
                "ranges" => ranges = true,
                "frictionless" => frictionless = true,
                _ => {}
            }
        }
    }
    let source = RigSource::new(RigText::from_text(text, SOURCE), &sets);
    if let Some(v) = vary {
        match sweep::parse_vary(&v) {
            Ok(v) => {
                assert!(v.from.is_finite() && v.to.is_finite(), "{v:?}");
                // One end, as the sweep's first step loads it.
                let value = reeve::study::with_unit(v.from, &v.unit);
                check(source.load(&[(v.key.clone(), value)]));
            }
            Err(e) => study_error(&e),
        }
    }
    match source.ranges().map(|r| if ranges { r } else { Vec::new() }) {
        Ok(ranges) => {
            for r in ranges.iter().take(MAX_TRIES) {
                let nominal = r.distribution.nominal();
                assert!(nominal.is_finite(), "{r:?}");
                check(source.load(&[r.setting(nominal)]));
            }
        }
        Err(e) => study_error(&e),
    }
    let Some(rig) = check(source.load(&[])) else {
        return;
    };
    match source
        .variants()
        .map(|v| if variants { v } else { Vec::new() })
    {
        Ok(variants) => {
            for v in variants.iter().take(MAX_TRIES) {
                assert!(!v.name.is_empty(), "a variant without a name");
                check(source.load(&v.settings));
            }
        }
        Err(e) => study_error(&e),
    }
    if let Some(alt) = &to {
        let round = rig
            .parts
            .iter()
            .enumerate()
            .filter(|(_, p)| matches!(p.kind, PartKind::Sheave(_) | PartKind::Drum(_)))
            .take(MAX_TRIES);
        for (id, _) in round {
            if let Ok(settings) = rank::alternative_settings(&rig, id, alt) {
                check(source.load(&settings));
            }
        }
    }
    let tried = if frictionless { rig.parts.len() } else { 0 };
    for id in 0..tried.min(MAX_TRIES) {
        if let Some(settings) = rank::frictionless_settings(&rig, id) {
            check(source.load(&settings));
        }
    }
});

/// A rig loads with finite values, or its error is located.
fn check(result: Result<Rig, StudyError>) -> Option<Rig> {
    match result {
        Ok(rig) => {
            for p in &rig.parts {
                assert!(
                    p.at.iter().all(|x| x.is_finite()),
                    "part `{}` at {:?}",
                    p.name,
                    p.at
                );
            }
            assert!(rig.gravity.iter().all(|x| x.is_finite()));
            for r in &rig.ropes {
                assert!(r.mu.is_finite() && r.diameter.is_finite(), "rope {r:?}");
            }
            Some(rig)
        }
        Err(e) => {
            study_error(&e);
            None
        }
    }
}

fn study_error(e: &StudyError) {
    match e {
        StudyError::Load(e) => load_error(e),
        StudyError::Solve { .. } => unreachable!("nothing is solved here"),
        StudyError::Input(m) => assert!(!m.trim().is_empty(), "an empty study error"),
    }
}

fn load_error(e: &LoadError) {
    assert_eq!(e.file, SOURCE);
    assert!(!e.problems.is_empty(), "a load error without a problem");
    for p in &e.problems {
        assert!(
            !p.message.trim().is_empty(),
            "a problem without a message: {p:?}"
        );
        match p.location {
            Some(l) => assert!(l.line >= 1 && l.column >= 1, "{p:?}"),
            None => assert!(
                !p.subject.trim().is_empty() || p.message.contains("(override `"),
                "{p:?}"
            ),
        }
    }
}
