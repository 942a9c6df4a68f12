//! The rig's figures over its travel, for `motion`: at each sampled position of the
//! drive the forward and back values (running friction), the holding band (static
//! coefficients), the inertia reflected to the drive through the friction of each case,
//! and the span tensions with their response to acceleration. The integrator reads them
//! by linear interpolation between samples.
//!
//! Inertia through the friction: the d'Alembert load `−mᵢ·vᵢ·a` of every moving part
//! (block, weight, drum and lever; `vᵢ` its speed per unit drive speed) is set on the
//! part (`PartChanging::extra_load`) and the statics solved again; the change of the
//! drive value per unit drive acceleration is the inertia as the drive feels it in that
//! case. The statics is linear in the loads for fixed pin loads, so this response holds
//! for any acceleration to the accuracy with which the pin loads (and so the journal
//! friction) stay as at constant speed: a linearisation, stated in the report.
//! Sheaves turn with the rope; their inertia `I·(s/R)²` (rope speed `s` per unit drive
//! speed) is added to the drive's own, not passed through the friction.

use crate::geometry::pitch_radius;
use crate::math::{Real, STANDARD_GRAVITY};
use crate::model::{IdVec, LineId, PartId, PartKind, Rig};
use crate::solve::kinematics::Motion;
use crate::solve::statics::{ById, Problem};
use crate::solve::{travel, Case, Quantity, Solution, SolveError, SolveOptions};

/// A span's tension, N, with the span: `(tension, (line, index on the line))`.
pub type SpanTension = (Real, (LineId, usize));

/// The figures at one position. Drive values in the drive's natural SI unit (N, kg or
/// N·m); inertias in that unit per unit drive acceleration (m/s² or rad/s²).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Sample {
    /// Drive position from the drawn position, m or rad.
    pub x: Real,
    /// Ideal (frictionless) value.
    pub ideal: Real,
    /// Least value that keeps the rig running forward (running friction).
    pub forward: Real,
    /// Greatest value at which it runs back (running friction).
    pub back: Real,
    /// Least value that starts it forward from rest (static coefficients where given).
    pub start_forward: Real,
    /// Greatest value at which it starts back from rest.
    pub start_back: Real,
    /// Inertia through the friction: forward, back, ideal.
    pub inertia_forward: Real,
    /// Back.
    pub inertia_back: Real,
    /// Ideal (frictionless), in the drive's unit: `Σ m·v² + Σ I·ω²` of the parts other
    /// than the drive and the sheaves, divided by the generalized scale (g for a mass).
    pub inertia_ideal: Real,
    /// `Σ m·v² + Σ I·ω²` of the moving parts other than the drive and the sheaves, kg
    /// (or kg·m² for a drum drive), from kinematics alone: the same figure as
    /// `inertia_ideal` times the scale, found without the statics (a check).
    pub effective_mass: Real,
    /// Sheaves' `Σ I·(s/R)²` and the drive's own inertia when it is not a weight, kg or
    /// kg·m² (generalized).
    pub own_inertia: Real,
    /// Largest span tension moving forward at constant speed, N, and its change per unit
    /// drive acceleration (of the span that is largest at constant speed).
    pub tension_forward: (Real, Real),
    /// The same moving back.
    pub tension_back: (Real, Real),
    /// Largest static safety-check tension (the larger of forward and back), N.
    pub static_tension: Real,
    /// The least span tension moving forward at constant speed, N, and its span
    /// `(line, index)`: below zero the rope would have to push (slack), and the figures
    /// of that case mean nothing (a negative tension times the friction ratio: negative
    /// friction, a reversed band).
    pub least_forward: SpanTension,
    /// The same moving back.
    pub least_back: SpanTension,
}

