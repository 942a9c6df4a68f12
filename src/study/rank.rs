//! `rank`: which part's friction costs the most. For every sheave, guide and drum the
//! rig is solved again with that part alone frictionless, and (optionally) with its
//! bearing changed to an alternative; parts are ranked by the effort saved. Then the
//! sensitivity of the forward value to every friction coefficient of the rig, by
//! central finite differences.
//!
//! "Frictionless" means: a sheave's bearing set to `{kind: none}`; a guide's `mu` set
//! to 0; a drum's shaft removed (frictionless journal and thrust) and its `drag` set
//! to 0. Each is applied as an override on the parsed tree, so the result is exactly
//! the forward value of the rig written that way.
//!
//! `--to rolling` replaces a plain bearing by a rolling one with catalogue defaults:
//! bore = the plain bearing's pin diameter and mu = [`ROLLING_MU`]. Sheaves rated by
//! a factor, already rolling or frictionless have no such alternative (shown as "—").
//! Any bearing written in YAML (`{kind: plain, pin_diameter: 8, mu: 0.08}`) may be
//! given instead; it replaces every sheave bearing and drum shaft bearing in turn.

use std::io::{self, Write};

use serde::Serialize;

use crate::math::Real;
use crate::report::text::{number, quantity};
use crate::report::{finite, CAUTION};
use crate::rig::model::{Bearing, PartKind};
use crate::rig::Rig;
use crate::units::{Dimension, UnitSystem};

use super::table::{csv_number, write_human, Format, Table};
use super::{AskedQuantity, RigSource, StudyError};

/// Friction coefficient of the `--to rolling` default: a deep-groove ball bearing's
/// constant coefficient referred to the bore (from memory of rolling-bearing
/// catalogues, which give about 0.0015 for deep-groove ball bearings).
pub const ROLLING_MU: Real = 0.0015;

/// The alternative bearing of a ranking.
#[derive(Debug, Clone, PartialEq)]
pub enum Alternative {
    /// A rolling bearing with bore = plain pin diameter and mu = [`ROLLING_MU`].
    Rolling,
    /// A bearing written in YAML flow text, used as is.
    Bearing(String),
}

impl Alternative {
    /// Reads `rolling` or a YAML bearing mapping.
    pub fn parse(text: &str) -> Alternative {
        if text.trim() == "rolling" {
            Alternative::Rolling
        } else {
            Alternative::Bearing(text.trim().to_string())
        }
    }

    fn label(&self) -> String {
        match self {
            Alternative::Rolling => format!("rolling (bore = pin diameter, mu {ROLLING_MU})"),
            Alternative::Bearing(t) => t.clone(),
        }
    }
}

/// One part's line of the ranking. Values SI, of the asked quantity.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct RankRow {
    /// Part name.
    pub part: String,
    /// `sheave`, `guide` or `drum`.
    pub kind: &'static str,
    /// Forward value with this part alone frictionless.
    pub frictionless: Option<Real>,
    /// What that saves: forward − that value for a drive unknown (less effort),
    /// that value − forward for a load unknown (more load moved).
    pub frictionless_saved: Option<Real>,
    /// Forward value with this part's bearing changed to the alternative.
    pub alternative: Option<Real>,
    /// What that saves (same sign convention).
    pub alternative_saved: Option<Real>,
    /// Why a value is missing.
    pub note: Option<String>,
}

/// Sensitivity of the forward value to one coefficient.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Sensitivity {
    /// The coefficient's key path.
    pub key: String,
    /// Its value.
    pub value: Real,
    /// d(forward)/d(coefficient), in the asked quantity's SI unit per unit coefficient.
    pub derivative: Option<Real>,
    /// Relative sensitivity: (value / forward) × derivative.
    pub elasticity: Option<Real>,
}

