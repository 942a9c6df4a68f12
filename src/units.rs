//! Units at the edges: SI (m, N, kg, N·m) and radians inside the library; conversion
//! only when a rig file is read and when a report is written.
//!
//! Every factor below is the unit's defining value, exact by definition:
//! - inch = 0.0254 m and foot = 0.3048 m (international yard and pound agreement, 1959);
//! - pound (mass) = 0.453 592 37 kg (same agreement);
//! - pound-force = 0.453 592 37 kg × 9.806 65 m/s² = 4.448 221 615 260 5 N
//!   (standard gravity, 3rd CGPM 1901);
//! - gram, centimetre, millimetre, kilonewton: SI prefixes.
//!
//! They agree with the conversion factors of NIST Special Publication 811, Appendix B.8
//! (checked by a test beside the defining values). Which units a report shows is a
//! [`UnitSystem`]: the file's own, or one of [`UnitChoice`] (`--units`).

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
    /// Seconds inside (schedules; DESIGN.md §7).
    Time,
    /// Newtons per metre inside (a block spring's `rate`).
    SpringRate,
    /// Newton-metres per radian inside (a drum spring's `rate`).
    TorsionRate,
    /// Kilogram square metres inside (rotational `inertia`).
    Inertia,
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
            Dimension::Time => "time",
            Dimension::SpringRate => "spring rate",
            Dimension::TorsionRate => "torsion rate",
            Dimension::Inertia => "rotational inertia",
        }
    }

    /// The unit spellings this dimension accepts, for messages.
    pub fn spellings(self) -> &'static [&'static str] {
        match self {
            Dimension::Length => &["mm", "cm", "m", "in", "ft"],
            Dimension::Force => &["N", "kN", "MN", "lbf"],
            Dimension::Mass => &["kg", "g", "lb"],
            Dimension::Torque => &["N*m", "N*mm", "kN*m", "lbf*in", "lbf*ft"],
            Dimension::MassPerLength => &["kg/m", "g/m", "lb/ft"],
            Dimension::Time => &["s", "min", "h"],
            Dimension::SpringRate => &["N/m", "N/mm", "kN/m", "lbf/in"],
            Dimension::TorsionRate => &["N*m/rad", "N*m/deg"],
            Dimension::Inertia => &["kg*m^2"],
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

/// Every unit, by its canonical spelling: what a rig file may write and what a report
/// may show.
pub mod unit {
    use super::{Dimension, Unit, FOOT, INCH, POUND, POUND_FORCE};

    const fn unit(dimension: Dimension, symbol: &'static str, si: super::Real) -> Unit {
        Unit {
            dimension,
            symbol,
            si,
        }
    }

    /// Millimetre.
    pub const MM: Unit = unit(Dimension::Length, "mm", 1e-3);
    /// Centimetre.
    pub const CM: Unit = unit(Dimension::Length, "cm", 1e-2);
    /// Metre.
    pub const M: Unit = unit(Dimension::Length, "m", 1.0);
    /// Inch.
    pub const IN: Unit = unit(Dimension::Length, "in", INCH);
    /// Foot.
    pub const FT: Unit = unit(Dimension::Length, "ft", FOOT);
    /// Newton.
    pub const N: Unit = unit(Dimension::Force, "N", 1.0);
    /// Kilonewton.
    pub const KN: Unit = unit(Dimension::Force, "kN", 1e3);
    /// Meganewton (DESIGN.md §7).
    pub const MN: Unit = unit(Dimension::Force, "MN", 1e6);
    /// Pound-force.
    pub const LBF: Unit = unit(Dimension::Force, "lbf", POUND_FORCE);
    /// Kilogram.
    pub const KG: Unit = unit(Dimension::Mass, "kg", 1.0);
    /// Gram.
    pub const G: Unit = unit(Dimension::Mass, "g", 1e-3);
    /// Pound (avoirdupois).
    pub const LB: Unit = unit(Dimension::Mass, "lb", POUND);
    /// Newton-metre.
    pub const N_M: Unit = unit(Dimension::Torque, "N*m", 1.0);
    /// Newton-millimetre.
    pub const N_MM: Unit = unit(Dimension::Torque, "N*mm", 1e-3);
    /// Kilonewton-metre.
    pub const KN_M: Unit = unit(Dimension::Torque, "kN*m", 1e3);
    /// Pound-force inch.
    pub const LBF_IN: Unit = unit(Dimension::Torque, "lbf*in", POUND_FORCE * INCH);
    /// Pound-force foot.
    pub const LBF_FT: Unit = unit(Dimension::Torque, "lbf*ft", POUND_FORCE * FOOT);
    /// Kilogram per metre (DESIGN.md §7).
    pub const KG_PER_M: Unit = unit(Dimension::MassPerLength, "kg/m", 1.0);
    /// Gram per metre.
    pub const G_PER_M: Unit = unit(Dimension::MassPerLength, "g/m", 1e-3);
    /// Pound per foot.
    pub const LB_PER_FT: Unit = unit(Dimension::MassPerLength, "lb/ft", POUND / FOOT);
    /// Second (DESIGN.md §7).
    pub const S: Unit = unit(Dimension::Time, "s", 1.0);
    /// Minute.
    pub const MIN: Unit = unit(Dimension::Time, "min", 60.0);
    /// Hour.
    pub const H: Unit = unit(Dimension::Time, "h", 3600.0);
    /// Newton per metre (DESIGN.md §7).
    pub const N_PER_M: Unit = unit(Dimension::SpringRate, "N/m", 1.0);
    /// Newton per millimetre.
    pub const N_PER_MM: Unit = unit(Dimension::SpringRate, "N/mm", 1e3);
    /// Kilonewton per metre.
    pub const KN_PER_M: Unit = unit(Dimension::SpringRate, "kN/m", 1e3);
    /// Pound-force per inch.
    pub const LBF_PER_IN: Unit = unit(Dimension::SpringRate, "lbf/in", POUND_FORCE / INCH);
    /// Newton-metre per radian (DESIGN.md §7).
    pub const N_M_PER_RAD: Unit = unit(Dimension::TorsionRate, "N*m/rad", 1.0);
    /// Newton-metre per degree.
    pub const N_M_PER_DEG: Unit = unit(
        Dimension::TorsionRate,
        "N*m/deg",
        180.0 / std::f64::consts::PI,
    );
    /// Kilogram square metre (DESIGN.md §7).
    pub const KG_M2: Unit = unit(Dimension::Inertia, "kg*m^2", 1.0);

    /// All of them.
    pub(super) const ALL: &[Unit] = &[
        MM,
        CM,
        M,
        IN,
        FT,
        N,
        KN,
        MN,
        LBF,
        KG,
        G,
        LB,
        N_M,
        N_MM,
        KN_M,
        LBF_IN,
        LBF_FT,
        KG_PER_M,
        G_PER_M,
        LB_PER_FT,
        S,
        MIN,
        H,
        N_PER_M,
        N_PER_MM,
        KN_PER_M,
        LBF_PER_IN,
        N_M_PER_RAD,
        N_M_PER_DEG,
        KG_M2,
    ];
}

use unit::ALL as UNITS;

/// Looks a unit up by spelling. Accepts the canonical spellings plus the usual
/// variants of a product (`N·m`, `N.m`, `Nm`, `N m`, `lbf-ft`, `lb*ft` is *not* a torque).
pub fn parse_unit(text: &str) -> Option<Unit> {
    let cleaned: String = text
        .trim()
        .replace(['·', '.', '-', ' '], "*")
        .replace("**", "*");
    let canonical = UNIT_ALIASES
        .iter()
        .find(|(alias, _)| *alias == cleaned)
        .map_or(cleaned.as_str(), |(_, symbol)| symbol);
    UNITS.iter().copied().find(|u| u.symbol == canonical)
}

/// Other spellings of a unit, after [`parse_unit`]'s cleaning (`·`, `.`, `-` and spaces
/// between factors become `*`), each with the canonical symbol it means. The rig
/// schema's unit patterns are made from these and [`Dimension::spellings`].
pub const UNIT_ALIASES: &[(&str, &str)] = &[
    ("Nm", "N*m"),
    ("Nmm", "N*mm"),
    ("in*lbf", "lbf*in"),
    ("ft*lbf", "lbf*ft"),
    ("m*N", "N*m"),
    ("mm*N", "N*mm"),
    ("inch", "in"),
    ("inches", "in"),
    ("feet", "ft"),
    ("foot", "ft"),
    ("lbs", "lb"),
];

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
        Dimension::Time => "5 min",
        Dimension::SpringRate => "2 N/mm",
        Dimension::TorsionRate => "0.5 N*m/rad",
        Dimension::Inertia => "0.02 kg*m^2",
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

/// The units a rig file uses for bare numbers, and the units its reports show.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct UnitSystem {
    /// Lengths (default mm): sizes, positions, the drawing's dimensions.
    pub length: Unit,
    /// Lengths along the rig in the reports: span lengths and travel. A rig file has one
    /// length unit, so this is `length` for the file's own units; `--units imperial`
    /// shows them in feet (sizes stay in inches), `--units metric` in metres.
    pub span_length: Unit,
    /// Forces (default N).
    pub force: Unit,
    /// Masses (default kg).
    pub mass: Unit,
    /// Torques (default N*m).
    pub torque: Unit,
}

/// The unit of `dimension` whose SI factor is 1 (every dimension has one).
fn si_unit(dimension: Dimension) -> Unit {
    UNITS
        .iter()
        .copied()
        .find(|u| u.dimension == dimension && u.si == 1.0)
        .unwrap_or(unit::KG_PER_M)
}

impl Default for UnitSystem {
    fn default() -> Self {
        UnitSystem {
            length: unit::MM,
            span_length: unit::MM,
            force: unit::N,
            mass: unit::KG,
            torque: unit::N_M,
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
            Dimension::MassPerLength => unit::KG_PER_M,
            // Bare spring rates are in the file's force per the file's length (N/mm for
            // the default units) where the table spells that unit, else N/m.
            Dimension::SpringRate => {
                let si = self.force.si / self.length.si;
                UNITS
                    .iter()
                    .copied()
                    .find(|u| u.dimension == dimension && (u.si - si).abs() <= 1e-12 * si)
                    .unwrap_or_else(|| si_unit(dimension))
            }
            Dimension::Time | Dimension::TorsionRate | Dimension::Inertia => si_unit(dimension),
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
        show_in(value, self.unit(dimension))
    }

    /// A span length or a travel as the reports show it (see [`UnitSystem::span_length`]).
    pub fn show_span(&self, value: Real) -> String {
        show_in(value, self.span_length)
    }
}

/// An SI value in `unit`, to four significant figures, with the unit; `—` when not
/// finite.
pub fn show_in(value: Real, unit: Unit) -> String {
    if value.is_finite() {
        format!("{} {}", significant(value / unit.si, 4), unit.symbol)
    } else {
        "—".to_string()
    }
}

/// The units the human-readable outputs show (`--units`); JSON is SI whatever the
/// choice, and every value inside is SI already, so a choice only changes what is shown.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum UnitChoice {
    /// The rig file's own units (its `units:`), as written.
    #[default]
    File,
    /// SI: m, N, kg, N*m.
    Si,
    /// A metric drawing set: sizes in mm, span lengths and travel in m, kN, kg, kN*m.
    Metric,
    /// US customary: sizes in in, span lengths and travel in ft, lbf, lb, lbf*ft.
    Imperial,
}

impl UnitChoice {
    /// Every choice, in the order the help lists them.
    pub const ALL: [UnitChoice; 4] = [
        UnitChoice::File,
        UnitChoice::Si,
        UnitChoice::Metric,
        UnitChoice::Imperial,
    ];

    /// The word that names it (`file`, `si`, `metric`, `imperial`).
    pub fn name(self) -> &'static str {
        match self {
            UnitChoice::File => "file",
            UnitChoice::Si => "si",
            UnitChoice::Metric => "metric",
            UnitChoice::Imperial => "imperial",
        }
    }

    /// One line for the help.
    pub fn describe(self) -> &'static str {
        match self {
            UnitChoice::File => "The rig file's own units",
            UnitChoice::Si => "m, N, kg, N*m",
            UnitChoice::Metric => "Sizes in mm, span lengths and travel in m, kN, kg, kN*m",
            UnitChoice::Imperial => "Sizes in in, span lengths and travel in ft, lbf, lb, lbf*ft",
        }
    }

    /// The units shown for a rig whose file shows `file`.
    pub fn system(self, file: UnitSystem) -> UnitSystem {
        let of = |length, span_length, force, mass, torque| UnitSystem {
            length,
            span_length,
            force,
            mass,
            torque,
        };
        match self {
            UnitChoice::File => file,
            UnitChoice::Si => of(unit::M, unit::M, unit::N, unit::KG, unit::N_M),
            UnitChoice::Metric => of(unit::MM, unit::M, unit::KN, unit::KG, unit::KN_M),
            UnitChoice::Imperial => of(unit::IN, unit::FT, unit::LBF, unit::LB, unit::LBF_FT),
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
        assert_eq!(si("1 kN*m", Dimension::Torque), 1e3);
        // DESIGN.md §7: force `MN`; mass per length `kg/m`, `g/m`, `lb/ft`.
        assert_eq!(si("9.80665 MN", Dimension::Force), 9.80665e6);
        assert_eq!(si("1 kg/m", Dimension::MassPerLength), 1.0);
        assert_eq!(si("250 g/m", Dimension::MassPerLength), 0.25);
        assert!((si("1 lb/ft", Dimension::MassPerLength) - 0.45359237 / 0.3048).abs() < 1e-15);
        assert_eq!(si("0.5", Dimension::MassPerLength), 0.5); // bare: kg/m
        assert!((si("1 lbf*in", Dimension::Torque) - 4.4482216152605 * 0.0254).abs() < 1e-15);
        assert!((si("1 lbf*ft", Dimension::Torque) - 4.4482216152605 * 0.3048).abs() < 1e-15);
    }

    #[test]
    fn nist_sp_811_factors() {
        // NIST Special Publication 811 (2008), Guide for the Use of the International
        // System of Units, Appendix B.8 (factors for units listed alphabetically), as
        // printed there: exact for the inch, foot and pound; rounded to seven figures
        // for the pound-force and its torques, so compared at that rounding (values as
        // remembered from the appendix; they agree with the 1959 definitions above).
        let factors: [(Unit, Real, Real); 6] = [
            (unit::IN, 2.54e-2, 0.0),
            (unit::FT, 3.048e-1, 0.0),
            (unit::LB, 4.535_923_7e-1, 0.0),
            (unit::LBF, 4.448_222, 5e-7),
            (unit::LBF_FT, 1.355_818, 5e-7),
            (unit::LBF_IN, 1.129_848e-1, 5e-8),
        ];
        for (u, nist, rounding) in factors {
            assert!(
                (u.si - nist).abs() <= rounding,
                "{}: {} N, m, kg or N*m per unit, NIST SP 811 gives {nist}",
                u.symbol,
                u.si
            );
        }
    }

    #[test]
    fn factors_round_trip() {
        // Every unit, and every unit each `--units` choice shows: SI and back gives the
        // number written, to a few units in the last place.
        let mut all: Vec<Unit> = UNITS.to_vec();
        for choice in UnitChoice::ALL {
            let s = choice.system(UnitSystem::default());
            all.extend([s.length, s.span_length, s.force, s.mass, s.torque]);
        }
        for u in all {
            assert_eq!(parse_unit(u.symbol), Some(u), "{} reads back", u.symbol);
            for x in [1.0, 0.1, 7.5, 123.456, 1e-6, 9.87e8] {
                let text = format!("{x} {}", u.symbol);
                let si = parse_quantity(&text, u.dimension, u).unwrap();
                let back = match u.dimension {
                    // No system field holds these (a fixed unit each): the unit's own
                    // factor.
                    Dimension::MassPerLength
                    | Dimension::Time
                    | Dimension::SpringRate
                    | Dimension::TorsionRate
                    | Dimension::Inertia => si / u.si,
                    d => UnitSystem {
                        length: u,
                        span_length: u,
                        force: u,
                        mass: u,
                        torque: u,
                    }
                    .from_si(si, d),
                };
                assert!(
                    (back - x).abs() <= 4.0 * Real::EPSILON * x,
                    "{text}: {si} SI, back {back}"
                );
            }
        }
    }

    #[test]
    fn unit_choices() {
        let file = UnitSystem::default();
        assert_eq!(UnitChoice::File.system(file), file);
        let symbols = |c: UnitChoice| {
            let s = c.system(file);
            [
                s.length.symbol,
                s.span_length.symbol,
                s.force.symbol,
                s.mass.symbol,
                s.torque.symbol,
            ]
        };
        assert_eq!(symbols(UnitChoice::Si), ["m", "m", "N", "kg", "N*m"]);
        assert_eq!(symbols(UnitChoice::Metric), ["mm", "m", "kN", "kg", "kN*m"]);
        assert_eq!(
            symbols(UnitChoice::Imperial),
            ["in", "ft", "lbf", "lb", "lbf*ft"]
        );
        for c in UnitChoice::ALL {
            let s = c.system(file);
            for (u, d) in [
                (s.length, Dimension::Length),
                (s.span_length, Dimension::Length),
                (s.force, Dimension::Force),
                (s.mass, Dimension::Mass),
                (s.torque, Dimension::Torque),
            ] {
                assert_eq!(u.dimension, d, "{} under {}", u.symbol, c.name());
            }
        }
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