/// The sampled travel.
#[derive(Debug, Clone, PartialEq)]
pub struct Profile {
    /// Samples in increasing `x` (one where the rig has no travel).
    pub samples: Vec<Sample>,
    /// The drive's quantity.
    pub quantity: Quantity,
    /// Whether the drive turns (positions in rad).
    pub rotates: bool,
    /// The end stops `(back, forward)` as positions, when the rig gives `travel`.
    pub stops: Option<(Real, Real)>,
    /// Whether the drive value is a mass that moves with the drive (a weight's mass, a
    /// block's load mass): the integrator adds it, at its scheduled value, to the mass
    /// the drive accelerates.
    pub drive_value_is_mass: bool,
    /// The drive's own inertia when it is a drum (kg·m², its own and its lever's, part
    /// of every sample's `own_inertia`), else 0: the drive side of two degrees of freedom.
    pub drive_inertia: Real,
    /// The least breaking strength over design factor of the ropes, N (for the warning).
    pub allowed_tension: Option<Real>,
    /// The rig's spring rate at the drive at the drawn position (N/m or N·m/rad), where
    /// the ropes give `stiffness`.
    pub drive_stiffness: Option<Real>,
    /// Where parts other than the drive follow a schedule: the samples solved again at
    /// the values of each later schedule time `(t, samples)`, in increasing `t` (> 0);
    /// `samples` are those at time 0. Between two times the figures are interpolated
    /// linearly in time (the scheduled values are linear there, and the statics is
    /// linear in the loads for fixed pin loads). Empty without such schedules.
    pub later: Vec<(Real, Vec<Sample>)>,
    /// Where a rig without `travel` is followed: the ends of its geometry, at which the
    /// run ends (None where the rig gives `travel`: its stops).
    pub ends: Option<GeometryEnds>,
}

/// Where a rig without `travel` can be followed on one side of its drawn position.
#[derive(Debug, Clone, PartialEq)]
pub struct GeometryEnd {
    /// The drive's position there, m or rad from the drawn position.
    pub position: Real,
    /// Why the rig cannot be followed past it (a span closes up: its words; or the
    /// solver's refusal there); None where the geometry sets no limit that way within
    /// the reach of the rope drawn.
    pub reason: Option<String>,
}

/// The two ends of a rig without `travel` ([`GeometryEnd`]), found by following its
/// geometry from the drawn position.
#[derive(Debug, Clone, PartialEq)]
pub struct GeometryEnds {
    /// The back end (position ≤ 0).
    pub back: GeometryEnd,
    /// The forward end (position ≥ 0).
    pub forward: GeometryEnd,
    /// The rope drawn, m: the spans' lengths at the drawn position added up. Where the
    /// geometry sets no limit, the rig is followed until its fastest-moving part (or
    /// rope) has moved this far.
    pub rope_drawn: Real,
}

impl Profile {
    /// Generalized force per unit of the drive's natural quantity: g for a mass, else 1.
    pub fn scale(&self) -> Real {
        if self.quantity == Quantity::Mass {
            STANDARD_GRAVITY
        } else {
            1.0
        }
    }

    /// The figures at `x` at time 0, interpolated linearly (held beyond the ends).
    pub fn at(&self, x: Real) -> Sample {
        interpolate(&self.samples, x)
    }

    /// The figures at `x` at time `t`: where other parts follow a schedule, interpolated
    /// linearly in time between the solved times (held beyond the last).
    pub fn at_t(&self, t: Real, x: Real) -> Sample {
        let Some(i) = self.later.iter().position(|(tl, _)| *tl > t) else {
            return match self.later.last() {
                Some((_, s)) => interpolate(s, x),
                None => self.at(x),
            };
        };
        let (t0, a) = if i == 0 {
            if t <= 0.0 {
                return self.at(x);
            }
            (0.0, self.at(x))
        } else {
            (self.later[i - 1].0, interpolate(&self.later[i - 1].1, x))
        };
        let (t1, b) = (self.later[i].0, interpolate(&self.later[i].1, x));
        blend(&a, &b, (t - t0) / (t1 - t0))
    }

    /// The solved times after `t` (strictly): the figures' slope in time changes there.
    pub fn next_time(&self, t: Real) -> Option<Real> {
        self.later
            .iter()
            .map(|(tl, _)| *tl)
            .find(|&b| b > t + 1e-12 * b.abs().max(1.0))
    }

    /// The positions at which the run stops: the end stops of `travel`, else the ends of
    /// the geometry (unbounded where neither is known).
    pub fn limits(&self) -> (Real, Real) {
        match (self.stops, &self.ends) {
            (Some(s), _) => s,
            (None, Some(e)) => (e.back.position, e.forward.position),
            (None, None) => (Real::NEG_INFINITY, Real::INFINITY),
        }
    }

    /// Whether reaching [`Profile::limits`] ends the run (the geometry's ends of a rig
    /// without `travel`) rather than holding the rig at an end stop.
    pub fn limits_end_run(&self) -> bool {
        self.stops.is_none() && self.ends.is_some()
    }

