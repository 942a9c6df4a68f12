//! `rank`: which part's friction costs the most. For every sheave, guide and drum the
//! rig is solved again with that part alone frictionless, and (optionally) with its
//! bearing changed to an alternative; parts are ranked by the effort saved. Then the
//! sensitivity of the forward value to every friction coefficient of the rig, by
//! central finite differences.
//!
//! "Frictionless" means: a sheave's bearing set to `{kind: none}`; a guide's `mu` set
//! to 0; a drum's shaft removed (frictionless journal and thrust) and its `drag` set
//! to 0. Each is the forward value of the rig written that way: made on the model where
//! that gives the very rig the override on the parsed tree gives (checked once per kind
//! of change), else through the file, and solved on the sub-rig the part belongs to
//! ([`super::local`]; a rope's coefficient reaches every sub-rig its lines run in).
//!
//! `--to rolling` replaces a plain bearing by a rolling one with catalogue defaults:
//! bore = the plain bearing's pin diameter and mu = [`ROLLING_MU`]. Sheaves rated by
//! a factor, already rolling or frictionless have no such alternative (shown as "—").
//! Any bearing written in YAML (`{kind: plain, pin_diameter: 8, mu: 0.08}`) may be
//! given instead; it replaces every sheave bearing and drum shaft bearing in turn.

use serde::Serialize;

use crate::math::Real;
use crate::model::param::Names;
use crate::model::{Bearing, PartKind};
use crate::model::{PartId, Rig};
use crate::report::Asked;
use crate::report::{finite, CAUTION};
use crate::units::UnitSystem;

use super::local::{self, Edit, Local, Subject};
use super::{Progress, RigSource, StudyError, Verdict};

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
    /// that value − forward for a load unknown (more load moved). Never negative:
    /// round-off is zero, and a change for the worse is `frictionless_worse_by`.
    pub frictionless_saved: Option<Real>,
    /// How much worse the rig is with the part frictionless (more effort, or less load
    /// moved), where it is worse beyond round-off; absent otherwise. A frictionless
    /// part should never cost more, so a value here says the rig is not simple (a
    /// sheave that starts or stops stalling, a pin load that moves).
    pub frictionless_worse_by: Option<Real>,
    /// Forward value with this part's bearing changed to the alternative.
    pub alternative: Option<Real>,
    /// What that saves (same sign convention; never negative, see
    /// `alternative_worse_by`).
    pub alternative_saved: Option<Real>,
    /// How much worse the alternative is than the bearing as written (more effort, or
    /// less load moved), where it is worse beyond round-off.
    pub alternative_worse_by: Option<Real>,
    /// What `check` concludes about the rig with this part frictionless.
    pub frictionless_verdict: Option<Verdict>,
    /// What `check` concludes about the rig with this part's alternative bearing.
    pub alternative_verdict: Option<Verdict>,
    /// Why a value is missing.
    pub note: Option<String>,
}

/// Sensitivity of the forward value to one friction coefficient, measured like the
/// ranking: what cutting the friction it stands for saves.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Sensitivity {
    /// The coefficient's key path, as the file writes it (`bearing.efficiency` where
    /// the file gives a rated sheave's efficiency, `bearing.factor` where it gives K).
    pub key: String,
    /// Its value as written (after `--set`).
    pub value: Real,
    /// What 10 % less friction at this coefficient saves, in the asked quantity's SI
    /// unit (less effort, or more load moved; the ranking's measure): μ × 0.9, a
    /// rated sheave's loss K − 1 × 0.9 (for an efficiency η, K = 1/η), or a rope's bend
    /// loss β × 0.9. Never negative:
    /// round-off is zero, a change for the worse is `worse_with_10pct_less_friction`.
    pub saved_with_10pct_less_friction: Option<Real>,
    /// How much worse the rig is with 10 % less friction here, where it is worse
    /// beyond round-off (it should not be).
    pub worse_with_10pct_less_friction: Option<Real>,
    /// d(forward)/d(value), in the asked quantity's SI unit per unit of the written
    /// key (negative for an efficiency: more efficient, less effort).
    pub derivative: Option<Real>,
    /// Relative sensitivity to the written key: (value / forward) × derivative. Beware
    /// comparing it across kinds of key: a rated factor K near 1 carries its friction
    /// in K − 1, so its elasticity is far larger than a μ's for the same loss; the
    /// saving above compares like with like.
    pub elasticity: Option<Real>,
}

