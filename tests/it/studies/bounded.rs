//! Bounded work and located errors in studies.

use super::*;

// ------------------------------------------ bounded work and located errors

#[test]
fn spread_with_an_absurd_sample_count_is_refused() {
    // Guards against unbounded work: a sample count near u64::MAX is refused, exit 2,
    // naming `--samples`, instead of aborting.
    let dir = Scratch::new("samples");
    dir.write("rig.yaml", ONE_SHEAVE);
    let out = reeve_in(
        &dir,
        &["spread", "rig.yaml", "--samples", "18446744073709551615"],
    );
    assert_eq!(out.code, 2, "{}", out.stderr);
    assert!(out.stderr.contains("--samples"), "{}", out.stderr);
}

#[test]
fn sweep_with_an_absurd_step_count_is_refused() {
    // Guards against unbounded work: 1e11 steps are refused, exit 2, naming `--steps`, for
    // a sweep of a key and for a stroke.
    let dir = Scratch::new("steps-huge");
    dir.write("rig.yaml", ONE_SHEAVE);
    for mode in [
        ["--vary", "parts.s.bearing.mu=0.05..0.2"],
        ["--stroke", "100"],
    ] {
        let out = reeve_in(
            &dir,
            &[
                "sweep",
                "rig.yaml",
                mode[0],
                mode[1],
                "--steps",
                "100000000000",
            ],
        );
        assert_eq!(out.code, 2, "{mode:?}: {}", out.stderr);
        assert!(out.stderr.contains("--steps"), "{}", out.stderr);
    }
}

#[test]
fn sweep_with_zero_steps_is_refused() {
    // Guards against an empty sweep: `--steps 0` is refused, exit 2, for a sweep of a key
    // and for a stroke.
    let dir = Scratch::new("steps-zero");
    dir.write("rig.yaml", ONE_SHEAVE);
    for mode in [
        ["--vary", "parts.s.bearing.mu=0.05..0.2"],
        ["--stroke", "100"],
    ] {
        let out = reeve_in(
            &dir,
            &["sweep", "rig.yaml", mode[0], mode[1], "--steps", "0"],
        );
        assert_eq!(out.code, 2, "{mode:?}: {}", out.stderr);
        assert!(out.stderr.contains("--steps"), "{}", out.stderr);
    }
}

#[test]
fn sweep_of_a_key_that_never_solves_is_bad_input() {
    // Guards the exit code of a sweep whose steps can never solve (a part that does not
    // exist, a value in the wrong unit): bad input, exit 2, naming the file, no table; a
    // range that solves in part still sweeps.
    let dir = Scratch::new("vary-bad");
    dir.write("rig.yaml", ONE_SHEAVE);
    // A part that does not exist, and a value with the wrong unit: no step can solve.
    for vary in ["parts.nope.mu=1..2", "parts.s.diameter=10kg..20kg"] {
        let out = reeve_in(&dir, &["sweep", "rig.yaml", "--vary", vary, "--steps", "3"]);
        assert_eq!(out.code, 2, "{vary}: {}", out.stderr);
        assert!(out.stderr.contains("rig.yaml"), "{}", out.stderr);
        assert!(out.stdout.is_empty(), "{vary}: a table was printed");
    }
    // A range that is valid only in part still sweeps, showing where it fails; the
    // study is incomplete, so it exits 1 (some runs fail), not 2 (it could not run).
    let out = reeve_in(
        &dir,
        &[
            "sweep",
            "rig.yaml",
            "--vary",
            "parts.s.bearing.mu=-0.1..0.2",
            "--steps",
            "3",
        ],
    );
    assert_eq!(out.code, 1, "{}", out.stderr);
    assert!(out.stdout.contains("could not be solved"), "{}", out.stdout);
}