    /// The solved times, for root-finding on the holding band at rest.
    pub fn times(&self) -> impl Iterator<Item = Real> + '_ {
        self.later.iter().map(|(t, _)| *t)
    }
}

/// `a + (b − a)·w` for every figure (the position is `a`'s).
fn blend(a: &Sample, b: &Sample, w: Real) -> Sample {
    let l = |p: Real, q: Real| p + (q - p) * w;
    Sample {
        x: a.x,
        ideal: l(a.ideal, b.ideal),
        forward: l(a.forward, b.forward),
        back: l(a.back, b.back),
        start_forward: l(a.start_forward, b.start_forward),
        start_back: l(a.start_back, b.start_back),
        inertia_forward: l(a.inertia_forward, b.inertia_forward),
        inertia_back: l(a.inertia_back, b.inertia_back),
        inertia_ideal: l(a.inertia_ideal, b.inertia_ideal),
        effective_mass: l(a.effective_mass, b.effective_mass),
        own_inertia: l(a.own_inertia, b.own_inertia),
        tension_forward: (
            l(a.tension_forward.0, b.tension_forward.0),
            l(a.tension_forward.1, b.tension_forward.1),
        ),
        tension_back: (
            l(a.tension_back.0, b.tension_back.0),
            l(a.tension_back.1, b.tension_back.1),
        ),
        static_tension: l(a.static_tension, b.static_tension),
        least_forward: (l(a.least_forward.0, b.least_forward.0), a.least_forward.1),
        least_back: (l(a.least_back.0, b.least_back.0), a.least_back.1),
    }
}

/// The figures of `s` (increasing `x`) at `x`, interpolated linearly (held beyond the
/// ends).
fn interpolate(s: &[Sample], x: Real) -> Sample {
    if s.len() == 1 || x <= s[0].x {
        return Sample { x, ..s[0] };
    }
    let last = s[s.len() - 1];
    if x >= last.x {
        return Sample { x, ..last };
    }
    let i = s.partition_point(|p| p.x <= x).clamp(1, s.len() - 1);
    let (a, b) = (&s[i - 1], &s[i]);
    Sample {
        x,
        ..blend(a, b, (x - a.x) / (b.x - a.x))
    }
}

/// A part's inertia about its own motion: kg for a translating part, kg·m² for a drum
/// (its own or a uniform disc of its mass at its pitch radius, plus its lever as a point
/// mass at its arm's distance from the axle).
fn dof_inertia(rig: &Rig, part: PartId, rope_diameter: Real) -> Real {
    let c = rig.changing.of(part);
    match &rig.parts[part].kind {
        PartKind::Block(b) => {
            let carried: Real = rig
                .parts
                .iter()
                .filter_map(|p| match &p.kind {
                    PartKind::Sheave(s) if p.block == Some(part) => s.mass,
                    _ => None,
                })
                .sum();
            let load = match b.load {
                crate::model::BlockLoad::Mass(Some(m)) => m,
                _ => 0.0,
            };
            b.mass.unwrap_or(0.0) + carried + load
        }
        PartKind::Weight(w) => w.mass.unwrap_or(0.0),
        PartKind::Drum(d) => {
            let r = pitch_radius(d.diameter, rope_diameter);
            let own = c
                .inertia
                .unwrap_or_else(|| 0.5 * d.mass.unwrap_or(0.0) * r * r);
            let lever = c.lever.map_or(0.0, |l| {
                let axle = d.axle.into_inner();
                let radial = l.arm - axle * l.arm.dot(&axle);
                l.mass * radial.norm_squared()
            });
            own + lever
        }
        _ => 0.0,
    }
}

/// `Σ I·(s/R)²` of the rig's sheaves (rope speed `s` per unit drive speed), kg·m²/m² or
/// kg·m², each sheave counted once (its first passage).
fn sheave_inertia(rig: &Rig, s: &Solution) -> Real {
    let mut seen = IdVec::filled(false, rig.parts.len());
    let mut total = 0.0;
    for (l, line) in rig.lines.enumerate() {
        let rope_d = rig.rope_of(l).diameter;
        for (e, entry) in line.path.iter().enumerate() {
            let PartKind::Sheave(sh) = &rig.parts[entry.part].kind else {
                continue;
            };
            if seen[entry.part] {
                continue;
            }
            seen[entry.part] = true;
            let r = pitch_radius(sh.tread_diameter, rope_d);
            let inertia = rig
                .changing
                .of(entry.part)
                .inertia
                .unwrap_or_else(|| 0.5 * sh.mass.unwrap_or(0.0) * r * r);
            let speed = s
                .kinematics
                .rope_speed
                .get(l)
                .and_then(|v| v.get(e))
                .copied()
                .unwrap_or(0.0);
            total += inertia * (speed / r).powi(2);
        }
    }
    total
}

