//! Adversarial review of the command line: the real binary used as a careless or
//! hurried user would use it. Each test pins a problem that was found and fixed: the
//! tool must not write over its input, must not replace a special file with a regular
//! one, must bound the work it is asked for instead of aborting, and must give exit 2
//! with a clear message on bad arguments.

use std::path::{Path, PathBuf};
use std::process::Command;

use crate::support::run::Ran;
use crate::support::{assert_abs, Reeve, Scratch};

/// A small rig that solves: a weight over one plain-bearing sheave, hauled by hand.
const RIG: &str = "format: 1
title: review rig
units: {length: mm, force: N, mass: kg}
ropes:
  r: {diameter: 6, mu: 0.2}
parts:
  s: {kind: sheave, at: [0, 0, 2000], axle: [0, 1, 0], diameter: 50,
      bearing: {kind: plain, pin_diameter: 8, mu: 0.1}}
  w: {kind: weight, at: [-25, 0, 1000], mass: 5}
  h: {kind: haul, at: [25, 0, 1000]}
lines:
  l: {rope: r, path: [w, s, h]}
";

fn write_rig(dir: &Path) -> PathBuf {
    let path = dir.join("rig.yaml");
    std::fs::write(&path, RIG).unwrap();
    path
}

/// `reeve ARGS` run in `dir`.
fn reeve(dir: &Path, args: &[&str]) -> Ran {
    Reeve::new(args).in_dir(dir).run()
}

#[test]
fn sweep_plot_refuses_to_write_over_the_input_rig() {
    let dir = Scratch::new("plot-input");
    write_rig(&dir);
    let out = reeve(
        &dir,
        &[
            "sweep",
            "rig.yaml",
            "--vary",
            "parts.s.bearing.mu=0.05..0.2",
            "--steps",
            "3",
            "--plot",
            "./rig.yaml",
        ],
    );
    assert_eq!(out.code, 2, "{}", out.stderr);
    assert!(out.stderr.contains("refusing to write over the input rig"));
    assert_eq!(
        std::fs::read_to_string(dir.join("rig.yaml")).unwrap(),
        RIG,
        "the input rig was changed"
    );
}

#[cfg(unix)]
#[test]
fn output_to_a_fifo_writes_into_it_and_keeps_it() {
    use std::io::Read;
    use std::os::unix::fs::FileTypeExt;
    let dir = Scratch::new("fifo");
    write_rig(&dir);
    let fifo = dir.join("out.svg");
    let made = Command::new("mkfifo").arg(&fifo).status();
    if !matches!(made, Ok(s) if s.success()) {
        eprintln!("mkfifo is not available; skipped");
        return;
    }
    // Opened for reading and writing, a FIFO does not block, and it keeps a reader
    // present while reeve writes (the drawing is far below the pipe's buffer).
    let mut end = std::fs::OpenOptions::new()
        .read(true)
        .write(true)
        .open(&fifo)
        .unwrap();
    let out = reeve(&dir, &["draw", "rig.yaml", "-o", "out.svg"]);
    assert_eq!(out.code, 0, "{}", out.stderr);
    let kind = std::fs::symlink_metadata(&fifo).unwrap().file_type();
    assert!(kind.is_fifo(), "the FIFO was replaced by a regular file");
    let mut buf = [0u8; 512];
    let n = end.read(&mut buf).unwrap();
    assert!(String::from_utf8_lossy(&buf[..n]).contains("<svg"));
}

#[test]
fn spread_with_an_absurd_sample_count_is_refused() {
    let dir = Scratch::new("samples");
    write_rig(&dir);
    let out = reeve(
        &dir,
        &["spread", "rig.yaml", "--samples", "18446744073709551615"],
    );
    assert_eq!(out.code, 2, "{}", out.stderr);
    assert!(out.stderr.contains("--samples"), "{}", out.stderr);
}

