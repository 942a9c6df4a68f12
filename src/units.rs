//! Units at the edges: SI (m, N, kg, N·m) and radians inside the library; conversion
//! only when a rig file is read and when a report is written.
//!
//! Every factor below is the unit's defining value, exact by definition:
//! - inch = 0.0254 m and foot = 0.3048 m (international yard and pound agreement, 1959);
//! - pound (mass) = 0.453 592 37 kg (same agreement);
//! - pound-force = 0.453 592 37 kg × 9.806 65 m/s² = 4.448 221 615 260 5 N
//!   (standard gravity, 3rd CGPM 1901);
//! - gram, centimetre, millimetre, kilonewton: SI prefixes.

use std::fmt;

use crate::math::{Real, STANDARD_GRAVITY};

/// Metres in one inch (exact, 1959 agreement).
pub const INCH: Real = 0.0254;
/// Metres in one foot (exact, 1959 agreement).
pub const FOOT: Real = 0.3048;
/// Kilograms in one avoirdupois pound (exact, 1959 agreement).
pub const POUND: Real = 0.453_592_37;
/// Newtons in one pound-force: one pound under standard gravity (exact by definition).
pub const POUND_FORCE: Real = POUND * STANDARD_GRAVITY;

/// What a number measures.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Dimension {
    /// Metres inside.
    Length,
    /// Newtons inside.
    Force,
    /// Kilograms inside.
    Mass,
    /// Newton-metres inside.
    Torque,
    /// Kilograms per metre inside (a rope's `mass_per_length`; DESIGN.md §7).
    MassPerLength,
}

impl Dimension {
    /// Lowercase name for messages.
    pub fn name(self) -> &'static str {
        match self {
            Dimension::Length => "length",
            Dimension::Force => "force",
            Dimension::Mass => "mass",
            Dimension::Torque => "torque",
            Dimension::MassPerLength => "mass per length",
        }
    }

    /// The unit spellings this dimension accepts, for messages.
    pub fn spellings(self) -> &'static [&'static str] {
        match self {
            Dimension::Length => &["mm", "cm", "m", "in", "ft"],
            Dimension::Force => &["N", "kN", "MN", "lbf"],
            Dimension::Mass => &["kg", "g", "lb"],
            Dimension::Torque => &["N*m", "N*mm", "lbf*in", "lbf*ft"],
            Dimension::MassPerLength => &["kg/m", "g/m", "lb/ft"],
        }
    }
}

/// One unit of one dimension: its canonical spelling and its size in SI.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Unit {
    /// What it measures.
    pub dimension: Dimension,
    /// Canonical spelling, as shown in reports (`mm`, `kN`, `lbf*ft`).
    pub symbol: &'static str,
    /// The SI value of one of this unit.
    pub si: Real,
}

impl fmt::Display for Unit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.symbol)
    }
}

const UNITS: &[Unit] = &[
    Unit {
        dimension: Dimension::Length,
        symbol: "mm",
        si: 1e-3,
    },
    Unit {
        dimension: Dimension::Length,
        symbol: "cm",
        si: 1e-2,
    },
    Unit {
        dimension: Dimension::Length,
        symbol: "m",
        si: 1.0,
    },
    Unit {
        dimension: Dimension::Length,
        symbol: "in",
        si: INCH,
    },
    Unit {
        dimension: Dimension::Length,
        symbol: "ft",
        si: FOOT,
    },
    Unit {
        dimension: Dimension::Force,
        symbol: "N",
        si: 1.0,
    },
    Unit {
        dimension: Dimension::Force,
        symbol: "kN",
        si: 1e3,
    },
    Unit {
        dimension: Dimension::Force,
        symbol: "lbf",
        si: POUND_FORCE,
    },
    Unit {
        dimension: Dimension::Mass,
        symbol: "kg",
        si: 1.0,
    },
    Unit {
        dimension: Dimension::Mass,
        symbol: "g",
        si: 1e-3,
    },
    Unit {
        dimension: Dimension::Mass,
        symbol: "lb",
        si: POUND,
    },
    Unit {
        dimension: Dimension::Torque,
        symbol: "N*m",
        si: 1.0,
    },
    Unit {
        dimension: Dimension::Torque,
        symbol: "N*mm",
        si: 1e-3,
    },
    Unit {
        dimension: Dimension::Torque,
        symbol: "lbf*in",
        si: POUND_FORCE * INCH,
    },
    Unit {
        dimension: Dimension::Torque,
        symbol: "lbf*ft",
        si: POUND_FORCE * FOOT,
    },
    // DESIGN.md §7 (kept after the defaults, whose indices UnitSystem::default uses).
    Unit {
        dimension: Dimension::Force,
        symbol: "MN",
        si: 1e6,
    },
    Unit {
        dimension: Dimension::MassPerLength,
        symbol: "kg/m",
        si: 1.0,
    },
    Unit {
        dimension: Dimension::MassPerLength,
        symbol: "g/m",
        si: 1e-3,
    },
    Unit {
        dimension: Dimension::MassPerLength,
        symbol: "lb/ft",
        si: POUND / FOOT,
    },
];

