//! Unit tests of the drawing: dates, colours, scales, coincidence and placement.
use super::*;

#[test]
fn civil_dates() {
    // Hand-checked: day 0 is 1970-01-01; 2000-03-01 is day 11017 (30 years of
    // 365 days plus 7 leap days = 10957 to 2000-01-01, then 31 + 29).
    assert_eq!(civil_date(0), "1970-01-01");
    assert_eq!(civil_date(11_017), "2000-03-01");
    assert_eq!(civil_date(11_016), "2000-02-29");
    assert_eq!(civil_date(-1), "1969-12-31");
}

#[test]
fn ramp_ends() {
    assert_eq!(ramp(0.0), "#1f4e9c");
    assert_eq!(ramp(1.0), "#d1495b");
    assert_eq!(ramp(Real::NAN), "#1f4e9c");
}

#[test]
fn standard_scales() {
    // 2.8 m tall in 740 px (195.8 mm): 1:14.3 would fit, so 1:20 is the largest
    // standard one; 0.12 m in 700 px: 1:1; 5 mm: 20:1 (fit 37:1); 1 km: 1:10 000.
    let area = (700.0, 740.0);
    let ratio = |w, h| DrawingScale::fitting(w, h, area).ratio();
    assert_eq!(ratio(0.2, 2.8), "1:20");
    assert_eq!(ratio(0.12, 0.1), "1:1");
    assert_eq!(ratio(0.005, 0.005), "20:1");
    assert_eq!(ratio(1000.0, 10.0), "1:10000");
    // A rig that is one point still gets a scale.
    assert_eq!(ratio(0.0, 0.0), "100:1");
    let s = DrawingScale::fitting(0.2, 2.8, area);
    assert!((s.px_per_m() * 2.8 - 2800.0 / 20.0 * PX_PER_MM).abs() < 1e-9);
}

#[test]
fn coincident_segments() {
    let a = [(0.0, 0.0), (100.0, 0.0)];
    // Parallel, 3 px apart, overlapping by half: on top of each other.
    assert!(segments_coincide(a, [(50.0, 3.0), (150.0, 3.0)], 4.5));
    // 6 px apart, or touching end to end, or crossing: not.
    assert!(!segments_coincide(a, [(0.0, 6.0), (100.0, 6.0)], 4.5));
    assert!(!segments_coincide(a, [(100.0, 0.0), (200.0, 0.0)], 4.5));
    assert!(!segments_coincide(a, [(50.0, -50.0), (50.0, 50.0)], 4.5));
    // A span seen end-on (a dot) on another span.
    assert!(segments_coincide([(40.0, 1.0), (40.5, 1.0)], a, 4.5));
}

#[test]
fn groups_join_transitively() {
    let x: [Real; 4] = [0.0, 3.0, 6.0, 20.0];
    let g = groups(x.len(), |i, j| (x[i] - x[j]).abs() < 4.0);
    assert_eq!(g, vec![vec![0, 1, 2], vec![3]]);
}

#[test]
fn segments_and_boxes() {
    let b = (0.0, 0.0, 10.0, 10.0);
    assert!(segment_crosses_box((-5.0, 5.0), (15.0, 5.0), b));
    assert!(segment_crosses_box((2.0, 2.0), (3.0, 3.0), b));
    assert!(!segment_crosses_box((-5.0, -1.0), (15.0, -1.0), b));
    assert!(!segment_crosses_box((5.0, 25.0), (25.0, 5.0), b));
}

#[test]
fn words_wrap() {
    assert_eq!(wrap_words("aa bb cc", 5), vec!["aa bb", "cc"]);
}
