//! `motion`: the rig in time, from rest at its drawn position (DESIGN.md §7).
//!
//! The rig is taken as a one-degree-of-freedom mechanism along the drive's motion. Its
//! figures over the travel come from the quasi-static solver ([`profile`]): the running
//! forward and back values, the holding band with static coefficients, the inertia of
//! every moving part as the drive feels it through the friction of each case. The
//! [`integrate`] module moves it in time under the drive's value (constant, or its
//! schedule). [`strokes`] and the warnings turn the run into strokes and warnings.
//!
//! Where the ropes give `stiffness`, [`two`] adds the second degree of freedom: the drive
//! weight, or a drive drum's own inertia, on the rope's spring rate at the drive. A haul's
//! end has no inertia: its stretch follows its force, so the rig side moves as with one
//! degree and the rope's strain energy `D²/(2k)` joins the balance.
//!
//! Schedules on parts other than the drive (a load, a weight that is not the drive) are
//! followed: the profile is solved again at each of their times ([`Profile::at_t`]),
//! so the holding band and the running values move with time.

pub mod integrate;
pub mod profile;
pub mod two;
pub mod warnings;

use crate::math::Real;
use crate::model::{PartId, PartKind, Rig};
use crate::solve::{given_quantity, Quantity, SolveError, SolveOptions};

pub use integrate::{DriveValue, Energy, Event, EventKind, Point, Run, Settings};
pub use profile::{GeometryEnd, GeometryEnds, Profile};
use warnings::{
    drop_unresolved_slips, geometry_end_warning, slack_stroke, unresolved_motion, warnings,
};
pub use warnings::{Warning, WarningFigures, RESOLVED_MOTION};

/// The most swings of the drive on a stretchy rope that a two-degree run follows (each
/// takes tens of steps): a stiffer rope, whose swings a real rope's damping would end,
/// is taken as inextensible.
pub const MOST_ROPE_SWINGS: Real = 2e4;

/// The most times of the other parts' schedules at which the statics is solved again.
pub const MOST_SOLVED_TIMES: usize = 100;

/// How long a step in another part's schedule takes in the solved figures, relative to
/// its time (at least 1 s): the statics is solved at the step and this much after it.
pub const STEP_WIDTH: Real = 1e-9;

/// Settings of a motion run, with defaults.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct MotionOptions {
    /// Run length, s; None: the latest schedule time (the drive's or another part's)
    /// × 1.5 + 10 s (60 s without a schedule).
    pub duration: Option<Real>,
    /// Sampled intervals over the travel (default 200).
    pub intervals: usize,
    /// Largest time step in motion, s; None: duration / 2000.
    pub max_step: Option<Real>,
    /// Scale of the integrator's tolerances (default 1).
    pub tolerance_scale: Real,
    /// The solver's settings.
    pub solve: SolveOptions,
}

impl Default for MotionOptions {
    fn default() -> Self {
        MotionOptions {
            duration: None,
            intervals: 200,
            max_step: None,
            tolerance_scale: 1.0,
            solve: SolveOptions::default(),
        }
    }
}

/// Why there is no run.
#[derive(Debug, Clone, thiserror::Error)]
pub enum MotionError {
    /// The drive has no value to move the rig with.
    #[error("the drive `{part}` has no {quantity} to move the rig with: give it one (or a `{{schedule: [[t, q], ...]}}`) for `motion`")]
    NoDriveValue {
        /// The drive.
        part: String,
        /// Its quantity's name.
        quantity: &'static str,
    },
    /// A rope would have to push at the drawn position: the statics needs a negative
    /// tension there, which `check` fails as `slack-span`.
    #[error("at the drawn position span {span} of line `{line}` would need a negative tension ({tension:.4} N): the rope goes slack there (as `check` says, `slack-span`), so the rig cannot be run from rest; make the ropes carry the loads")]
    Slack {
        /// The line.
        line: String,
        /// The span's index on the line.
        span: usize,
        /// Its tension, N (negative).
        tension: Real,
    },
    /// Nothing that moves has mass: the equation of motion has no answer (any drive
    /// outside the band would move the rig at once at any speed).
    #[error("the rig has no moving mass: `motion` needs the mass of what moves (a block's or weight's `mass`, a load `mass`, a sheave's or drum's `mass` or `inertia`, a lever); give the parts their masses")]
    NoMass,
    /// The rig cannot be solved somewhere on its travel.
    #[error(
        "at drive position {position} (m or rad from the drawn position) the rig cannot be solved"
    )]
    Solve {
        /// Where.
        position: Real,
        /// Why.
        #[source]
        source: SolveError,
    },
}