/// Looks a unit up by spelling. Accepts the canonical spellings plus the usual
/// variants of a product (`N·m`, `N.m`, `Nm`, `N m`, `lbf-ft`, `lb*ft` is *not* a torque).
pub fn parse_unit(text: &str) -> Option<Unit> {
    let cleaned: String = text
        .trim()
        .replace(['·', '.', '-', ' '], "*")
        .replace("**", "*");
    let canonical = match cleaned.as_str() {
        "Nm" => "N*m",
        "Nmm" => "N*mm",
        "in*lbf" => "lbf*in",
        "ft*lbf" => "lbf*ft",
        "m*N" => "N*m",
        "mm*N" => "N*mm",
        "inch" | "inches" => "in",
        "feet" | "foot" => "ft",
        "lbs" => "lb",
        other => other,
    };
    UNITS.iter().copied().find(|u| u.symbol == canonical)
}

/// Looks a unit up and checks that it measures `dimension`.
pub fn parse_unit_of(text: &str, dimension: Dimension) -> Result<Unit, UnitError> {
    match parse_unit(text) {
        Some(u) if u.dimension == dimension => Ok(u),
        Some(u) => Err(UnitError::WrongDimension {
            unit: text.trim().to_string(),
            found: u.dimension,
            expected: dimension,
        }),
        None => Err(UnitError::Unknown {
            unit: text.trim().to_string(),
            expected: dimension,
        }),
    }
}

/// A problem with a unit or a quantity string.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum UnitError {
    /// The spelling is not a unit we know.
    #[error("unknown unit `{unit}`; expected a {} unit: {}", expected.name(), expected.spellings().join(", "))]
    Unknown {
        /// What was written.
        unit: String,
        /// What the key needs.
        expected: Dimension,
    },
    /// A unit of another dimension (a mass where a force belongs).
    #[error("`{unit}` is a {} unit, but a {} is expected here ({})", found.name(), expected.name(), expected.spellings().join(", "))]
    WrongDimension {
        /// What was written.
        unit: String,
        /// What that unit measures.
        found: Dimension,
        /// What the key needs.
        expected: Dimension,
    },
    /// The text does not start with a number.
    #[error("`{text}` is not a number with a unit; expected e.g. `{example}`")]
    NotAQuantity {
        /// What was written.
        text: String,
        /// An example of the right form.
        example: &'static str,
    },
    /// NaN or infinity.
    #[error("`{text}` is not a finite number")]
    NotFinite {
        /// What was written.
        text: String,
    },
}