fn largest(t: &ById<LineId, Vec<Real>>) -> (LineId, usize, Real) {
    let mut best = (LineId::new(0), 0, Real::NEG_INFINITY);
    for (l, spans) in t.entries() {
        for (j, &v) in spans.iter().enumerate() {
            if v > best.2 {
                best = (l, j, v);
            }
        }
    }
    best
}

/// The least span tension with its `(line, index)`.
fn least(t: &ById<LineId, Vec<Real>>) -> SpanTension {
    t.entries()
        .flat_map(|(l, spans)| spans.iter().enumerate().map(move |(j, &v)| (v, (l, j))))
        .min_by(|a, b| a.0.total_cmp(&b.0))
        .unwrap_or((0.0, (LineId::new(0), 0)))
}

/// The figures of `rig` (whose `solve_for` is its drive) solved as `solution`, at `x`.
///
/// # Errors
/// The solver's, where the rig cannot be balanced there.
pub fn sample(
    rig: &Rig,
    solution: &Solution,
    x: Real,
    options: &SolveOptions,
) -> Result<Sample, SolveError> {
    let main = solution.main();
    let drive = rig.drive;
    fn problem<'a>(
        r: &'a Rig,
        solution: &'a Solution,
        component: usize,
        drive: PartId,
    ) -> Result<Problem<'a>, SolveError> {
        Problem::new(
            r,
            &solution.network,
            &solution.geometry,
            &solution.kinematics,
            component,
            drive,
            drive,
        )
    }
    let base = problem(rig, solution, main.component, drive)?;
    let start_forward = base.solve_static(Case::Forward, options)?.value;
    let start_back = base.solve_static(Case::Back, options)?.value;
    // The d'Alembert loads of a unit drive acceleration on every moving part but the drive.
    let rope_d = rig.ropes.iter().next().map_or(0.0, |r| r.diameter);
    let mut loaded = rig.clone();
    let k = &solution.kinematics;
    let mut inertia_ideal = 0.0;
    for (i, dof) in k.dofs.iter().enumerate() {
        if solution.network.component_of[dof.part] != main.component || dof.part == drive {
            continue;
        }
        let m = dof_inertia(rig, dof.part, rope_d);
        let v = k.forward[i];
        inertia_ideal += m * v * v;
        loaded.changing.of_mut(dof.part).extra_load -= m * v;
    }
    let again = problem(&loaded, solution, main.component, drive)?;
    let f1 = again.solve(Case::Forward, options)?;
    let b1 = again.solve(Case::Back, options)?;
    let i1 = again.solve(Case::Ideal, options)?;
    let own = match &rig.parts[drive].kind {
        PartKind::Weight(_) => 0.0,
        _ => dof_inertia(rig, drive, rope_d),
    } + sheave_inertia(rig, solution);
    let (lf, jf, tf) = largest(&main.forward.tension);
    let (lb, jb, tb) = largest(&main.back.tension);
    let response = |t: &ById<LineId, Vec<Real>>, l: LineId, j: usize, base: Real| {
        t.get(l).and_then(|s| s.get(j)).map_or(0.0, |v| v - base)
    };
    Ok(Sample {
        x,
        ideal: main.ideal.value,
        forward: main.forward.value,
        back: main.back.value,
        start_forward: start_forward.max(main.forward.value),
        start_back: start_back.min(main.back.value),
        inertia_forward: f1.value - main.forward.value,
        inertia_back: b1.value - main.back.value,
        inertia_ideal: i1.value - main.ideal.value,
        effective_mass: inertia_ideal,
        own_inertia: own,
        tension_forward: (tf, response(&f1.tension, lf, jf, tf)),
        tension_back: (tb, response(&b1.tension, lb, jb, tb)),
        static_tension: tf.max(tb),
        least_forward: least(&main.forward.tension),
        least_back: least(&main.back.tension),
    })
}

