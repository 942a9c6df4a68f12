//! `sweep`: the asked quantity and efficiency as one value of the rig file steps from
//! one end of a range to the other ([`sweep`]), or as the drive moves the rig through
//! its travel ([`stroke`]).
//!
//! The stroke moves the drive through its travel in steps, each split into sub-steps
//! that `solve::travel::midpoint_step` takes (the parts moved along the rig's motion
//! by the midpoint rule, the rig solved again where they are); the study itself has no
//! kinematics. A step where the rig cannot be solved (a point enters a sheave, the
//! geometry fails, a span goes slack, a span closes up) is reported and ends the
//! stroke.

use serde::Serialize;

use crate::math::Real;
use crate::model::{LineId, Rig};
use crate::report::Asked;
use crate::report::{finite, CAUTION};
use crate::solve::travel::{self, ClosedSpan};
use crate::solve::{Solution, SubRigSolution};
use crate::units::{parse_quantity, Dimension, UnitSystem};

use super::local::Local;
use super::{
    largest_fleet_deg, largest_tension, number_and_unit, with_unit, Progress, RigSource,
    StudyError, Verdict,
};

/// A value to vary: `KEY=FROM..TO`, the bounds in the unit written (or the file's).
#[derive(Debug, Clone, PartialEq)]
pub struct Vary {
    /// Key path, as `--set` takes it.
    pub key: String,
    /// First value.
    pub from: Real,
    /// Last value.
    pub to: Real,
    /// Unit written after the numbers (empty: the file's unit or a plain number).
    pub unit: String,
}

/// Reads `KEY=FROM..TO` (`parts.head.bearing.mu=0.05..0.2`,
/// `parts.hook.load.mass=400 kg..900 kg` or `=400..900 kg`).
///
/// # Errors
/// [`StudyError::Input`] saying what was expected.
pub fn parse_vary(text: &str) -> Result<Vary, StudyError> {
    let bad = || {
        StudyError::Input(format!(
            "--vary `{text}`: expected KEY=FROM..TO, e.g. parts.head.bearing.mu=0.05..0.2 or parts.hook.load.mass=400..900 kg"
        ))
    };
    let (key, range) = text.split_once('=').ok_or_else(bad)?;
    let (a, b) = range.split_once("..").ok_or_else(bad)?;
    let (from, ua) = number_and_unit(a).ok_or_else(bad)?;
    let (to, ub) = number_and_unit(b).ok_or_else(bad)?;
    let unit = match (ua.as_str(), ub.as_str()) {
        (x, y) if x == y => ua.clone(),
        ("", _) => ub.clone(),
        _ => {
            return Err(StudyError::Input(format!(
                "--vary `{text}`: the two ends must use the same unit, found `{ua}` and `{ub}`"
            )))
        }
    };
    let key = key.trim();
    if key.is_empty() {
        return Err(bad());
    }
    Ok(Vary {
        key: key.to_string(),
        from,
        to,
        unit,
    })
}

/// `n` evenly spaced values from `from` to `to`, both ends included (one value: `from`).
pub fn steps_between(from: Real, to: Real, n: usize) -> Vec<Real> {
    match n {
        0 => Vec::new(),
        1 => vec![from],
        _ => (0..n)
            .map(|i| {
                if i == n - 1 {
                    to
                } else {
                    from + (to - from) * i as Real / (n - 1) as Real
                }
            })
            .collect(),
    }
}

/// One step of a sweep. Values SI.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct SweepStep {
    /// The varied value, in the written unit.
    pub value: Real,
    /// Ideal value of the asked quantity.
    pub ideal: Option<Real>,
    /// Forward value.
    pub forward: Option<Real>,
    /// Back value.
    pub back: Option<Real>,
    /// Forward efficiency.
    pub efficiency: Option<Real>,
    /// Why this step has no values.
    pub error: Option<String>,
    /// What `check` concludes about this step (empty where it could not be solved).
    #[serde(flatten)]
    pub verdict: Verdict,
}