/// Parses `"7.5 kN"`, `"6mm"`, `"1.2 N*m"` or a bare `"40"` (which takes `default`) into
/// an SI value of `dimension`.
pub fn parse_quantity(text: &str, dimension: Dimension, default: Unit) -> Result<Real, UnitError> {
    let t = text.trim();
    let split = t
        .char_indices()
        .find(|&(i, c)| {
            !(c.is_ascii_digit()
                || c == '.'
                || c == '+'
                || c == '-'
                || ((c == 'e' || c == 'E')
                    && t[i + 1..]
                        .starts_with(|n: char| n.is_ascii_digit() || n == '-' || n == '+')
                    && i > 0))
        })
        .map(|(i, _)| i)
        .unwrap_or(t.len());
    let (number, unit) = t.split_at(split);
    let example = match dimension {
        Dimension::Length => "6 mm",
        Dimension::Force => "7.5 kN",
        Dimension::Mass => "40 kg",
        Dimension::Torque => "1.2 N*m",
        Dimension::MassPerLength => "0.25 kg/m",
    };
    let value: Real = number.trim().parse().map_err(|_| UnitError::NotAQuantity {
        text: t.to_string(),
        example,
    })?;
    if !value.is_finite() {
        return Err(UnitError::NotFinite {
            text: t.to_string(),
        });
    }
    let unit = if unit.trim().is_empty() {
        default
    } else {
        parse_unit_of(unit, dimension)?
    };
    Ok(value * unit.si)
}

/// kg/m, the unit of bare `mass_per_length` numbers (no `units` key names one).
const KILOGRAM_PER_METRE: Unit = Unit {
    dimension: Dimension::MassPerLength,
    symbol: "kg/m",
    si: 1.0,
};

/// The units a rig file uses for bare numbers, and the units its reports show.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct UnitSystem {
    /// Lengths (default mm).
    pub length: Unit,
    /// Forces (default N).
    pub force: Unit,
    /// Masses (default kg).
    pub mass: Unit,
    /// Torques (default N*m).
    pub torque: Unit,
}

impl Default for UnitSystem {
    fn default() -> Self {
        // Indices into the unit table: mm, N, kg, N*m (checked by a unit test).
        UnitSystem {
            length: UNITS[0],
            force: UNITS[5],
            mass: UNITS[8],
            torque: UNITS[11],
        }
    }
}

impl UnitSystem {
    /// The unit this system uses for `dimension`.
    pub fn unit(&self, dimension: Dimension) -> Unit {
        match dimension {
            Dimension::Length => self.length,
            Dimension::Force => self.force,
            Dimension::Mass => self.mass,
            Dimension::Torque => self.torque,
            // No `units` key names it: bare numbers and reports are in kg/m.
            Dimension::MassPerLength => KILOGRAM_PER_METRE,
        }
    }

    /// Converts an SI value into this system's unit for `dimension`.
    pub fn from_si(&self, value: Real, dimension: Dimension) -> Real {
        value / self.unit(dimension).si
    }

    /// An SI value as the reports show it: in this system's unit for `dimension`, to
    /// four significant figures, with the unit (`2.600 kN`); `—` when not finite.
    ///
    /// ```
    /// use reeve::units::{parse_unit, Dimension, UnitSystem};
    /// let mut units = UnitSystem::default();
    /// units.force = parse_unit("kN").unwrap();
    /// assert_eq!(units.show(2769.3525, Dimension::Force), "2.769 kN");
    /// ```
    pub fn show(&self, value: Real, dimension: Dimension) -> String {
        let unit = self.unit(dimension);
        if value.is_finite() {
            format!("{} {}", significant(value / unit.si, 4), unit.symbol)
        } else {
            "—".to_string()
        }
    }
}