/// The share of its friction a sensitivity cuts (10 %).
pub const SENSITIVITY_CUT: Real = 0.1;

/// What a friction coefficient stands for, so that its friction can be cut by a share.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Measure {
    /// A friction coefficient μ (bearing, groove, rope on a surface, thrust): the
    /// friction is μ itself.
    Mu,
    /// A rated sheave's factor K = 1/η: the friction is K − 1.
    Factor,
    /// A rated sheave's efficiency η: the friction is 1/η − 1.
    Efficiency,
    /// A rope's bend loss β, the share of tension lost to bending at each passage over
    /// a turning sheave or drum (DESIGN.md §7): the loss is β itself, below 1.
    Share,
}

/// A friction coefficient of the rig that acts on the forward value.
#[derive(Debug, Clone, PartialEq)]
pub struct Coefficient {
    /// Key path, as the file writes it.
    pub key: String,
    /// Value as written.
    pub value: Real,
    /// What it stands for.
    pub measure: Measure,
}

impl Coefficient {
    /// The least and greatest value the key accepts.
    pub fn bounds(&self) -> (Real, Real) {
        match self.measure {
            Measure::Mu => (0.0, Real::INFINITY),
            Measure::Factor => (1.0, Real::INFINITY),
            Measure::Efficiency => (0.0, 1.0),
            // The loader takes a bend loss in [0, 1).
            Measure::Share => (0.0, 1.0),
        }
    }

    /// The value with the friction it stands for cut by `share` (0 to 1).
    pub fn with_less_friction(&self, share: Real) -> Real {
        let keep = 1.0 - share;
        match self.measure {
            Measure::Mu | Measure::Share => self.value * keep,
            Measure::Factor => 1.0 + (self.value - 1.0) * keep,
            Measure::Efficiency => 1.0 / (1.0 + (1.0 / self.value - 1.0) * keep),
        }
    }
}

/// The ranking.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Ranking {
    /// The asked quantity.
    pub solve_for: Asked,
    /// Forward value of the rig as written.
    pub forward: Option<Real>,
    /// What `check` concludes about the rig as written.
    pub verdict: Verdict,
    /// The alternative, when one was asked for.
    pub alternative: Option<String>,
    /// Parts, best saving first.
    pub parts: Vec<RankRow>,
    /// Sensitivities, largest saving first (the ranking's order and measure).
    pub sensitivities: Vec<Sensitivity>,
    /// The caution.
    pub caution: &'static str,
    /// Units of the rig, for text output.
    #[serde(skip)]
    pub units: UnitSystem,
    /// Units of the CSV: `None` for SI (as the JSON), else those of `--units`.
    #[serde(skip)]
    pub csv_units: Option<UnitSystem>,
}

impl Ranking {
    /// Whether the rig as written or any row fails a check (exit 1, as `check` would).
    pub fn fails(&self) -> bool {
        self.verdict.fails
            || self.parts.iter().any(|p| {
                [&p.frictionless_verdict, &p.alternative_verdict]
                    .into_iter()
                    .flatten()
                    .any(|v| v.fails)
            })
    }
}