/// A parameter sweep.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Sweep {
    /// The varied key.
    pub key: String,
    /// Unit of the varied values as written (empty: the file's unit or a ratio).
    pub unit: String,
    /// The asked quantity (from the first step that solved).
    pub solve_for: Option<Asked>,
    /// The steps.
    pub steps: Vec<SweepStep>,
    /// The caution.
    pub caution: &'static str,
    /// Units of the rig, for text output.
    #[serde(skip)]
    pub units: UnitSystem,
    /// Units of the CSV: `None` for SI (as the JSON), else those of `--units`.
    #[serde(skip)]
    pub csv_units: Option<UnitSystem>,
}

impl Sweep {
    /// Whether any step fails a check or could not be solved (the sweep exits 1, as
    /// `check` would: the study is incomplete).
    pub fn fails(&self) -> bool {
        self.steps.iter().any(|s| s.verdict.fails) || self.unsolved() > 0
    }

    /// How many steps could not be solved (they carry their error).
    pub fn unsolved(&self) -> usize {
        self.steps.iter().filter(|s| s.error.is_some()).count()
    }
}

impl Stroke {
    /// Whether any step fails a check or could not be solved (the stroke exits 1, as
    /// `check` would: the study is incomplete).
    pub fn fails(&self) -> bool {
        self.steps.iter().any(|s| s.verdict.fails) || self.unsolved() > 0
    }

    /// How many steps could not be solved (the stroke stops at the first).
    pub fn unsolved(&self) -> usize {
        self.steps.iter().filter(|s| s.error.is_some()).count()
    }
}

/// A step that solved: its main sub-rig's figures and `check`'s verdict.
fn solved_step(value: Real, main: &SubRigSolution, verdict: Verdict) -> SweepStep {
    SweepStep {
        value,
        ideal: finite(main.ideal.value),
        forward: finite(main.forward.value),
        back: finite(main.back.value),
        efficiency: crate::report::efficiency(main.forward_efficiency()),
        error: None,
        verdict,
    }
}

/// A step that could not be solved, with the reason.
fn failed_step(value: Real, e: StudyError) -> SweepStep {
    SweepStep {
        value,
        ideal: None,
        forward: None,
        back: None,
        efficiency: None,
        error: Some(e.chain()),
        verdict: Verdict::default(),
    }
}

/// Sweeps one value over `steps` evenly spaced steps.
///
/// # Errors
/// When the rig does not load as written, or both ends are equal over more than one
/// step. Steps that fail carry their error.
pub fn sweep(
    source: &RigSource,
    vary: &Vary,
    steps: usize,
    progress: &dyn Progress,
) -> Result<Sweep, StudyError> {
    if vary.from == vary.to && steps > 1 {
        return Err(StudyError::Input(format!(
            "--vary `{}`: both ends are {}, so every step would be the same rig: nothing to sweep (give two different ends, or --steps 1)",
            vary.key,
            with_unit(vary.from, &vary.unit)
        )));
    }
    let base = source.load(&[])?;
    let units = base.units;
    // A numeric model value is set on the resolved rig for each step (see
    // `RigSource::sampler`); any other key re-resolves the file per step.
    let keys = [(vary.key.clone(), vary.unit.clone())];
    let values = steps_between(vary.from, vary.to, steps);
    let model = values
        .first()
        .and_then(|&first| source.sampler(&base, &keys, &[first]));
    // On the model path a step changes only a coefficient of friction or a load: the
    // rig as written keeps its geometry and motion, and only the statics and the
    // sub-rigs' checks run again (`Local`, as `spread` does). Where the rig as written
    // does not solve, or a step's value is refused on the model, the step is solved
    // whole.
    let nominal = model.as_ref().and_then(|_| source.solve(&[]).ok());
    let local = nominal
        .as_ref()
        .and_then(|(rig, solution)| Local::new(source, rig, solution));
    let mut work = None;
    let mut solve_for = None;
    let mut out = Vec::new();
    progress.start(values.len());
    for value in values {
        progress.step();
        if let (Some(model), Some(local)) = (model.as_ref(), local.as_ref()) {
            let rig = match work.take() {
                Some(mut rig) => model.set(&mut rig, &[value]).map(|()| rig),
                None => model.rig(&[value]),
            };
            if let Some(rig) = rig {
                let step = match local.solve_all(&rig) {
                    Ok((subs, verdict)) => {
                        let main = &subs[0];
                        solve_for.get_or_insert_with(|| Asked::of(&rig, main));
                        solved_step(value, main, verdict)
                    }
                    Err(e) => failed_step(value, e),
                };
                out.push(step);
                work = Some(rig);
                continue;
            }
        }
        out.push(match source.solve_values(model.as_ref(), &keys, &[value]) {
            Ok((rig, solution)) => {
                let main = solution.main();
                solve_for.get_or_insert_with(|| Asked::of(&rig, main));
                solved_step(value, main, Verdict::assess(&rig, &solution))
            }
            Err(e) => failed_step(value, e),
        });
    }
    progress.finish();
    Ok(Sweep {
        key: vary.key.clone(),
        unit: vary.unit.clone(),
        solve_for,
        steps: out,
        caution: CAUTION,
        units,
        csv_units: None,
    })
}

