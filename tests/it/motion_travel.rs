//! `motion` following the travel: where the rope geometry ends before the stops.

use crate::support::example_rig;
use crate::support::run::reeve_on;

#[test]
fn a_travel_longer_than_the_rig_is_refused_where_a_span_closes_up() {
    // Guards the travel profile of `motion` against long steps (review of issues 12 and
    // 13): on the sash with a travel of 100 m the profile's midpoint steps passed the
    // pulley, the reversed velocities carried the sash back, and the run reported a
    // clean `reaches-forward-stop 100000 mm at 26.78 m/s`. The sash meets its pulley
    // within a metre: the run must be refused there (exit 2), naming the span.
    let text = std::fs::read_to_string(example_rig("sash-window")).expect("rig");
    let (head, tail) = text.split_once("\ntravel:").expect("the sash has a travel");
    let rest = tail.split_once('\n').map_or("", |(_, r)| r);
    let long = format!("{head}\ntravel: {{back: 0, forward: 1e5 mm}}\n{rest}");
    let ran = reeve_on(&long, &["motion"]);
    assert_eq!(ran.code, 2, "{}\n{}", ran.stdout, ran.stderr);
    assert!(ran.stderr.contains("closes up"), "{}", ran.stderr);
    assert!(
        !ran.stdout.contains("reaches-forward-stop"),
        "{}",
        ran.stdout
    );
    // The sash's own travel still runs to its stop.
    let ran = reeve_on(&text, &["motion"]);
    assert_eq!(ran.code, 0, "{}", ran.stderr);
}
