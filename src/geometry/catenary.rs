//! The sag of a span under the rope's own weight (`mass_per_length`, DESIGN.md §7): the
//! catenary through the span's two ends, with the parabola as its check for shallow
//! spans. The statics keeps each span a straight chord; the sag is reported beside it.
//!
//! # Source
//! J. L. Meriam and L. G. Kraige, *Engineering Mechanics: Statics*, §5/9 "Flexible
//! cables": the catenary `y = c·(cosh(x/c) − 1)` with `c = H/μ` (`H` the horizontal
//! tension, `μ` the weight per length), and the parabolic cable `h = μ·L²/(8H)` for a
//! load uniform along the span, which the catenary approaches when the sag is small.

use crate::math::Real;

/// The sag of a span, m: the largest vertical distance between the chord and the
/// catenary through both ends.
///
/// # Formula
/// With `c = H/q`, horizontal run `a` and rise `b` of the chord, the catenary
/// `y(x) = c·(cosh((x − x₀)/c) − cosh(x₀/c))` through `(0, 0)` and `(a, b)` has
/// `x₀ = a/2 − c·asinh(b / (2c·sinh(a/(2c))))`; the sag is largest where the curve's
/// slope equals the chord's, `x* = x₀ + c·asinh(b/a)`, and is `b·x*/a − y(x*)`.
///
/// # Arguments
/// `run` the chord's horizontal projection `a`, m (> 0); `rise` its vertical projection
/// `b`, m (either sign); `horizontal_tension` `H`, N (> 0); `weight_per_length` `q`, N/m
/// (> 0).
///
/// # Returns
/// None when an argument is out of range or the numbers overflow (a span so slack that
/// the straight-chord statics does not hold).
///
/// # Example
/// A level span of 10 m, 1 kg/m, 1 kN horizontal tension: the parabola gives
/// `q·a²/(8H) = 9.80665·100/8000 = 0.12258 m`; the catenary agrees to 0.02 %.
/// ```
/// use reeve::geometry::catenary::sag;
/// let f = sag(10.0, 0.0, 1000.0, 9.80665).unwrap();
/// assert!((f - 0.122583).abs() < 3e-5, "{f}");
/// ```
pub fn sag(
    run: Real,
    rise: Real,
    horizontal_tension: Real,
    weight_per_length: Real,
) -> Option<Real> {
    let (a, b, h, q) = (run, rise, horizontal_tension, weight_per_length);
    if !(a > 0.0 && h > 0.0 && q > 0.0 && b.is_finite()) {
        return None;
    }
    let c = h / q;
    let x0 = 0.5 * a - c * (b / (2.0 * c * (a / (2.0 * c)).sinh())).asinh();
    let y = |x: Real| c * (((x - x0) / c).cosh() - (x0 / c).cosh());
    let x_star = x0 + c * (b / a).asinh();
    let f = b * x_star / a - y(x_star);
    (f.is_finite() && f >= 0.0).then_some(f)
}

/// The parabolic sag, m, of a span with horizontal run `a`, m, rise `b`, m, horizontal
/// tension `H`, N, and weight per length of rope `q`, N/m: the check of [`sag`] for
/// shallow spans (Meriam & Kraige §5/9, parabolic cable, a load uniform per horizontal
/// length, here `q·L/a` with `L = √(a² + b²)` the chord): `q·L·a/(8H)`, which is
/// `q·a²/(8H)` for a level span.
pub fn parabolic_sag(
    run: Real,
    rise: Real,
    horizontal_tension: Real,
    weight_per_length: Real,
) -> Real {
    weight_per_length * run.hypot(rise) * run / (8.0 * horizontal_tension)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn shallow_spans_agree_with_the_parabola() {
        for (a, b) in [(10.0, 0.0), (20.0, 3.0), (5.0, -1.0)] {
            let (h, q) = (5000.0, 9.80665);
            let f = sag(a, b, h, q).unwrap();
            let p = parabolic_sag(a, b, h, q);
            assert!((f - p).abs() / p < 2e-3, "a {a} b {b}: {f} vs {p}");
        }
    }

    #[test]
    fn the_curve_passes_both_ends() {
        // Through (a, b): the x0 of the formula puts the far end on the curve.
        let (a, b, c): (Real, Real, Real) = (12.0, 4.0, 30.0);
        let x0 = 0.5 * a - c * (b / (2.0 * c * (a / (2.0 * c)).sinh())).asinh();
        let y = c * (((a - x0) / c).cosh() - (x0 / c).cosh());
        assert!((y - b).abs() < 1e-9);
    }
}