/// One step of a stroke. SI units.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct StrokeStep {
    /// Drive travel from the start (m, or rad for a drum drive).
    pub travel: Real,
    /// Ideal value of the asked quantity.
    pub ideal: Option<Real>,
    /// Forward value (the effort, when the asked part is the drive).
    pub forward: Option<Real>,
    /// Back value.
    pub back: Option<Real>,
    /// Velocity ratio.
    pub velocity_ratio: Option<Real>,
    /// Largest fleet angle, degrees.
    pub largest_fleet_deg: Option<Real>,
    /// Largest span tension, N.
    pub largest_tension_n: Option<Real>,
    /// Why the stroke ends here.
    pub error: Option<String>,
    /// The drive's available value here (its given quantity), where the drive is the
    /// asked part and its value is given.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub available: Option<Real>,
    /// A dead spot: `held` where the available drive no longer moves the rig forward
    /// (friction holds it), `runs-back` where the load runs it back by itself.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub dead_spot: Option<&'static str>,
    /// What `check` concludes at this position (empty where it could not be solved).
    #[serde(flatten)]
    pub verdict: Verdict,
}

/// Where the available drive leaves the rig at a position: held by friction, run back by
/// its load, or (None) moving (or nothing to compare: no available value).
fn dead_spot(rig: &Rig, s: &Solution) -> (Option<Real>, Option<&'static str>) {
    let main = s.main();
    if !main.drive_unknown() {
        return (None, None);
    }
    let Some(given) = crate::solve::given_quantity(rig, main.drive) else {
        return (None, None);
    };
    let spot = match main.outcome(given) {
        crate::solve::Outcome::HeldStill => Some("held"),
        crate::solve::Outcome::RunsBack => Some("runs-back"),
        _ => None,
    };
    (Some(given), spot)
}

/// A stroke: the drive moved forward through its travel.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Stroke {
    /// The drive.
    pub drive: String,
    /// Unit of `travel`: `m` or `rad`.
    pub travel_unit: &'static str,
    /// The asked quantity.
    pub solve_for: Option<Asked>,
    /// The steps (the first at zero travel).
    pub steps: Vec<StrokeStep>,
    /// The caution.
    pub caution: &'static str,
    /// Units of the rig, for text output.
    #[serde(skip)]
    pub units: UnitSystem,
    /// Units of the CSV: `None` for SI (as the JSON), else those of `--units`.
    #[serde(skip)]
    pub csv_units: Option<UnitSystem>,
}

/// Why the stroke stops where a span closes up: a moving part has reached (or passed
/// through) the part at the span's other end.
fn closed_words(rig: &Rig, closed: ClosedSpan) -> String {
    let line = &rig.lines[closed.line];
    let j = closed.span;
    let from = &rig.parts[line.path[j].part].name;
    let to = &rig.parts[line.path[j + 1].part].name;
    format!(
        "span {j} of line `{}` closes up: `{from}` and `{to}` meet",
        line.name
    )
}