/// One stroke: a run in one direction from leaving rest until it stays at rest or turns
/// round; it may stop and set off again the same way (stick-slip) in between.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Stroke {
    /// +1 forward, −1 back.
    pub direction: Real,
    /// Start time, s.
    pub start: Real,
    /// End time, s.
    pub end: Real,
    /// Largest speed, m/s or rad/s.
    pub peak_speed: Real,
    /// Largest span tension, N.
    pub peak_tension: Real,
    /// Times it stopped and set off again the same way within the stroke.
    pub stick_slip_cycles: usize,
    /// Whether it ended at an end stop, and the speed it hit it with.
    pub stop_speed: Option<Real>,
    /// The lag: from the drive value's last turn before the start (its latest least
    /// value for a forward stroke, greatest for a back stroke, since the previous
    /// stroke ended) to the start, s; None for a constant drive.
    pub lag: Option<Real>,
}

/// The motion of a rig.
#[derive(Debug, Clone, PartialEq)]
pub struct Motion {
    /// The drive's name.
    pub drive: String,
    /// The drive's quantity.
    pub quantity: Quantity,
    /// The profile over the travel.
    pub profile: Profile,
    /// The run.
    pub run: Run,
    /// Run length, s.
    pub duration: Real,
    /// The strokes.
    pub strokes: Vec<Stroke>,
    /// Warnings.
    pub warnings: Vec<Warning>,
    /// The drive value over time.
    pub drive_value: DriveValue,
    /// The spring rate joining drive side and rig side, where the run has two degrees of
    /// freedom (a stretchy rope and a drive weight, a drum with inertia, or a haul).
    pub two_dof: Option<Real>,
}

/// Runs `rig` in time.
///
/// # Errors
/// [`MotionError`] when the drive has no value or the rig cannot be solved on its travel.
pub fn motion(rig: &Rig, options: &MotionOptions) -> Result<Motion, MotionError> {
    motion_told(rig, options, &())
}

/// [`motion`], telling `progress` how far it has got: one step per sampled position of
/// each solved time (the statics, the long part), and one for the run itself.
///
/// # Errors
/// As [`motion`].
pub fn motion_told(
    rig: &Rig,
    options: &MotionOptions,
    progress: &dyn crate::progress::Progress,
) -> Result<Motion, MotionError> {
    let result = motion_inner(rig, options, progress);
    progress.finish();
    result
}