#[test]
fn sweep_with_an_absurd_step_count_is_refused() {
    let dir = Scratch::new("steps-huge");
    write_rig(&dir);
    for mode in [
        ["--vary", "parts.s.bearing.mu=0.05..0.2"],
        ["--stroke", "100"],
    ] {
        let out = reeve(
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
    let dir = Scratch::new("steps-zero");
    write_rig(&dir);
    for mode in [
        ["--vary", "parts.s.bearing.mu=0.05..0.2"],
        ["--stroke", "100"],
    ] {
        let out = reeve(
            &dir,
            &["sweep", "rig.yaml", mode[0], mode[1], "--steps", "0"],
        );
        assert_eq!(out.code, 2, "{mode:?}: {}", out.stderr);
        assert!(out.stderr.contains("--steps"), "{}", out.stderr);
    }
}

#[test]
fn sweep_of_a_key_that_never_solves_is_bad_input() {
    let dir = Scratch::new("vary-bad");
    write_rig(&dir);
    // A part that does not exist, and a value with the wrong unit: no step can solve.
    for vary in ["parts.nope.mu=1..2", "parts.s.diameter=10kg..20kg"] {
        let out = reeve(&dir, &["sweep", "rig.yaml", "--vary", vary, "--steps", "3"]);
        assert_eq!(out.code, 2, "{vary}: {}", out.stderr);
        assert!(out.stderr.contains("rig.yaml"), "{}", out.stderr);
        assert!(out.stdout.is_empty(), "{vary}: a table was printed");
    }
    // A range that is valid only in part still sweeps, showing where it fails.
    let out = reeve(
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
    assert_eq!(out.code, 0, "{}", out.stderr);
}

#[test]
fn studies_locate_solve_errors_like_check() {
    let dir = Scratch::new("study-locate");
    // A line tied at both ends: it loads, but the solver finds that nothing can move.
    let rig = "format: 1\nropes:\n  r: {diameter: 6, mu: 0.2}\nparts:\n  a: {kind: anchor, at: [0, 0, 2000]}\n  h: {kind: haul, at: [0, 0, 0]}\nlines:\n  l: {rope: r, path: [a, h]}\n";
    std::fs::write(dir.join("rig.yaml"), rig).unwrap();
    let check = reeve(&dir, &["check", "rig.yaml"]);
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
        let out = reeve(&dir, args);
        assert_eq!(out.code, 2, "{args:?}");
        assert!(
            out.stderr.contains("rig.yaml:6:3: parts.h:"),
            "{args:?}: {}",
            out.stderr
        );
    }
}

/// Guards the file check at the command line: a NUL in a comment ended the reading
/// there and the run went on with half a file (exit 0).
#[test]
fn a_control_character_in_the_rig_file_is_exit_2_with_line_and_column() {
    let dir = Scratch::new("nul-comment");
    let text = RIG.replace(
        "lines:\n",
        "# a \u{0} here\nlimits: {design_factor: 50}\nlines:\n",
    );
    std::fs::write(dir.join("rig.yaml"), text).unwrap();
    let out = reeve(&dir, &["check", "rig.yaml"]);
    assert_eq!(out.code, 2, "{}", out.stderr);
    assert!(out.stderr.contains("rig.yaml:11:5:"), "{}", out.stderr);
    assert!(out.stderr.contains("U+0000 (NUL)"), "{}", out.stderr);
}

/// Guards the other ways text enters: `--set` values, `variants` (after YAML escapes)
/// and `rank --to` get the file's character check, and the message shows the character
/// escaped, never raw on the terminal.
#[test]
fn control_characters_in_set_variants_and_rank_to_are_refused() {
    let dir = Scratch::new("control-entries");
    let variants = RIG.to_string() + "variants:\n  bad: [\"parts.s.bearing.mu=0.1\\0\"]\n";
    write_rig(&dir);
    std::fs::write(dir.join("variants.yaml"), &variants).unwrap();
    for args in [
        &[
            "check",
            "rig.yaml",
            "--set",
            "parts.s.bearing.mu=0.1\u{1b}[2J",
        ][..],
        &["check", "rig.yaml", "--set", "title=a \u{202e}title"],
        &["compare", "variants.yaml", "--variants"],
        &[
            "rank",
            "rig.yaml",
            "--to",
            "{kind: plain, pin_diameter: 8, mu: 0.08}\u{1b}[2J",
        ],
    ] {
        let out = reeve(&dir, args);
        let err = out.stderr;
        assert_eq!(out.code, 2, "{args:?}: {err}");
        assert!(err.contains("character U+"), "{args:?}: {err}");
        assert!(
            !err.contains(['\u{1b}', '\u{0}', '\u{202e}']),
            "{args:?}: raw in {err:?}"
        );
    }
}

/// Guards `rank --to` units: a bare number in the bearing text is in the rig's length
/// unit (a bare `8` on a metre rig is an 8 m pin, refused as not fitting, with a hint),
/// and a unit may be written (`8 mm`) with the same result as the bare number on a
/// millimetre rig.
#[test]
fn rank_to_reads_bare_numbers_in_the_rigs_units_and_accepts_units() {
    let dir = Scratch::new("rank-to-units");
    write_rig(&dir);
    let metres = RIG
        .replace("length: mm", "length: m")
        .replace("diameter: 6,", "diameter: 0.006,")
        .replace("[0, 0, 2000]", "[0, 0, 2]")
        .replace("diameter: 50,", "diameter: 0.05,")
        .replace("pin_diameter: 8,", "pin_diameter: 0.008,")
        .replace("[-25, 0, 1000]", "[-0.025, 0, 1]")
        .replace("[25, 0, 1000]", "[0.025, 0, 1]");
    std::fs::write(dir.join("metres.yaml"), metres).unwrap();
    let rank = |file: &str, to: &str| {
        let out = reeve(&dir, &["rank", file, "--to", to, "--format", "json"]);
        (out.code, out.stdout, out.stderr)
    };
    let (code, bare_mm, err) = rank("rig.yaml", "{kind: plain, pin_diameter: 8, mu: 0.08}");
    assert_eq!(code, 0, "{err}");
    let (code, with_unit, err) = rank("rig.yaml", "{kind: plain, pin_diameter: 8 mm, mu: 0.08}");
    assert_eq!(code, 0, "{err}");
    let alternative = |json: &str| {
        let v: serde_json::Value = serde_json::from_str(json).unwrap();
        v["parts"][0]["alternative"].as_f64().unwrap()
    };
    assert_eq!(alternative(&bare_mm), alternative(&with_unit));
    let (code, _, err) = rank("metres.yaml", "{kind: plain, pin_diameter: 8, mu: 0.08}");
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains("--to") && err.contains("8 m") && err.contains("bare numbers"),
        "{err}"
    );
    let (code, with_unit_m, err) =
        rank("metres.yaml", "{kind: plain, pin_diameter: 8 mm, mu: 0.08}");
    assert_eq!(code, 0, "{err}");
    let ratio = alternative(&with_unit_m) / alternative(&with_unit);
    assert_abs(
        "8 mm pin on a metre rig over the same on a mm rig",
        ratio,
        1.0,
        1e-9,
    );
}