/// The drive's travel, parsed: a length for a translating drive, an angle (degrees by
/// default, or `rad`) for a drum.
fn parse_travel(text: &str, rig: &Rig, rotates: bool) -> Result<Real, StudyError> {
    if rotates {
        let (v, unit) = number_and_unit(text).ok_or_else(|| {
            StudyError::Input(format!(
                "--stroke `{text}`: expected an angle for the drum drive, e.g. `90 deg` or `1.5 rad`"
            ))
        })?;
        return match unit.as_str() {
            "" | "deg" | "°" => Ok(v.to_radians()),
            "rad" => Ok(v),
            _ => Err(StudyError::Input(format!(
                "--stroke `{text}`: expected an angle in deg or rad for the drum drive"
            ))),
        };
    }
    parse_quantity(text, Dimension::Length, rig.units.length)
        .map_err(|e| StudyError::Input(format!("--stroke `{text}`: {e}")))
}

/// Moves the drive forward through `distance` in `steps` equal steps, each split into
/// `substeps` midpoint-rule sub-steps, solving at every step. An empty `distance` runs
/// over the rig's `travel` (DESIGN.md §7): the rig is first moved back to its back stop,
/// then through the whole travel to its forward stop; travel is still counted from the
/// drawn position (negative before it).
///
/// # Errors
/// When the rig does not load or solve at its starting position, or the travel is not
/// a length (an angle for a drum drive), or no distance is given and the rig has no
/// `travel`.
pub fn stroke(
    source: &RigSource,
    distance: &str,
    steps: usize,
    substeps: usize,
    progress: &dyn Progress,
) -> Result<Stroke, StudyError> {
    let (mut rig, mut first) = source.solve(&[])?;
    let drive = rig.drive;
    let rotates = travel::drive_rotates(&rig, &first);
    let mut start = 0.0;
    let total = if distance.trim().is_empty() {
        let Some(t) = rig.changing.travel else {
            return Err(StudyError::Input(
                "--stroke without a distance runs over the rig's `travel`, which this rig does not give: add `travel: {back: .., forward: ..}` or give a distance".to_string(),
            ));
        };
        if t.back > 0.0 {
            // To the back stop first, in the same small steps, unrecorded.
            let n = (steps.max(1) * substeps.max(1)).max(8);
            let dt = -t.back / n as Real;
            for _ in 0..n {
                let (r, s) = travel::midpoint_step(&rig, &first, dt, |r| source.solve_rig(r))
                    .map_err(|e| {
                        StudyError::Input(format!(
                            "the rig cannot be moved back to its back stop: {}",
                            e.chain()
                        ))
                    })?;
                rig = r;
                first = s;
            }
            start = -t.back;
        }
        t.back + t.forward
    } else {
        parse_travel(distance, &rig, rotates)?
    };
    if total == 0.0 || !total.is_finite() {
        return Err(StudyError::Input(format!(
            "--stroke `{distance}`: expected a travel other than zero (negative moves the drive back)"
        )));
    }
    let steps = steps.max(1);
    let substeps = substeps.max(1);
    let dt = total / (steps * substeps) as Real;
    let asked = Asked::of(&rig, first.main());
    let mut out = Vec::new();
    let record = |travel: Real, rig: &Rig, s: &Solution| {
        let main = s.main();
        let slack = !main.forward.slack.is_empty() || !main.back.slack.is_empty();
        let (available, dead_spot) = dead_spot(rig, s);
        StrokeStep {
            available,
            dead_spot,
            travel: start + travel,
            ideal: finite(main.ideal.value),
            forward: finite(main.forward.value),
            back: finite(main.back.value),
            velocity_ratio: main.velocity_ratio,
            largest_fleet_deg: largest_fleet_deg(s),
            largest_tension_n: largest_tension(s),
            verdict: Verdict::assess(rig, s),
            error: slack.then(|| {
                let (l, j) = main
                    .forward
                    .slack
                    .first()
                    .or(main.back.slack.first())
                    .copied()
                    .unwrap_or((LineId::new(0), 0));
                format!(
                    "span {j} of line `{}` turns slack",
                    rig.lines.get(l).map_or("?", |l| l.name.as_str())
                )
            }),
        }
    };
    out.push(record(0.0, &rig, &first));
    let mut current = first;
    progress.start(steps);
    'outer: for step in 1..=steps {
        progress.step();
        if out.last().is_some_and(|s: &StrokeStep| s.error.is_some()) {
            break;
        }
        // Translating parts move (also when a drum drives: then per radian of the drum).
        for _ in 0..substeps {
            let (next_rig, next, closed) =
                match travel::midpoint_step_closing(&rig, &current, dt, |r| source.solve_rig(r)) {
                    Ok(moved) => moved,
                    Err(e) => {
                        out.push(failed(start + step as Real * total / steps as Real, e));
                        break 'outer;
                    }
                };
            let closed = closed.or_else(|| travel::closed_span(&next_rig, &current, &next));
            if let Some(closed) = closed {
                // The figures past that point describe a rope through a part: none.
                out.push(stopped(
                    start + step as Real * total / steps as Real,
                    closed_words(&next_rig, closed),
                ));
                break 'outer;
            }
            rig = next_rig;
            current = next;
        }
        out.push(record(step as Real * total / steps as Real, &rig, &current));
    }
    progress.finish();
    Ok(Stroke {
        drive: rig.parts[drive].name.clone(),
        travel_unit: if rotates { "rad" } else { "m" },
        solve_for: Some(asked),
        steps: out,
        caution: CAUTION,
        units: rig.units,
        csv_units: None,
    })
}