/// Samples the rig over its travel (`intervals` equal steps between its stops, each
/// taken in two midpoint sub-steps), or at its drawn position alone when it gives no
/// `travel`. `rig.solve_for` must be the drive.
///
/// # Errors
/// The first position where the rig cannot be solved, with its position.
pub fn build(
    rig: &Rig,
    intervals: usize,
    options: &SolveOptions,
) -> Result<Profile, (Real, SolveError)> {
    build_told(rig, intervals, options, &|| {})
}

/// How many positions [`build`] samples: the drawn position and each interval's end on
/// both sides (without `travel`, at most that many: the geometry may end sooner).
pub fn sample_count(rig: &Rig, intervals: usize) -> usize {
    let Some(t) = rig.changing.travel else {
        return 1 + 2 * intervals.max(1);
    };
    let h = (t.back + t.forward) / intervals.max(1) as Real;
    let n = |length: Real| {
        if length > 0.0 && h > 0.0 {
            (length / h).ceil() as usize
        } else {
            0
        }
    };
    1 + n(t.forward) + n(t.back)
}

/// [`build`], calling `tick` after each sampled position (for a progress bar).
///
/// # Errors
/// As [`build`].
pub fn build_told(
    rig: &Rig,
    intervals: usize,
    options: &SolveOptions,
    tick: &dyn Fn(),
) -> Result<Profile, (Real, SolveError)> {
    let solve = |r: &Rig| crate::solve::solve(r, options);
    let first = solve(rig).map_err(|e| (0.0, e))?;
    let main = first.main();
    let k = &first.kinematics;
    let rotates =
        k.dof_of_part[rig.drive].is_some_and(|i| matches!(k.dofs[i].motion, Motion::Rotate(_)));
    let rope_d = rig.ropes.iter().next().map_or(0.0, |r| r.diameter);
    let allowed_tension = rig
        .ropes
        .iter()
        .filter_map(|r| r.breaking_strength)
        .map(|b| b / rig.limits.design_factor)
        .reduce(Real::min);
    let mut profile = Profile {
        samples: vec![sample(rig, &first, 0.0, options).map_err(|e| (0.0, e))?],
        quantity: main.quantity,
        rotates,
        stops: None,
        drive_value_is_mass: main.quantity == Quantity::Mass,
        drive_inertia: match rig.parts[rig.drive].kind {
            PartKind::Drum(_) => dof_inertia(rig, rig.drive, rope_d),
            _ => 0.0,
        },
        allowed_tension,
        drive_stiffness: main.drive_stiffness.filter(|k| k.is_finite() && *k > 0.0),
        later: Vec::new(),
        ends: None,
    };
    tick();
    let Some(t) = rig.changing.travel else {
        // No end stops: the rig is followed until its geometry ends on each side.
        let rope_drawn: Real = first
            .geometry
            .lines
            .iter()
            .flat_map(|l| l.spans.iter())
            .map(|s| s.length)
            .sum();
        let fastest = travel::part_velocities(rig, &first)
            .iter()
            .map(|(_, v)| v.norm())
            .chain(
                first
                    .kinematics
                    .rope_speed
                    .iter()
                    .flatten()
                    .map(|v| v.abs()),
            )
            .fold(0.0, Real::max);
        let reach = if fastest > 1e-12 {
            rope_drawn / fastest
        } else {
            rope_drawn
        };
        let mut side = |sign: Real| {
            let (samples, end) = follow(rig, &first, sign * reach, intervals, options, tick);
            profile.samples.extend(samples);
            end
        };
        let forward = side(1.0);
        let back = side(-1.0);
        profile.samples.sort_by(|a, b| a.x.total_cmp(&b.x));
        profile.ends = Some(GeometryEnds {
            back,
            forward,
            rope_drawn,
        });
        return Ok(profile);
    };
    profile.stops = Some((-t.back, t.forward));
    let span = t.back + t.forward;
    let h = span / intervals.max(1) as Real;
    for (length, sign) in [(t.forward, 1.0), (t.back, -1.0)] {
        let n = (length / h).ceil() as usize;
        if n == 0 {
            continue;
        }
        let dx = sign * length / n as Real;
        let (mut r, mut s) = (rig.clone(), first.clone());
        for step in 1..=n {
            for _ in 0..2 {
                let (r2, s2, closed) = travel::midpoint_step_closing(&r, &s, 0.5 * dx, solve)
                    .map_err(|e| (step as Real * dx, e))?;
                // Past a closed span the figures describe a rope through a part.
                if let Some(c) = closed.or_else(|| travel::closed_span(&r2, &s, &s2)) {
                    let line = &r2.lines[c.line];
                    return Err((
                        step as Real * dx,
                        SolveError::SpanClosesUp {
                            line: line.name.clone(),
                            span: c.span,
                            from: r2.parts[line.path[c.span].part].name.clone(),
                            to: r2.parts[line.path[c.span + 1].part].name.clone(),
                        },
                    ));
                }
                r = r2;
                s = s2;
            }
            let x = step as Real * dx;
            profile
                .samples
                .push(sample(&r, &s, x, options).map_err(|e| (x, e))?);
            tick();
        }
    }
    profile.samples.sort_by(|a, b| a.x.total_cmp(&b.x));
    Ok(profile)
}

