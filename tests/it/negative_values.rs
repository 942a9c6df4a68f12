//! Guards that option values starting with a minus sign reach the option instead of
//! being read as a flag: a stroke backward (`--stroke "-90 deg"`, as `--stroke=-90 deg`
//! always worked), and negative values in `--vary` and `--set`; and that `--stroke`
//! without a distance still leaves the next flag a flag.

use crate::support::run::reeve;

#[test]
fn a_backward_stroke_is_read_as_the_strokes_distance() {
    let spaced = reeve(&[
        "sweep",
        "rigs/ramp-winch.yaml",
        "--stroke",
        "-90 deg",
        "--steps",
        "2",
        "--json",
    ])
    .expect_code(0);
    let joined = reeve(&[
        "sweep",
        "rigs/ramp-winch.yaml",
        "--stroke=-90 deg",
        "--steps",
        "2",
        "--json",
    ])
    .expect_code(0);
    assert_eq!(spaced.stdout, joined.stdout);
    // A bare negative number too (file units).
    reeve(&[
        "sweep",
        "rigs/ramp-winch.yaml",
        "--stroke",
        "-90",
        "--steps",
        "2",
    ])
    .expect_code(0);
    // Without a distance, the next flag stays a flag: this rig gives no `travel`, and
    // the message says so rather than reading `--steps` as a distance.
    let bare = reeve(&["sweep", "rigs/ramp-winch.yaml", "--stroke", "--steps", "2"]).expect_code(2);
    assert!(
        bare.stderr.contains("without a distance"),
        "{}",
        bare.stderr
    );
}

#[test]
fn negative_values_in_vary_and_set_reach_the_rig() {
    // The loader, not clap, refuses a negative mass: it was read as the value.
    let vary = reeve(&[
        "sweep",
        "rigs/workshop-hoist.yaml",
        "--vary",
        "parts.hook.load.mass=-400..800 kg",
        "--steps",
        "3",
    ]);
    assert_eq!(vary.code, 1, "{}", vary.stderr);
    let set = reeve(&[
        "check",
        "rigs/workshop-hoist.yaml",
        "--set",
        "parts.hook.load.mass=-400",
    ])
    .expect_code(2);
    assert!(set.stderr.contains("found `-400`"), "{}", set.stderr);
    // A value that is all number is read as the option's and refused by our own
    // message, not clap's "unexpected argument".
    let bare = reeve(&["check", "rigs/workshop-hoist.yaml", "--set", "-400"]).expect_code(2);
    assert!(
        bare.stderr.contains("--set `-400`: expected KEY=VALUE"),
        "{}",
        bare.stderr
    );
}