/// The ranking.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Ranking {
    /// The asked quantity.
    pub solve_for: AskedQuantity,
    /// Forward value of the rig as written.
    pub forward: Option<Real>,
    /// The alternative, when one was asked for.
    pub alternative: Option<String>,
    /// Parts, best saving first.
    pub parts: Vec<RankRow>,
    /// Sensitivities, largest magnitude of elasticity first.
    pub sensitivities: Vec<Sensitivity>,
    /// The caution.
    pub caution: &'static str,
    /// Units of the rig, for text output.
    #[serde(skip)]
    pub units: UnitSystem,
}

/// Overrides that make `part` frictionless (see the module doc), if it has friction.
pub fn frictionless_settings(rig: &Rig, part: usize) -> Option<Vec<(String, String)>> {
    let name = &rig.parts[part].name;
    let set = |k: &str, v: &str| (format!("parts.{name}.{k}"), v.to_string());
    match &rig.parts[part].kind {
        PartKind::Sheave(_) => Some(vec![set("bearing", "{kind: none}")]),
        PartKind::Guide(_) => Some(vec![set("mu", "0")]),
        PartKind::Drum(_) => Some(vec![set("shaft", "~"), set("drag", "0")]),
        _ => None,
    }
}

/// Overrides that change `part`'s bearing to the alternative, or why there are none.
pub fn alternative_settings(
    rig: &Rig,
    part: usize,
    alt: &Alternative,
) -> Result<Vec<(String, String)>, String> {
    let name = &rig.parts[part].name;
    let (key, current) = match &rig.parts[part].kind {
        PartKind::Sheave(s) => (format!("parts.{name}.bearing"), Some(s.bearing)),
        PartKind::Drum(d) => (
            format!("parts.{name}.shaft.bearing"),
            d.shaft.as_ref().map(|s| s.bearing),
        ),
        _ => return Err("a guide has no bearing".to_string()),
    };
    match alt {
        Alternative::Bearing(text) => Ok(vec![(key, text.clone())]),
        Alternative::Rolling => match current {
            Some(Bearing::Plain { pin_diameter, .. }) => Ok(vec![(
                key,
                format!("{{kind: rolling, bore: {pin_diameter} m, mu: {ROLLING_MU}}}"),
            )]),
            Some(Bearing::Rolling { .. }) => Err("already rolling".to_string()),
            Some(Bearing::Rated { .. }) => {
                Err("rated by a factor: no pin diameter to size a rolling bearing".to_string())
            }
            Some(Bearing::None) | None => Err("already frictionless".to_string()),
        },
    }
}

/// Every friction coefficient of the rig that acts on the forward value: key path,
/// value, and the least value the key accepts.
pub fn coefficients(rig: &Rig) -> Vec<(String, Real, Real)> {
    let mut out = Vec::new();
    for r in &rig.ropes {
        out.push((format!("ropes.{}.mu", r.name), r.mu, 0.0));
    }
    for p in &rig.parts {
        let n = &p.name;
        let bearing = |prefix: &str, b: &Bearing, out: &mut Vec<(String, Real, Real)>| match b {
            Bearing::Plain { mu, .. } | Bearing::Rolling { mu, .. } => {
                out.push((format!("parts.{n}.{prefix}.mu"), *mu, 0.0))
            }
            Bearing::Rated { factor } => {
                out.push((format!("parts.{n}.{prefix}.factor"), *factor, 1.0))
            }
            Bearing::None => {}
        };
        match &p.kind {
            PartKind::Sheave(s) => {
                bearing("bearing", &s.bearing, &mut out);
                if let Some(mu) = s.mu {
                    out.push((format!("parts.{n}.mu"), mu, 0.0));
                }
            }
            PartKind::Guide(g) => {
                if let Some(mu) = g.mu {
                    out.push((format!("parts.{n}.mu"), mu, 0.0));
                }
            }
            PartKind::Drum(d) => {
                if let Some(shaft) = &d.shaft {
                    bearing("shaft.bearing", &shaft.bearing, &mut out);
                    if let Some(t) = &shaft.thrust {
                        out.push((format!("parts.{n}.shaft.thrust.mu"), t.mu, 0.0));
                    }
                }
            }
            _ => {}
        }
    }
    out
}