fn motion_inner(
    rig: &Rig,
    options: &MotionOptions,
    progress: &dyn crate::progress::Progress,
) -> Result<Motion, MotionError> {
    let mut rig = rig.clone();
    rig.solve_for = rig.drive;
    let drive = rig.drive;
    let name = rig.parts[drive].name.clone();
    let schedule = rig.changing.of(drive).schedule.clone();
    let drive_value = match (schedule, given_quantity(&rig, drive)) {
        (Some(s), _) => DriveValue::Scheduled(s),
        (None, Some(v)) => DriveValue::Constant(v),
        (None, None) => {
            let quantity =
                crate::solve::natural_quantity(&rig, drive).map_or("value", |q| q.name());
            return Err(MotionError::NoDriveValue {
                part: name,
                quantity,
            });
        }
    };
    // The statics needs the drive's value unknown: it asks what value moves it.
    set_natural(&mut rig, drive, None);
    // The other parts' schedules: the statics solved again at each of their times.
    let others: Vec<(PartId, crate::model::changing::Schedule)> = rig
        .parts
        .ids()
        .filter(|&p| p != drive)
        .filter_map(|p| rig.changing.of(p).schedule.clone().map(|s| (p, s)))
        .collect();
    let at_time = |t: Real| {
        let mut r = rig.clone();
        for (p, s) in &others {
            set_natural(&mut r, *p, Some(s.at(t)));
        }
        r
    };
    let tick = || progress.step();
    let build = |r: &Rig| {
        profile::build_told(r, options.intervals, &options.solve, &tick)
            .map_err(|(position, source)| MotionError::Solve { position, source })
    };
    let mut times: Vec<Real> = others
        .iter()
        .flat_map(|(_, s)| s.times().collect::<Vec<_>>())
        .filter(|&t| t > 0.0)
        .collect();
    times.sort_by(Real::total_cmp);
    times.dedup_by(|a, b| (*a - *b).abs() <= 1e-12 * a.abs().max(1.0));
    // Each time costs a whole profile: a long schedule is solved at every k-th of its
    // times (and its last) and interpolated between, with a warning.
    let all_times = times.len();
    if all_times > MOST_SOLVED_TIMES {
        let k = all_times.div_ceil(MOST_SOLVED_TIMES);
        let last = times[all_times - 1];
        times = times.into_iter().step_by(k).collect();
        if times.last() != Some(&last) {
            times.push(last);
        }
    }
    let solved_times = times.len();
    // A step (two points at one time) jumps there: the statics is solved at the value
    // before it and again just after it, at whatever thinning, so that the figures
    // jump at the step instead of being held at the value before (or blended towards
    // the value after over the piece before).
    let steps: Vec<Real> = others
        .iter()
        .flat_map(|(_, s)| {
            s.points
                .windows(2)
                .filter(|w| w[0].0 == w[1].0)
                .map(|w| w[0].0)
                .collect::<Vec<_>>()
        })
        .collect();
    for t in steps {
        if t > 0.0 {
            times.push(t);
        }
        times.push(t + STEP_WIDTH * t.abs().max(1.0));
    }
    times.sort_by(Real::total_cmp);
    times.dedup_by(|a, b| (*a - *b).abs() <= 1e-12 * a.abs().max(1.0));
    progress.start((times.len() + 1) * profile::sample_count(&rig, options.intervals) + 1);
    let mut profile = build(&at_time(0.0))?;
    for &t in &times {
        profile.later.push((t, build(&at_time(t))?.samples));
    }
    // A rope that would have to push: its figures are those of a slack rope (the band
    // comes out reversed, the friction negative). Where both ways need it at the drawn
    // position nothing can be run; a stroke through such figures is warned below.
    let at_rest = profile.at(0.0);
    if at_rest.least_forward.0 < 0.0 && at_rest.least_back.0 < 0.0 {
        let (tension, (l, j)) = if at_rest.least_forward.0 < at_rest.least_back.0 {
            at_rest.least_forward
        } else {
            at_rest.least_back
        };
        return Err(MotionError::Slack {
            line: rig.lines[l].name.clone(),
            span: j,
            tension,
        });
    }
    // Without mass the motion has no answer: refused, never run at a tiny stand-in mass.
    let massless = |s: &profile::Sample| s.effective_mass + s.own_inertia <= 0.0;
    if !profile.drive_value_is_mass
        && profile.samples.iter().all(massless)
        && profile.later.iter().all(|(_, s)| s.iter().all(massless))
    {
        return Err(MotionError::NoMass);
    }
    // The latest schedule end, the drive's or another part's.
    let last_end = others
        .iter()
        .map(|(_, s)| s.end())
        .chain(match &drive_value {
            DriveValue::Scheduled(s) => Some(s.end()),
            DriveValue::Constant(_) => None,
        })
        .reduce(Real::max);
    let duration = options
        .duration
        .unwrap_or(last_end.map_or(60.0, |e| e * 1.5 + 10.0));
    let settings = Settings {
        duration,
        max_step: options.max_step.unwrap_or(duration / 2000.0).max(1e-6),
        tolerance_scale: options.tolerance_scale,
    };
    // A stretchy rope: drive side and rig side joined by the spring. A drive weight or
    // drum carries its own inertia on the drive side; a haul's end has none, so its
    // stretch follows its force at once (`u = D/k`): the rig moves as with one degree of
    // freedom, and the rope's strain energy joins the balance.
    let kind = &rig.parts[drive].kind;
    let two_dof = profile.drive_stiffness.filter(|_| match kind {
        PartKind::Weight(_) | PartKind::Haul(_) => true,
        // A lever or spring on the drive drum acts on the drive side, which the
        // profile does not split off: those stay one degree of freedom.
        PartKind::Drum(_) => {
            let c = rig.changing.of(drive);
            profile.drive_inertia > 0.0 && c.lever.is_none() && c.spring.is_none()
        }
        _ => false,
    });
    // A rope so stiff that the drive swings on it faster than the run can follow (and a
    // real rope damps it) is taken as inextensible: one degree of freedom, warned.
    let mut too_stiff = None;
    let two_dof = two_dof.filter(|&k| {
        let drive_mass = match (kind, &drive_value) {
            (PartKind::Weight(_), DriveValue::Constant(m)) => *m,
            (PartKind::Weight(_), DriveValue::Scheduled(s)) => {
                s.points.iter().map(|p| p.1).fold(Real::INFINITY, Real::min)
            }
            (PartKind::Drum(_), _) => profile.drive_inertia,
            _ => return true,
        };
        let period = 2.0 * std::f64::consts::PI * (drive_mass.max(0.0) / k).sqrt();
        let follows = period * MOST_ROPE_SWINGS >= duration;
        if !follows {
            too_stiff = Some((k, period));
        }
        follows
    });
    let run = match (two_dof, kind) {
        (Some(k), PartKind::Weight(_)) => two::run(&profile, &drive_value, &settings, k, None),
        (Some(k), PartKind::Drum(_)) => two::run(
            &profile,
            &drive_value,
            &settings,
            k,
            Some(profile.drive_inertia),
        ),
        (Some(k), _) => {
            let mut run = integrate::run(&profile, &drive_value, &settings);
            // The haul's end moves `x + D/k`: its work `∫D·dx + [D²/(2k)]`.
            let end = run.points.last().map_or(0.0, |p| p.t);
            let (d0, d1) = (drive_value.at(0.0).max(0.0), drive_value.at(end).max(0.0));
            let strain = (d1 * d1 - d0 * d0) / (2.0 * k);
            run.energy.spring += strain;
            run.energy.drive += strain;
            run
        }
        (None, _) => integrate::run(&profile, &drive_value, &settings),
    };
    progress.step();
    let mut run = run;
    let unresolved = drop_unresolved_slips(&mut run.events);
    let mut strokes = strokes(&run);
    if let DriveValue::Scheduled(s) = &drive_value {
        let mut since = 0.0;
        for stroke in &mut strokes {
            stroke.lag = lag(s, since, stroke.start, stroke.direction);
            since = stroke.end;
        }
    }
    let mut warnings = warnings(&rig, &profile, &run, &strokes);
    if let Some((x, (tension, (l, j)))) = slack_stroke(&profile, &run, &strokes) {
        let line = rig.lines[l].name.clone();
        let unit = if profile.rotates { "rad" } else { "m" };
        warnings.push(Warning {
            code: "slack-span",
            message: format!(
                "at drive position {x:.4} {unit} a stroke runs where span {j} of line `{line}` would need a negative tension ({tension:.4} N): the rope goes slack there and the figures there do not hold"
            ),
            figures: Some(WarningFigures::Slack {
                position: x,
                tension,
                line,
                span: j,
            }),
        });
    }
    if let Some((rate, period)) = too_stiff {
        let unit = if profile.rotates { "N*m/rad" } else { "N/m" };
        warnings.push(Warning {
            code: "stiff-rope",
            message: format!(
                "the rope's spring rate at the drive ({rate:.4e} {unit}) swings the drive on it with a period of {period:.3e} s, more than {MOST_ROPE_SWINGS:e} times over the run: too fast to follow, and a real rope damps it; the run takes the rope as inextensible (one degree of freedom)"
            ),
            figures: Some(WarningFigures::StiffRope { rate, period }),
        });
    }
    if let Some(figures) = unresolved_motion(&run, &strokes, unresolved) {
        let WarningFigures::Unresolved {
            dropped, largest, ..
        } = figures
        else {
            unreachable!("unresolved_motion gives Unresolved")
        };
        let unit = if profile.rotates { "rad" } else { "m" };
        warnings.push(Warning {
            code: "unresolved-motion",
            message: format!(
                "the rig moves by at most {largest:.3e} {unit} between stops ({dropped} stop(s) and restart(s) of less than {RESOLVED_MOTION:e} {unit} left out of the events and stick-slip counts): below the run's resolution, as a very stiff rope or spring gives; the rig creeps or stays put there, and those stops are not stick-slip"
            ),
            figures: Some(figures),
        });
    }
    if all_times > solved_times {
        warnings.push(Warning {
            code: "schedule-thinned",
            message: format!(
                "the other parts' schedules have {all_times} times; the statics is solved at {solved_times} of them (and at each step) and interpolated linearly between"
            ),
            figures: None,
        });
    }
    let reached = run.points.last().map_or(0.0, |p| p.t);
    if run.at_geometry_end {
        warnings.push(geometry_end_warning(&profile, &run));
    } else if reached < duration * (1.0 - 1e-9) {
        warnings.push(Warning {
            code: "step-limit",
            message: format!(
                "the run stopped at {reached:.3} s of {duration:.3} s: it took more steps than the integrator allows (a very stiff rope on a light drive swings fast); shorten --duration"
            ),
                    figures: None,
});
    }
    if profile.stops.is_none() {
        warnings.push(Warning {
            code: "no-travel",
            message: "the rig gives no `travel`: it has no end stops, and the run follows its geometry until a span closes up (or, where the geometry sets no limit, until its fastest part has moved as far as the rope drawn) and ends there".to_string(),
                    figures: None,
});
    }
    Ok(Motion {
        drive: name,
        quantity: profile.quantity,
        profile,
        run,
        duration,
        strokes,
        warnings,
        drive_value,
        two_dof,
    })
}