/// Follows `rig` (solved as `first`) from its drawn position towards `reach` (m or rad,
/// signed) in `intervals` steps, each two midpoint sub-steps as [`build`] takes them,
/// until a span closes up or the rig cannot be solved: that last step is bisected
/// (twelve halvings) for the farthest position that still solves, where the geometry
/// ends. Returns the samples past the drawn position and the end.
fn follow(
    rig: &Rig,
    first: &Solution,
    reach: Real,
    intervals: usize,
    options: &SolveOptions,
    tick: &dyn Fn(),
) -> (Vec<Sample>, GeometryEnd) {
    let solve = |r: &Rig| crate::solve::solve(r, options);
    // Two half steps of `dx`, or why the rig cannot be followed there.
    let advance = |r: &Rig, s: &Solution, dx: Real| -> Result<(Rig, Solution), String> {
        let (mut r, mut s) = (r.clone(), s.clone());
        for _ in 0..2 {
            let (r2, s2, closed) =
                travel::midpoint_step_closing(&r, &s, 0.5 * dx, solve).map_err(|e| chain(&e))?;
            if let Some(c) = closed.or_else(|| travel::closed_span(&r2, &s, &s2)) {
                let line = &r2.lines[c.line];
                return Err(format!(
                    "span {} of line `{}` closes up: `{}` meets `{}`",
                    c.span,
                    line.name,
                    r2.parts[line.path[c.span].part].name,
                    r2.parts[line.path[c.span + 1].part].name
                ));
            }
            (r, s) = (r2, s2);
        }
        Ok((r, s))
    };
    let at = |r: &Rig, s: &Solution, dx: Real, x: Real| {
        let (r2, s2) = advance(r, s, dx)?;
        let sample = sample(&r2, &s2, x, options).map_err(|e| chain(&e))?;
        Ok::<_, String>((r2, s2, sample))
    };
    let n = intervals.max(1);
    let dx = reach / n as Real;
    let (mut r, mut s) = (rig.clone(), first.clone());
    let mut x = 0.0;
    let mut out = Vec::new();
    for _ in 0..n {
        match at(&r, &s, dx, x + dx) {
            Ok((r2, s2, sample)) => {
                (r, s, x) = (r2, s2, x + dx);
                out.push(sample);
                tick();
            }
            Err(reason) => {
                let (mut lo, mut hi) = (0.0, 1.0);
                let mut best = None;
                for _ in 0..12 {
                    let f = 0.5 * (lo + hi);
                    match at(&r, &s, f * dx, x + f * dx) {
                        Ok((_, _, sample)) => {
                            lo = f;
                            best = Some(sample);
                        }
                        Err(_) => hi = f,
                    }
                }
                if let Some(sample) = best {
                    x = sample.x;
                    out.push(sample);
                }
                return (
                    out,
                    GeometryEnd {
                        position: x,
                        reason: Some(reason),
                    },
                );
            }
        }
    }
    (
        out,
        GeometryEnd {
            position: x,
            reason: None,
        },
    )
}

/// An error and its sources, joined by `: ` (the words of a geometry end).
fn chain(error: &dyn std::error::Error) -> String {
    let mut words = error.to_string();
    let mut source = error.source();
    while let Some(e) = source {
        let more = e.to_string();
        if !words.ends_with(&more) {
            words.push_str(": ");
            words.push_str(&more);
        }
        source = e.source();
    }
    words
}