fn failed(travel: Real, e: StudyError) -> StrokeStep {
    stopped(
        travel,
        format!("the rig cannot be solved here: {}", e.chain()),
    )
}

/// A step with no figures, only the reason the stroke stops there.
fn stopped(travel: Real, why: String) -> StrokeStep {
    StrokeStep {
        travel,
        ideal: None,
        forward: None,
        back: None,
        velocity_ratio: None,
        largest_fleet_deg: None,
        largest_tension_n: None,
        available: None,
        dead_spot: None,
        error: Some(why),
        verdict: Verdict::default(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn vary_reads_units() {
        let v = parse_vary("parts.hook.load.mass=400..900 kg").unwrap();
        assert_eq!((v.from, v.to, v.unit.as_str()), (400.0, 900.0, "kg"));
        let v = parse_vary("parts.head.bearing.mu=0.05..0.2").unwrap();
        assert_eq!((v.from, v.to, v.unit.as_str()), (0.05, 0.2, ""));
        assert!(parse_vary("parts.head.bearing.mu=0.05").is_err());
        assert!(parse_vary("a=1 kg..2 N").is_err());
    }

    /// Guards the sweep's local path (the rig as written kept, only the statics and
    /// sub-rigs' checks run again): every step gives the figures and verdict of the
    /// rig loaded with the step's value as an override and solved and checked whole,
    /// to the bit, on rigs of two sub-rigs and of ropes with weight and stiffness.
    #[test]
    fn local_steps_are_the_whole_rigs_steps() {
        for (file, vary) in [
            (
                "tests/rigs/review/two-subrigs.yaml",
                "ropes.cord4.mu=0.05..0.6",
            ),
            ("rigs/cliff-raise.yaml", "ropes.static11.mu=0.1..0.4"),
            ("rigs/cliff-raise.yaml", "parts.litter.load.mass=50..250 kg"),
        ] {
            let text = std::fs::read_to_string(file).expect("example rig");
            let source = RigSource::from_text(&text, file, &[]);
            let vary = parse_vary(vary).unwrap();
            let swept = sweep(&source, &vary, 7, &()).unwrap();
            let keys = [(vary.key.clone(), vary.unit.clone())];
            for step in &swept.steps {
                let (rig, whole) = source.solve_values(None, &keys, &[step.value]).unwrap();
                let main = whole.main();
                let bits = |x: Option<Real>| x.map(Real::to_bits);
                assert_eq!(
                    bits(step.forward),
                    bits(finite(main.forward.value)),
                    "{file}"
                );
                assert_eq!(bits(step.back), bits(finite(main.back.value)), "{file}");
                assert_eq!(bits(step.ideal), bits(finite(main.ideal.value)), "{file}");
                assert_eq!(step.verdict, Verdict::assess(&rig, &whole), "{file}");
            }
        }
    }

    #[test]
    fn steps_include_both_ends() {
        assert_eq!(steps_between(0.0, 1.0, 5), vec![0.0, 0.25, 0.5, 0.75, 1.0]);
        assert_eq!(steps_between(3.0, 4.0, 1), vec![3.0]);
    }
}