#[test]
fn studies_locate_solve_errors_like_check() {
    // Guards located solve errors in the studies: rank, spread, compare and sweep name the
    // file, line and column of the part, as check does.
    let dir = Scratch::new("study-locate");
    // A line tied at both ends: it loads, but the solver finds that nothing can move.
    let rig = "format: 1\nropes:\n  r: {diameter: 6, mu: 0.2}\nparts:\n  a: {kind: anchor, at: [0, 0, 2000]}\n  h: {kind: haul, at: [0, 0, 0]}\nlines:\n  l: {rope: r, path: [a, h]}\n";
    std::fs::write(dir.join("rig.yaml"), rig).unwrap();
    let check = reeve_in(&dir, &["check", "rig.yaml"]);
    assert_eq!(check.code, 2);
    assert!(
        check.stderr.contains("rig.yaml:6:3: parts.h:"),
        "{}",
        check.stderr
    );
    for args in [
        &["rank", "rig.yaml"][..],
        &["spread", "rig.yaml", "--samples", "3"],
        &["compare", "rig.yaml"],
        &["sweep", "rig.yaml", "--stroke", "10"],
    ] {
        let out = reeve_in(&dir, args);
        assert_eq!(out.code, 2, "{args:?}");
        assert!(
            out.stderr.contains("rig.yaml:6:3: parts.h:"),
            "{args:?}: {}",
            out.stderr
        );
    }
}

/// Guards the spread's model path: every ranged key of the example rig is a model
/// parameter, and for many samples the rig with its draws set on the model is the rig
/// the file path loads with the same draws as overrides (compared whole).
#[test]
fn spread_samples_on_the_model_are_the_rigs_the_file_gives() {
    use reeve::rig::RigText;
    use reeve::study::spread::{draws_of, keys_of, settings_of};
    use reeve::study::RigSource;
    let path = test_rig("spread-hoist.yaml");
    let file = RigText::read(std::path::Path::new(&path)).unwrap();
    let source = RigSource::new(file, &[]);
    let ranges = source.ranges().unwrap();
    let rig = source.load(&[]).unwrap();
    let sampler = source
        .sampler(&rig, &keys_of(&ranges), &draws_of(&ranges, 3, 0))
        .expect("every ranged key of spread-hoist.yaml is a model parameter");
    for i in 0..50 {
        let fast = sampler.rig(&draws_of(&ranges, 3, i)).unwrap();
        let slow = source.load(&settings_of(&ranges, 3, i)).unwrap();
        assert_eq!(format!("{fast:?}"), format!("{slow:?}"), "sample {i}");
    }
    // A draw the loader refuses (a negative coefficient) is refused on the model too.
    let mut bad = draws_of(&ranges, 3, 0);
    bad.iter_mut().for_each(|v| *v = -1.0);
    assert!(sampler.rig(&bad).is_none());
}

/// Guards: a stroke far longer than the rig never jumps over a span that closes up. The
/// sash's span to its pulley closes after about 650 mm of travel; with a 1 km stroke the
/// midpoint of the first sub-step already lies past the pulley, whose reversed velocity
/// carried the sash back below it, so every row read "ok" at the drawn figures.
#[test]
fn a_huge_stroke_stops_where_a_span_closes_up() {
    let sash = crate::support::example_rig("sash-window");
    for distance in ["1e6 mm", "1e9 mm"] {
        // A stroke that stops short is incomplete: exit 1.
        let s = reeve(&["sweep", &sash, "--stroke", distance, "--json"])
            .expect_code(1)
            .json();
        let steps = s["steps"].as_array().unwrap();
        let stopped = steps.iter().find(|st| !st["error"].is_null());
        let Some(stopped) = stopped else {
            panic!("{distance}: no step stops, all rows are figures:\n{s}");
        };
        assert!(
            stopped["error"].as_str().unwrap().contains("closes up"),
            "{distance}: {stopped}"
        );
        assert!(
            steps.len() <= 2,
            "{distance}: figures past the closed span: {s}"
        );
    }
}