/// The forward value of the main sub-rig with `settings`.
fn forward_with(source: &RigSource, settings: &[(String, String)]) -> Result<Real, StudyError> {
    let (_, s) = source.solve(settings)?;
    finite(s.main().forward.value)
        .ok_or_else(|| StudyError::Input("the forward value is not finite".to_string()))
}

/// d(forward)/d(coefficient) by central differences (one-sided next to the lower
/// bound), step 1e-4 of the value (at least 1e-6).
///
/// # Errors
/// When a perturbed rig cannot be solved.
pub fn derivative(
    source: &RigSource,
    key: &str,
    value: Real,
    lower: Real,
) -> Result<Real, StudyError> {
    let h = (value.abs() * 1e-4).max(1e-6);
    let at = |v: Real| forward_with(source, &[(key.to_string(), format!("{v}"))]);
    if value - h >= lower {
        Ok((at(value + h)? - at(value - h)?) / (2.0 * h))
    } else {
        Ok((at(value + h)? - at(value)?) / h)
    }
}

/// Ranks the parts and computes the sensitivities.
///
/// # Errors
/// When the rig as written does not load or solve.
pub fn rank(source: &RigSource, alt: Option<&Alternative>) -> Result<Ranking, StudyError> {
    let (rig, solution) = source.solve(&[])?;
    let main = solution.main();
    let f0 = main.forward.value;
    let sign = if main.drive_unknown() { -1.0 } else { 1.0 };
    let saved = |f: Option<Real>| f.and_then(|f| finite(sign * (f - f0)));
    let mut parts = Vec::new();
    for (id, part) in rig.parts.iter().enumerate() {
        let Some(settings) = frictionless_settings(&rig, id) else {
            continue;
        };
        let mut notes = Vec::new();
        let frictionless = match forward_with(source, &settings) {
            Ok(v) => Some(v),
            Err(e) => {
                notes.push(format!("frictionless: {e}"));
                None
            }
        };
        let alternative = match alt.map(|a| alternative_settings(&rig, id, a)) {
            None => None,
            Some(Err(why)) => {
                notes.push(why);
                None
            }
            Some(Ok(s)) => match forward_with(source, &s) {
                Ok(v) => Some(v),
                Err(e) => {
                    notes.push(format!("alternative: {e}"));
                    None
                }
            },
        };
        parts.push(RankRow {
            part: part.name.clone(),
            kind: part.kind.name(),
            frictionless,
            frictionless_saved: saved(frictionless),
            alternative,
            alternative_saved: saved(alternative),
            note: (!notes.is_empty()).then(|| notes.join("; ")),
        });
    }
    // By the alternative's saving when one is asked for, then by the frictionless
    // saving (parts the alternative does not apply to still rank among themselves).
    let key = |r: &RankRow| {
        let alternative = if alt.is_some() {
            r.alternative_saved.unwrap_or(Real::NEG_INFINITY)
        } else {
            0.0
        };
        (
            alternative,
            r.frictionless_saved.unwrap_or(Real::NEG_INFINITY),
        )
    };
    // Stable sort: equal savings keep file order.
    parts.sort_by(|a, b| {
        let (ka, kb) = (key(a), key(b));
        kb.0.total_cmp(&ka.0).then(kb.1.total_cmp(&ka.1))
    });
    let mut sensitivities = Vec::new();
    for (k, value, lower) in coefficients(&rig) {
        let d = derivative(source, &k, value, lower).ok().and_then(finite);
        sensitivities.push(Sensitivity {
            elasticity: d.and_then(|d| finite(value / f0 * d)),
            key: k,
            value,
            derivative: d,
        });
    }
    sensitivities.sort_by(|a, b| {
        let m = |s: &Sensitivity| s.elasticity.map_or(-1.0, Real::abs);
        m(b).total_cmp(&m(a))
    });
    Ok(Ranking {
        solve_for: AskedQuantity::of(&rig, main),
        forward: finite(f0),
        alternative: alt.map(Alternative::label),
        parts,
        sensitivities,
        caution: CAUTION,
        units: rig.units,
    })
}

