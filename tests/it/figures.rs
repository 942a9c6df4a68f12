//! Guards that a figure shown to N significant digits has N digits where rounding
//! carries into the next decade (0.99996 to 4 digits is `1.000`, not `1.0000`; seen in
//! the velocity-ratio column of `reeve sweep rigs/cliff-raise.yaml --stroke "5 m"`).

use reeve::units::significant;

#[test]
fn rounding_into_the_next_decade_keeps_the_number_of_digits() {
    for (x, shown) in [
        (0.99996, "1.000"),
        (-0.99996, "-1.000"),
        (9.99996, "10.00"),
        (99.9996, "100.0"),
        (999.96, "1000"),
        (0.0099996, "0.01000"),
        (0.99994, "0.9999"),
        (1.0, "1.000"),
        (123.456, "123.5"),
    ] {
        assert_eq!(significant(x, 4), shown, "{x}");
    }
    assert_eq!(significant(0.9996, 3), "1.00");
}