/// Overrides that make `part` frictionless (see the module doc), if it has friction.
pub fn frictionless_settings(rig: &Rig, part: PartId) -> Option<Vec<(String, String)>> {
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
    part: PartId,
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

/// Every friction coefficient of the rig that acts on the forward value, under the key
/// the file (with its `--set` overrides) writes it by.
pub fn coefficients(rig: &Rig, source: &RigSource) -> Vec<Coefficient> {
    coefficients_of(rig, source)
        .into_iter()
        .map(|(c, _)| c)
        .collect()
}

/// [`coefficients`], each with the part or rope it belongs to.
fn coefficients_of(rig: &Rig, source: &RigSource) -> Vec<(Coefficient, Subject)> {
    let mut tagged = Vec::new();
    let mut out = Vec::new();
    let mu = |key: String, value: Real| Coefficient {
        key,
        value,
        measure: Measure::Mu,
    };
    for (id, r) in rig.ropes.enumerate() {
        out.push(mu(format!("ropes.{}.mu", r.name), r.mu));
        // Bending is a loss like friction (a share of the tension at each turning
        // passage); where the rope has none, a 10 % cut of it saves nothing.
        if r.bend_loss > 0.0 {
            out.push(Coefficient {
                key: format!("ropes.{}.bend_loss", r.name),
                value: r.bend_loss,
                measure: Measure::Share,
            });
        }
        tagged.extend(out.drain(..).map(|c| (c, Subject::Rope(id))));
    }
    for (id, p) in rig.parts.enumerate() {
        let n = &p.name;
        let bearing = |path: &[&str], b: &Bearing, out: &mut Vec<Coefficient>| {
            let prefix = path.join(".");
            match b {
                Bearing::Plain { mu: m, .. } | Bearing::Rolling { mu: m, .. } => {
                    out.push(mu(format!("parts.{n}.{prefix}.mu"), *m))
                }
                Bearing::Rated { factor } => {
                    let mut at = vec!["parts", n.as_str()];
                    at.extend_from_slice(path);
                    out.push(if source.has_key(&at, "efficiency") {
                        Coefficient {
                            key: format!("parts.{n}.{prefix}.efficiency"),
                            value: 1.0 / factor,
                            measure: Measure::Efficiency,
                        }
                    } else {
                        Coefficient {
                            key: format!("parts.{n}.{prefix}.factor"),
                            value: *factor,
                            measure: Measure::Factor,
                        }
                    })
                }
                Bearing::None => {}
            }
        };
        match &p.kind {
            PartKind::Sheave(s) => {
                bearing(&["bearing"], &s.bearing, &mut out);
                if let Some(m) = s.mu {
                    out.push(mu(format!("parts.{n}.mu"), m));
                }
            }
            PartKind::Guide(g) => {
                if let Some(m) = g.mu {
                    out.push(mu(format!("parts.{n}.mu"), m));
                }
            }
            PartKind::Drum(d) => {
                if let Some(shaft) = &d.shaft {
                    bearing(&["shaft", "bearing"], &shaft.bearing, &mut out);
                    if let Some(t) = &shaft.thrust {
                        out.push(mu(format!("parts.{n}.shaft.thrust.mu"), t.mu));
                    }
                }
            }
            _ => {}
        }
        tagged.extend(out.drain(..).map(|c| (c, Subject::Part(id))));
    }
    tagged
}

/// Differences of the forward value within this of zero are round-off: a relative
/// 1e-9 of the larger of the forward and ideal values (the solver settles its fixed
/// point to 1e-12).
fn round_off(forward: Real, ideal: Real) -> Real {
    1e-9 * forward.abs().max(ideal.abs()).max(Real::MIN_POSITIVE)
}

/// A signed saving split into what it saves (never negative; round-off is zero) and,
/// where it is worse beyond round-off, by how much.
fn split_saving(signed: Option<Real>, noise: Real) -> (Option<Real>, Option<Real>) {
    match signed {
        Some(s) if s.abs() <= noise => (Some(0.0), None),
        Some(s) if s > 0.0 => (Some(s), None),
        Some(s) => (None, Some(-s)),
        None => (None, None),
    }
}

/// `items` ordered by their keys `(first, then, index)`, largest first; stable, so
/// equal keys keep file order.
fn largest_first<T>(items: Vec<T>, mut keys: Vec<(Real, Real, usize)>) -> Vec<T> {
    keys.sort_by(|a, b| b.0.total_cmp(&a.0).then(b.1.total_cmp(&a.1)));
    let mut items: Vec<Option<T>> = items.into_iter().map(Some).collect();
    keys.iter().filter_map(|k| items[k.2].take()).collect()
}

/// The forward value of the main sub-rig with `settings`, and what `check` concludes.
fn judged_with(
    source: &RigSource,
    settings: &[(String, String)],
) -> Result<(Real, Verdict), StudyError> {
    let (rig, s) = source.solve(settings)?;
    let forward = finite(s.main().forward.value)
        .ok_or_else(|| StudyError::Input("the forward value is not finite".to_string()))?;
    Ok((forward, Verdict::assess(&rig, &s)))
}

/// The forward value of the main sub-rig with `settings`.
fn forward_with(source: &RigSource, settings: &[(String, String)]) -> Result<Real, StudyError> {
    let (_, s) = source.solve(settings)?;
    finite(s.main().forward.value)
        .ok_or_else(|| StudyError::Input("the forward value is not finite".to_string()))
}

/// d(forward)/d(value) of a coefficient by central differences (one-sided next to a
/// bound), step 1e-4 of the value (at least 1e-6).
///
/// # Errors
/// When a perturbed rig cannot be solved.
pub fn derivative(source: &RigSource, c: &Coefficient) -> Result<Real, StudyError> {
    let (lower, upper) = c.bounds();
    let value = c.value;
    let h = (value.abs() * 1e-4).max(1e-6);
    let at = |v: Real| forward_with(source, &[(c.key.clone(), format!("{v}"))]);
    if value - h < lower {
        Ok((at(value + h)? - at(value)?) / h)
    } else if value + h > upper {
        Ok((at(value)? - at(value - h)?) / h)
    } else {
        Ok((at(value + h)? - at(value - h)?) / (2.0 * h))
    }
}

/// The runs of a ranking: on the sub-rigs a change reaches ([`super::local`]) where
/// the rig allows, else each on the whole rig as the file gives it.
struct Runs<'a> {
    source: &'a RigSource,
    local: Option<Local<'a>>,
    /// The rig's parts and ropes by name, for the coefficients' keys.
    names: Names<'a>,
}