fn dimension_of(quantity: &str) -> Dimension {
    match quantity {
        "mass" => Dimension::Mass,
        "torque" => Dimension::Torque,
        _ => Dimension::Force,
    }
}

/// Writes a ranking.
///
/// # Errors
/// I/O errors of the writer.
pub fn write(w: &mut dyn Write, r: &Ranking, format: Format) -> io::Result<()> {
    if format == Format::Json {
        let json = serde_json::to_string_pretty(r).map_err(io::Error::other)?;
        return writeln!(w, "{json}");
    }
    let d = dimension_of(r.solve_for.quantity);
    let si = r.solve_for.unit;
    let mut t = Table::default();
    let mut s = Table::default();
    if format == Format::Csv {
        t.headers = vec![
            "rank".into(),
            "part".into(),
            "kind".into(),
            format!("frictionless_{si}"),
            format!("frictionless_saved_{si}"),
            format!("alternative_{si}"),
            format!("alternative_saved_{si}"),
            "note".into(),
        ];
        for (i, p) in r.parts.iter().enumerate() {
            t.rows.push(vec![
                (i + 1).to_string(),
                p.part.clone(),
                p.kind.into(),
                csv_number(p.frictionless),
                csv_number(p.frictionless_saved),
                csv_number(p.alternative),
                csv_number(p.alternative_saved),
                p.note.clone().unwrap_or_default(),
            ]);
        }
        t.write_csv(w)?;
        writeln!(w)?;
        s.headers = vec![
            "coefficient".into(),
            "value".into(),
            format!("derivative_{si}"),
            "elasticity".into(),
        ];
        for x in &r.sensitivities {
            s.rows.push(vec![
                x.key.clone(),
                format!("{}", x.value),
                csv_number(x.derivative),
                csv_number(x.elasticity),
            ]);
        }
        return s.write_csv(w);
    }
    let q = |x| quantity(x, d, &r.units);
    t.headers = vec![
        "rank".into(),
        "part".into(),
        "kind".into(),
        "frictionless".into(),
        "saves".into(),
    ];
    if r.alternative.is_some() {
        t.headers.push("alternative".into());
        t.headers.push("saves".into());
    }
    let mut notes = vec![format!(
        "Forward {} at `{}` as written: {}.",
        r.solve_for.quantity,
        r.solve_for.part,
        q(r.forward)
    )];
    if let Some(a) = &r.alternative {
        notes.push(format!("Alternative bearing: {a}."));
    }
    for (i, p) in r.parts.iter().enumerate() {
        let mut row = vec![
            (i + 1).to_string(),
            p.part.clone(),
            p.kind.into(),
            q(p.frictionless),
            q(p.frictionless_saved),
        ];
        if r.alternative.is_some() {
            row.push(q(p.alternative));
            row.push(q(p.alternative_saved));
        }
        t.rows.push(row);
        if let Some(n) = &p.note {
            notes.push(format!("`{}`: {n}", p.part));
        }
    }
    let unit = r.units.unit(d);
    notes.push(String::new());
    notes.push("Sensitivity of the forward value to each friction coefficient:".into());
    s.headers = vec![
        "coefficient".into(),
        "value".into(),
        format!("d(forward)/d(coefficient) ({})", unit.symbol),
        "elasticity".into(),
    ];
    for x in &r.sensitivities {
        s.rows.push(vec![
            x.key.clone(),
            number(Some(x.value), 4),
            number(x.derivative.map(|v| v / unit.si), 4),
            number(x.elasticity, 3),
        ]);
    }
    let mut buf = Vec::new();
    if format == Format::Markdown {
        s.write_markdown(&mut buf)?;
    } else {
        s.write_text(&mut buf)?;
    }
    notes.push(String::from_utf8_lossy(&buf).trim_end().to_string());
    notes.push(
        "Elasticity: the relative change of the forward value per relative change of the coefficient."
            .into(),
    );
    write_human(
        w,
        format,
        &format!(
            "Upgrade ranking: the forward {} at `{}`, each part alone made frictionless",
            r.solve_for.quantity, r.solve_for.part
        ),
        &t,
        &notes,
    )
}