/// Formats a number with about `sig` significant figures, without exponent for the
/// everyday range (1e-4 to 1e10), and `—` for a value that is not finite.
///
/// ```
/// use reeve::units::significant;
/// assert_eq!(significant(196.133, 4), "196.1");
/// assert_eq!(significant(2.5e12, 3), "2.50e12");
/// ```
pub fn significant(x: Real, sig: usize) -> String {
    if !x.is_finite() {
        return "—".to_string();
    }
    if x == 0.0 {
        return "0".to_string();
    }
    let mag = x.abs().log10().floor() as i32;
    if !(-4..=9).contains(&mag) {
        return format!("{:.*e}", sig.saturating_sub(1), x);
    }
    let decimals = (sig as i32 - 1 - mag).max(0) as usize;
    let shown = format!("{:.*}", decimals, x);
    // Rounding may carry into the next decade (0.99996 → 1.0000): one digit fewer then.
    match shown.trim_start_matches('-').parse::<Real>() {
        Ok(rounded) if decimals > 0 && rounded >= 10.0_f64.powi(mag + 1) => {
            format!("{:.*}", decimals - 1, x)
        }
        _ => shown,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn si(text: &str, d: Dimension) -> Real {
        parse_quantity(text, d, UnitSystem::default().unit(d)).unwrap()
    }

    #[test]
    fn defining_values() {
        // International yard and pound agreement (1959): 1 in = 25.4 mm, 1 ft = 0.3048 m,
        // 1 lb = 0.45359237 kg, all exact.
        assert_eq!(si("1 in", Dimension::Length), 0.0254);
        assert_eq!(si("1 ft", Dimension::Length), 0.3048);
        assert_eq!(si("1 lb", Dimension::Mass), 0.45359237);
        // 1 lbf = 0.45359237 kg × 9.80665 m/s² = 4.4482216152605 N exactly.
        assert!((si("1 lbf", Dimension::Force) - 4.4482216152605).abs() < 1e-15);
        assert_eq!(si("1 mm", Dimension::Length), 1e-3);
        assert_eq!(si("1 cm", Dimension::Length), 1e-2);
        assert_eq!(si("1 m", Dimension::Length), 1.0);
        assert_eq!(si("1 kN", Dimension::Force), 1e3);
        assert_eq!(si("1 N", Dimension::Force), 1.0);
        assert_eq!(si("1 g", Dimension::Mass), 1e-3);
        assert_eq!(si("1 kg", Dimension::Mass), 1.0);
        assert_eq!(si("1 N*m", Dimension::Torque), 1.0);
        assert_eq!(si("1 N*mm", Dimension::Torque), 1e-3);
        assert!((si("1 lbf*in", Dimension::Torque) - 4.4482216152605 * 0.0254).abs() < 1e-15);
        assert!((si("1 lbf*ft", Dimension::Torque) - 4.4482216152605 * 0.3048).abs() < 1e-15);
        // DESIGN.md §7: force `MN`; mass per length `kg/m`, `g/m`, `lb/ft`.
        assert_eq!(si("9.80665 MN", Dimension::Force), 9.80665e6);
        assert_eq!(si("1 kg/m", Dimension::MassPerLength), 1.0);
        assert_eq!(si("250 g/m", Dimension::MassPerLength), 0.25);
        assert!((si("1 lb/ft", Dimension::MassPerLength) - 0.45359237 / 0.3048).abs() < 1e-15);
        assert_eq!(si("0.5", Dimension::MassPerLength), 0.5); // bare: kg/m
    }

    #[test]
    fn default_units_are_mm_n_kg_nm() {
        let d = UnitSystem::default();
        let symbols = [
            d.length.symbol,
            d.force.symbol,
            d.mass.symbol,
            d.torque.symbol,
        ];
        assert_eq!(symbols, ["mm", "N", "kg", "N*m"]);
    }

    #[test]
    fn spellings_and_bare_numbers() {
        assert_eq!(si("7.5 kN", Dimension::Force), 7500.0);
        assert_eq!(si("6mm", Dimension::Length), 0.006);
        assert_eq!(si("40", Dimension::Mass), 40.0);
        assert_eq!(si("1.2 N·m", Dimension::Torque), 1.2);
        assert_eq!(si("2 Nm", Dimension::Torque), 2.0);
        assert_eq!(si("1e3 mm", Dimension::Length), 1.0);
        assert_eq!(si("-2.5 in", Dimension::Length), -0.0635);
    }

    #[test]
    fn errors_say_what_was_expected() {
        let d = UnitSystem::default();
        let e = parse_quantity("6 furlong", Dimension::Length, d.length).unwrap_err();
        assert!(e.to_string().contains("unknown unit `furlong`"), "{e}");
        let e = parse_quantity("6 kg", Dimension::Force, d.force).unwrap_err();
        assert!(e.to_string().contains("mass unit"), "{e}");
        let e = parse_quantity("heavy", Dimension::Mass, d.mass).unwrap_err();
        assert!(matches!(e, UnitError::NotAQuantity { .. }));
        let e = parse_quantity("inf N", Dimension::Force, d.force).unwrap_err();
        assert!(matches!(
            e,
            UnitError::NotAQuantity { .. } | UnitError::NotFinite { .. }
        ));
    }
}