impl Runs<'_> {
    /// The forward value and verdict with `part` made frictionless by `settings`.
    fn frictionless(
        &self,
        rig: &Rig,
        part: PartId,
        settings: &[(String, String)],
    ) -> Result<(Real, Verdict), StudyError> {
        let Some(l) = &self.local else {
            return judged_with(self.source, settings);
        };
        let apply = |r: &mut Rig| local::frictionless(r, part);
        let edit = Edit {
            kind: local::frictionless_kind(rig, part),
            apply: &apply,
        };
        let o = l.run(Subject::Part(part), Some(edit), settings, true)?;
        Ok((o.forward, o.verdict.unwrap_or_default()))
    }

    /// The forward value and verdict with `part`'s bearing set by `settings`.
    fn alternative(
        &self,
        part: PartId,
        settings: &[(String, String)],
    ) -> Result<(Real, Verdict), StudyError> {
        let Some(l) = &self.local else {
            return judged_with(self.source, settings);
        };
        let o = l.run(Subject::Part(part), None, settings, true)?;
        Ok((o.forward, o.verdict.unwrap_or_default()))
    }

    /// The forward value with coefficient `key` (of `subject`) at `value`.
    fn forward(
        &self,
        rig: &Rig,
        subject: Subject,
        key: &str,
        value: Real,
    ) -> Result<Real, StudyError> {
        let settings = [(key.to_string(), format!("{value}"))];
        let Some(l) = &self.local else {
            return forward_with(self.source, &settings);
        };
        let change = self
            .source
            .resolve_in(&self.names, key, "")
            .and_then(|resolved| local::set_resolved(rig, &resolved, value));
        let o = match change {
            Some((kind, apply)) => {
                let edit = Edit {
                    kind,
                    apply: &apply,
                };
                l.run(subject, Some(edit), &settings, false)?
            }
            None => l.run(subject, None, &settings, false)?,
        };
        Ok(o.forward)
    }

    /// [`derivative`] through these runs.
    fn derivative(&self, rig: &Rig, subject: Subject, c: &Coefficient) -> Result<Real, StudyError> {
        let (lower, upper) = c.bounds();
        let value = c.value;
        let h = (value.abs() * 1e-4).max(1e-6);
        let at = |v: Real| self.forward(rig, subject, &c.key, v);
        if value - h < lower {
            Ok((at(value + h)? - at(value)?) / h)
        } else if value + h > upper {
            Ok((at(value)? - at(value - h)?) / h)
        } else {
            Ok((at(value + h)? - at(value - h)?) / (2.0 * h))
        }
    }
}