/// Sets part `p`'s natural quantity (a haul's force, a weight's mass, a block's load, a
/// drum's torque) to `value`, or unknown with None.
fn set_natural(rig: &mut Rig, p: PartId, value: Option<Real>) {
    match &mut rig.parts[p].kind {
        PartKind::Haul(h) => h.force = value,
        PartKind::Weight(w) => w.mass = value,
        PartKind::Drum(d) => d.torque = value,
        PartKind::Block(b) => {
            b.load = match b.load {
                crate::model::BlockLoad::Mass(_) => crate::model::BlockLoad::Mass(value),
                crate::model::BlockLoad::Force(_) => crate::model::BlockLoad::Force(value),
            }
        }
        _ => {}
    }
}

/// From the schedule's latest extreme in `[since, start]` (least for a forward stroke,
/// greatest for a back one; a schedule's extremes lie at its points) to `start`.
fn lag(
    schedule: &crate::model::changing::Schedule,
    since: Real,
    start: Real,
    direction: Real,
) -> Option<Real> {
    let mut best: Option<(Real, Real)> = None;
    let candidates = schedule
        .times()
        .filter(|&t| t >= since && t <= start)
        .chain([since]);
    for t in candidates {
        let q = schedule.at(t) * -direction;
        // The latest of the greatest `-direction·q`: ties go to the later time.
        if best.map_or(true, |(bq, bt)| {
            q > bq + 1e-12 * bq.abs() || (q >= bq - 1e-12 * bq.abs() && t > bt)
        }) {
            best = Some((q, t));
        }
    }
    best.map(|(_, t)| start - t)
}