/// Guards the sweeps' exit code: a sweep or stroke where some steps cannot be solved
/// (a value the loader refuses, a stroke past where a span closes up) exited 0 like a
/// clean study, while a slack span exits 1. Such a study is incomplete: exit 1 (some
/// runs fail; 2 stays for a study that cannot run at all), with a note saying how many.
#[test]
fn a_sweep_with_unsolved_steps_exits_1_and_says_how_many() {
    let vary = reeve(&[
        "sweep",
        "rigs/workshop-hoist.yaml",
        "--vary",
        "parts.hook.load.mass=-400..800 kg",
        "--steps",
        "3",
    ]);
    assert_eq!(vary.code, 1, "{}\n{}", vary.stdout, vary.stderr);
    assert!(
        vary.stdout.contains("1 of 3 steps could not be solved"),
        "{}",
        vary.stdout
    );
    let stroke = reeve(&[
        "sweep",
        "rigs/ramp-winch.yaml",
        "--stroke",
        "3400 deg",
        "--steps",
        "4",
    ]);
    assert_eq!(stroke.code, 1, "{}\n{}", stroke.stdout, stroke.stderr);
    assert!(
        stroke.stdout.contains("1 of 5 steps could not be solved"),
        "{}",
        stroke.stdout
    );
    // Every step solved and passing: still 0.
    let clean = reeve(&[
        "sweep",
        "rigs/ramp-winch.yaml",
        "--stroke",
        "3000 deg",
        "--steps",
        "3",
    ]);
    assert_eq!(clean.code, 0, "{}\n{}", clean.stdout, clean.stderr);
    assert!(
        !clean.stdout.contains("could not be solved"),
        "{}",
        clean.stdout
    );
}

/// Guards the rope's bend loss among the sensitivities: `rank` listed every friction
/// coefficient but the rope's `bend_loss`, so on a rig whose losses are nearly all
/// bending (the gallery panel: 98.7 % of them) nothing in it pointed at the rope.
#[test]
fn rank_lists_a_ropes_bend_loss_with_the_friction_sensitivities() {
    let path = example_rig("gallery-panel");
    let r = json_of(&["rank", &path, "--json"]);
    let sens = r["sensitivities"].as_array().unwrap();
    let bend = sens
        .iter()
        .find(|s| s["key"] == "ropes.wire4.bend_loss")
        .unwrap_or_else(|| panic!("no bend-loss row: {sens:?}"));
    assert_eq!(num(&bend["value"]), 0.02);
    // It costs the most here: first in the list.
    assert_eq!(sens[0]["key"], "ropes.wire4.bend_loss", "{sens:?}");
    // 10 % less bend loss is 0.018. By hand (DESIGN.md §7, `T_slack = (1 − β)·T_b`): the
    // two sheaves' rolling bearings keep a ratio k whatever the load, so each passage
    // multiplies the tension by k/(1 − β) and the haul's force goes as 1/(1 − β)²:
    // saved = F·(1 − (0.98/0.982)²).
    let f0 = num(&r["forward"]);
    let saved = num(&bend["saved_with_10pct_less_friction"]);
    assert_rel(
        "saved, by hand",
        saved,
        f0 * (1.0 - (0.98_f64 / 0.982).powi(2)),
        1e-9,
    );
    let out = reeve(&[
        "check",
        &path,
        "--json",
        "--set",
        "ropes.wire4.bend_loss=0.018",
    ]);
    assert_rel(
        "saved, against check",
        saved,
        f0 - num(&out.json()["forward"]["value"]),
        1e-9,
    );
    // d F/dβ = 2·F/(1 − β).
    assert_rel(
        "derivative",
        num(&bend["derivative"]),
        2.0 * f0 / 0.98,
        1e-6,
    );
    // The text names it and says what its 10 % is.
    let text = stdout_of(&["rank", &path]);
    assert!(
        text.contains("ropes.wire4.bend_loss") && text.contains("bend loss β times 0.9"),
        "{text}"
    );
    // A rope without a bend loss has no such row (a 10 % cut of nothing saves nothing).
    let r = json_of(&["rank", &example_rig("workshop-hoist"), "--json"]);
    assert!(
        r["sensitivities"]
            .as_array()
            .unwrap()
            .iter()
            .all(|s| !s["key"].as_str().unwrap().ends_with(".bend_loss")),
        "{r}"
    );
}