/// Ranks the parts and computes the sensitivities.
///
/// Each run changes one part's or one rope's friction, and is solved on the sub-rigs
/// the change reaches ([`super::local`]): the figures are the whole rig's, to the bit.
///
/// # Errors
/// When the rig as written does not load or solve.
pub fn rank(
    source: &RigSource,
    alt: Option<&Alternative>,
    progress: &dyn Progress,
) -> Result<Ranking, StudyError> {
    let (rig, solution) = source.solve(&[])?;
    let runs = Runs {
        source,
        local: Local::new(source, &rig, &solution),
        names: Names::of(&rig),
    };
    let coefficients = coefficients_of(&rig, source);
    progress.start(rig.parts.len() + coefficients.len());
    let main = solution.main();
    let f0 = main.forward.value;
    let sign = if main.drive_unknown() { -1.0 } else { 1.0 };
    let signed = |f: Option<Real>| f.and_then(|f| finite(sign * (f - f0)));
    let noise = round_off(f0, main.ideal.value);
    let mut order = Vec::new();
    let mut parts = Vec::new();
    for (id, part) in rig.parts.enumerate() {
        progress.step();
        let Some(settings) = frictionless_settings(&rig, id) else {
            continue;
        };
        let mut notes = Vec::new();
        let (frictionless, frictionless_verdict) = match runs.frictionless(&rig, id, &settings) {
            Ok((v, verdict)) => (Some(v), Some(verdict)),
            Err(e) => {
                notes.push(format!("frictionless: {}", e.chain()));
                (None, None)
            }
        };
        let (alternative, alternative_verdict) =
            match alt.map(|a| alternative_settings(&rig, id, a)) {
                None => (None, None),
                Some(Err(why)) => {
                    notes.push(why);
                    (None, None)
                }
                Some(Ok(s)) => match runs.alternative(id, &s) {
                    Ok((v, verdict)) => (Some(v), Some(verdict)),
                    Err(e) => {
                        notes.push(format!("alternative: {}", e.chain()));
                        (None, None)
                    }
                },
            };
        let (frictionless_saved, frictionless_worse_by) = split_saving(signed(frictionless), noise);
        let (alternative_saved, alternative_worse_by) = split_saving(signed(alternative), noise);
        // By the alternative's saving when one is asked for (a worse alternative below
        // every saving, the least bad first), then by the frictionless saving (parts the
        // alternative does not apply to still rank among themselves).
        let missing = Real::NEG_INFINITY;
        order.push((
            if alt.is_some() {
                alternative_saved
                    .or(alternative_worse_by.map(|w| -w))
                    .unwrap_or(missing)
            } else {
                0.0
            },
            frictionless_saved
                .or(frictionless_worse_by.map(|w| -w))
                .unwrap_or(missing),
            parts.len(),
        ));
        parts.push(RankRow {
            part: part.name.clone(),
            kind: part.kind.name(),
            frictionless,
            frictionless_saved,
            frictionless_worse_by,
            frictionless_verdict,
            alternative,
            alternative_saved,
            alternative_worse_by,
            alternative_verdict,
            note: (!notes.is_empty()).then(|| notes.join("; ")),
        });
    }
    let parts = largest_first(parts, order);
    let mut sensitivities = Vec::new();
    let mut order = Vec::new();
    for (c, subject) in coefficients {
        progress.step();
        let d = runs.derivative(&rig, subject, &c).ok().and_then(finite);
        let less = c.with_less_friction(SENSITIVITY_CUT);
        let cut = signed(runs.forward(&rig, subject, &c.key, less).ok());
        let (saved, worse) = split_saving(cut, noise);
        order.push((
            saved.or(worse.map(|w| -w)).unwrap_or(Real::NEG_INFINITY),
            0.0,
            sensitivities.len(),
        ));
        sensitivities.push(Sensitivity {
            elasticity: d.and_then(|d| finite(c.value / f0 * d)),
            key: c.key,
            value: c.value,
            saved_with_10pct_less_friction: saved,
            worse_with_10pct_less_friction: worse,
            derivative: d,
        });
    }
    // Largest saving first, as the ranking.
    let sensitivities = largest_first(sensitivities, order);
    progress.finish();
    Ok(Ranking {
        solve_for: Asked::of(&rig, main),
        forward: finite(f0),
        verdict: Verdict::assess(&rig, &solution),
        alternative: alt.map(Alternative::label),
        parts,
        sensitivities,
        caution: CAUTION,
        units: rig.units,
        csv_units: None,
    })
}