/// The strokes of a run: from each start until the rig stays at rest (a stop, or a stop
/// in the open not followed by a start the same way) or turns round.
pub fn strokes(run: &Run) -> Vec<Stroke> {
    let mut out: Vec<Stroke> = Vec::new();
    let mut current: Option<Stroke> = None;
    // Whether the current stroke has had its end (a stop, a stick or an end stop).
    let mut ended = false;
    for e in &run.events {
        match e.kind {
            EventKind::StartsForward | EventKind::StartsBack => {
                if let Some(mut s) = current.take() {
                    // Turned round without coming to rest: it ends where the next starts.
                    if !ended {
                        s.end = e.t;
                    }
                    out.push(s);
                }
                ended = false;
                current = Some(Stroke {
                    direction: if e.kind == EventKind::StartsForward {
                        1.0
                    } else {
                        -1.0
                    },
                    start: e.t,
                    end: e.t,
                    peak_speed: 0.0,
                    peak_tension: 0.0,
                    stick_slip_cycles: 0,
                    stop_speed: None,
                    lag: None,
                });
            }
            EventKind::Slips => {
                if let Some(s) = current.as_mut() {
                    s.stick_slip_cycles += 1;
                }
            }
            EventKind::Stops | EventKind::Sticks => {
                ended = true;
                if let Some(s) = current.as_mut() {
                    s.end = e.t;
                    // A `stops` with a speed ends the run where the geometry ends.
                    if e.speed != 0.0 {
                        s.stop_speed = Some(e.speed.abs());
                    }
                }
            }
            EventKind::ReachesForwardStop | EventKind::ReachesBackStop => {
                ended = true;
                if let Some(s) = current.as_mut() {
                    s.end = e.t;
                    s.stop_speed = Some(e.speed.abs());
                }
            }
        }
    }
    if let Some(s) = current.take() {
        out.push(s);
    }
    // A stroke still moving at the end of the run ends there.
    let t_end = run.points.last().map_or(0.0, |p| p.t);
    for s in &mut out {
        let still = run.events.iter().filter(|e| e.t >= s.start).all(|e| {
            matches!(
                e.kind,
                EventKind::StartsForward | EventKind::StartsBack | EventKind::Slips
            ) && (e.t == s.start || e.kind == EventKind::Slips)
        });
        if still {
            s.end = t_end;
        }
        for p in run.points.iter().filter(|p| p.t >= s.start && p.t <= s.end) {
            s.peak_speed = s.peak_speed.max(p.v.abs());
            s.peak_tension = s.peak_tension.max(p.tension);
        }
        // The output points are sparser than the steps: the impact speed is exact.
        s.peak_speed = s.peak_speed.max(s.stop_speed.unwrap_or(0.0));
    }
    out
}
