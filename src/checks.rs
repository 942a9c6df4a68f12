//! Good-practice and safety checks over a solved rig: fleet angles, bend ratios,
//! wraps, safety factors, drum slip, stalled sheaves, whether the drive can move the
//! load, and the solver's own health. Each warning has a stable `code`.

use crate::math::Real;
use crate::model::{IdVec, PartKind, Rig, RopeId};
use crate::solve::{Outcome, Solution, Status, SubRigSolution};
use crate::units::Dimension;

pub mod friction;
pub mod material;

/// Wraps below this are reported as the rope not touching the part (0.1°).
pub const NO_WRAP: Real = 0.1 * std::f64::consts::PI / 180.0;

/// One finding.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Warning {
    /// Stable identifier (`fleet-angle`, `bend-ratio`, `safety-factor`, ...).
    pub code: &'static str,
    /// The part (or line) concerned, when there is one.
    pub part: Option<String>,
    /// What was found and what the limit is.
    pub message: String,
    /// Whether this fails the check (exit code 1) rather than only warning.
    pub fails: bool,
    /// How the finding reads together with others of its kind (the same D/d limit on
    /// several sheaves): human-readable reports list them in one sentence
    /// ([`grouped`]); the JSON keeps one entry per part. Not in the JSON.
    #[serde(skip_serializing)]
    pub group: Option<Group>,
}

/// A finding's place in a sentence shared with others: `{lead}{items}{tail}`, the items
/// of the findings with the same code, lead and tail joined as `a, b and c`.
#[derive(Debug, Clone, PartialEq)]
pub struct Group {
    /// The words before the list.
    pub lead: String,
    /// This finding's item (`` `head` (6.7) ``).
    pub item: String,
    /// The words after the list.
    pub tail: String,
}

impl Warning {
    fn grouped_as(mut self, lead: String, item: String, tail: &str) -> Warning {
        self.group = Some(Group {
            lead,
            item,
            tail: tail.to_string(),
        });
        self
    }
}

fn warn(code: &'static str, part: Option<&str>, fails: bool, message: String) -> Warning {
    Warning {
        code,
        part: part.map(str::to_string),
        message,
        fails,
        group: None,
    }
}

/// The warnings as a person reads them: findings that share a code and a sentence
/// (the same D/d limit for the same rope, the same fleet-angle limit on one line, one
/// sheave stalled forward and back) merged into one, in the order of their first; a
/// merged warning names no single `part`. One finding alone keeps its own message.
pub fn grouped(warnings: &[Warning]) -> Vec<Warning> {
    // Each merged warning with its items in first-seen order, and those items as a
    // set (a long line's many like findings are merged in one pass).
    type Merged = (Warning, Vec<String>, std::collections::HashSet<String>);
    let mut out: Vec<Merged> = Vec::new();
    for w in warnings {
        let same = w.group.as_ref().and_then(|g| {
            out.iter_mut().find(|(o, _, _)| {
                o.code == w.code
                    && o.fails == w.fails
                    && o.group
                        .as_ref()
                        .is_some_and(|h| h.lead == g.lead && h.tail == g.tail)
            })
        });
        match (same, &w.group) {
            (Some((_, items, seen)), Some(g)) => {
                if seen.insert(g.item.clone()) {
                    items.push(g.item.clone());
                }
            }
            _ => {
                let items: Vec<String> = w.group.iter().map(|g| g.item.clone()).collect();
                let seen = items.iter().cloned().collect();
                out.push((w.clone(), items, seen));
            }
        }
    }
    out.into_iter()
        .map(|(mut w, items, _)| {
            if let (Some(g), true) = (&w.group, items.len() > 1) {
                w.message = format!("{}{}{}", g.lead, and_list(&items), g.tail);
                w.part = None;
            }
            w
        })
        .collect()
}

/// `a`, `a and b`, `a, b and c`.
fn and_list(items: &[String]) -> String {
    match items {
        [] => String::new(),
        [one] => one.clone(),
        [rest @ .., last] => format!("{} and {last}", rest.join(", ")),
    }
}

/// Geometry checks: fleet angle, D/d, wrap. Needs no statics.
pub fn geometry_checks(rig: &Rig, geometry: &crate::geometry::Geometry) -> Vec<Warning> {
    let mut out = Vec::new();
    let limit = rig.limits.fleet_angle;
    for (l, line) in rig.lines.enumerate() {
        let rope = rig.rope_of(l);
        let n = line.path.len();
        for (e, entry) in geometry.lines[l].entries.iter().enumerate() {
            let part = &rig.parts[entry.part];
            if part.kind.round().is_none() {
                continue;
            }
            let fleet = entry
                .fleet_in
                .unwrap_or(0.0)
                .max(entry.fleet_out.unwrap_or(0.0));
            if fleet > limit + 1e-12 {
                let tail = "; the rope rubs the groove flank (align the part with the span)";
                out.push(
                    warn(
                        "fleet-angle",
                        Some(&part.name),
                        false,
                        format!(
                            "line `{}`: fleet angle {:.2}° at `{}` exceeds the limit {:.2}°{tail}",
                            line.name,
                            fleet.to_degrees(),
                            part.name,
                            limit.to_degrees()
                        ),
                    )
                    .grouped_as(
                        format!(
                            "line `{}`: fleet angle above the limit {:.2}° at ",
                            line.name,
                            limit.to_degrees()
                        ),
                        format!("`{}` ({:.2}°)", part.name, fleet.to_degrees()),
                        tail,
                    ),
                );
            }
            if let Some(ratio) = entry.bend_ratio {
                if ratio < rope.min_bend_ratio - 1e-9 {
                    let tail = "; a larger diameter lengthens rope life";
                    out.push(
                        warn(
                            "bend-ratio",
                            Some(&part.name),
                            false,
                            format!(
                                "line `{}`: D/d {:.1} at `{}` is below {:.1} for rope `{}`{tail}",
                                line.name, ratio, part.name, rope.min_bend_ratio, rope.name
                            ),
                        )
                        .grouped_as(
                            format!(
                                "D/d below {:.1} for rope `{}` at ",
                                rope.min_bend_ratio, rope.name
                            ),
                            format!("`{}` ({ratio:.1})", part.name),
                            tail,
                        ),
                    );
                }
            }
            if e > 0 && e + 1 < n && entry.wrap < NO_WRAP && !matches!(part.kind, PartKind::Drum(_))
            {
                out.push(warn(
                    "no-wrap",
                    Some(&part.name),
                    false,
                    format!(
                        "line `{}`: the rope does not wrap `{}` (wrap {:.3}°); it barely touches or misses the part",
                        line.name,
                        part.name,
                        entry.wrap.to_degrees()
                    ),
                ));
            }
        }
    }
    out
}

/// Drums at a line end whose `side` the file leaves to the default (left) where that
/// side leads the rope across the drum's centre line: the span leaves the drum on one
/// side of the centre line (along gravity, or square to it, whichever the span runs
/// nearer) and reaches its next part on the other, so the rope runs over or under the
/// drum to get there instead of leaving it on the side where it is going, as a rope
/// drawn hanging from the drum's other edge does. A stated `side` is never questioned.
pub fn drum_side_checks(rig: &Rig, geometry: &crate::geometry::Geometry) -> Vec<Warning> {
    let mut out = Vec::new();
    for (l, line) in rig.lines.enumerate() {
        let g = &geometry.lines[l];
        let n = line.path.len();
        if g.spans.is_empty() {
            continue;
        }
        for (e, neighbour, span, at_start) in [
            (0, 1, &g.spans[0], true),
            (n - 1, n - 2, &g.spans[g.spans.len() - 1], false),
        ] {
            let entry = &line.path[e];
            let PartKind::Drum(drum) = &rig.parts[entry.part].kind else {
                continue;
            };
            if entry.side.is_some() {
                continue;
            }
            let (on_drum, off_drum) = if at_start {
                (span.start, span.end)
            } else {
                (span.end, span.start)
            };
            let centre = g.entries[e].centre;
            let radius = g.entries[e].pitch_radius;
            let axle = drum.axle.into_inner();
            let down = rig.gravity.into_inner() - axle * axle.dot(&rig.gravity);
            if down.norm() < 1e-6 {
                // The drum turns in a level plane: no up and down to cross.
                continue;
            }
            let vertical = down.normalize();
            let level = axle.cross(&vertical);
            let u = span.direction.into_inner();
            // The normal of the centre line the span runs nearer.
            let normal = if u.dot(&vertical).abs() >= u.dot(&level).abs() {
                level
            } else {
                vertical
            };
            let (a, b) = (
                (on_drum - centre).dot(&normal),
                (off_drum - centre).dot(&normal),
            );
            let crosses = a * b < 0.0 && a.abs().min(b.abs()) > 1e-6 * radius;
            if crosses {
                let part = &rig.parts[entry.part].name;
                let end = if at_start { "start" } else { "end" };
                out.push(warn(
                    "drum-side",
                    Some(part),
                    false,
                    format!(
                        "line `{}`: `{part}` at the {end} of the line has no `side`, and the default (left) leads the rope across the drum's centre line to `{}`; if it should leave the drum on the other side write `{{part: {part}, side: right}}` (a drum winds the rope in as it turns forward with `side: right` at the start of a line, `side: left` at its end)",
                        line.name,
                        rig.parts[line.path[neighbour].part].name,
                    ),
                ));
            }
        }
    }
    out
}

/// A hanging weight whose line leaves it more than this off plumb would swing (2°).
pub const OFF_PLUMB: Real = 2.0 * std::f64::consts::PI / 180.0;

/// Weights hang plumb: the lines' resultant pull on a hanging weight must run against
/// gravity (ideal case), or the weight would swing until it does and the figures would
/// not hold.
pub fn plumb_checks(rig: &Rig, solution: &Solution) -> Vec<Warning> {
    let mut out = Vec::new();
    let up = -rig.gravity.into_inner();
    for sub in &solution.subrigs {
        // The parts the sub-rig's lines reach, in part order.
        for (id, &pin_load) in sub.ideal.pin_load.entries() {
            let part = &rig.parts[id];
            let (PartKind::Weight(_), Some(pull)) = (&part.kind, pin_load) else {
                continue;
            };
            if solution.network.component_of[id] != sub.component || pull.norm() == 0.0 {
                continue;
            }
            let angle = (pull.dot(&up) / pull.norm()).clamp(-1.0, 1.0).acos();
            if angle > OFF_PLUMB {
                out.push(warn(
                    "off-plumb",
                    Some(&part.name),
                    false,
                    format!(
                        "`{}` hangs {:.1}° off plumb; a hanging weight swings until its lines pull straight up, so move it under the part it hangs from",
                        part.name,
                        angle.to_degrees()
                    ),
                ));
            }
        }
    }
    out
}

/// A haul pulled more than this off its rope reports only the effort's component (5°).
pub const PULL_OFF_ROPE: Real = 5.0 * std::f64::consts::PI / 180.0;

/// Haul ends pulled along a stated `pull` that is not along their rope: the effort shown
/// is the component along `pull` (right for a slider on a track, misleading for a hand
/// on a rope), so say so and give the rope's tension.
pub fn pull_checks(rig: &Rig, solution: &Solution) -> Vec<Warning> {
    let mut out = Vec::new();
    for (l, line) in rig.lines.enumerate() {
        let spans = &solution.geometry.lines[l].spans;
        let n = line.path.len();
        let ends = [
            (
                line.path[0].part,
                0,
                spans.first().map(|s| -s.direction.into_inner()),
            ),
            (
                line.path[n - 1].part,
                spans.len().saturating_sub(1),
                spans.last().map(|s| s.direction.into_inner()),
            ),
        ];
        for (part, span, along_rope) in ends {
            let (PartKind::Haul(h), Some(along_rope)) = (&rig.parts[part].kind, along_rope) else {
                continue;
            };
            let Some(pull) = h.pull else { continue };
            let angle = pull.dot(&along_rope).clamp(-1.0, 1.0).acos();
            if angle <= PULL_OFF_ROPE {
                continue;
            }
            let tension = solution
                .subrigs
                .iter()
                .find_map(|s| s.forward.tension.get(l).and_then(|t| t.get(span)).copied());
            let name = &rig.parts[part].name;
            out.push(warn(
                "pull-off-rope",
                Some(name),
                false,
                format!(
                    "`{name}` is pulled {:.1}° off its rope: the effort shown is the component along `pull`; the rope itself carries {} forward",
                    angle.to_degrees(),
                    tension.map_or("—".to_string(), |t| rig.units.show(t, Dimension::Force))
                ),
            ));
        }
    }
    out
}

/// Plain bearings whose running coefficient `mu` is above their static `mu_static`:
/// static friction is at least the running friction, so the breakaway figure would come
/// out below the running one.
pub fn bearing_checks(rig: &Rig) -> Vec<Warning> {
    use crate::model::Bearing;
    let mut out = Vec::new();
    for part in &rig.parts {
        let bearing = match &part.kind {
            PartKind::Sheave(s) => Some(&s.bearing),
            PartKind::Drum(d) => d.shaft.as_ref().map(|s| &s.bearing),
            _ => None,
        };
        if let Some(&Bearing::Plain {
            mu,
            mu_static: Some(mu_static),
            ..
        }) = bearing
        {
            if mu > mu_static {
                out.push(warn(
                    "mu-above-static",
                    Some(&part.name),
                    false,
                    format!(
                        "`{}`: the bearing's running `mu` {} is above its `mu_static` {}; static friction is at least the running friction, so the breakaway figure comes out below the running one (check the two values)",
                        part.name,
                        crate::units::significant(mu, 3),
                        crate::units::significant(mu_static, 3)
                    ),
                ));
            }
        }
    }
    out
}

/// All checks over a solution.
pub fn run(rig: &Rig, solution: &Solution) -> Vec<Warning> {
    let mut out = geometry_checks(rig, &solution.geometry);
    out.extend(bearing_checks(rig));
    out.extend(friction::friction_checks(rig));
    out.extend(material::rope_checks(rig));
    out.extend(material::stretch_checks(rig, solution));
    out.extend(material::sag_checks(rig, solution));
    out.extend(drum_side_checks(rig, &solution.geometry));
    out.extend(plumb_checks(rig, solution));
    out.extend(pull_checks(rig, solution));
    for sub in &solution.subrigs {
        out.extend(subrig_checks(rig, sub));
    }
    out
}

/// Ropes that give no `breaking_strength`: their spans' safety factor cannot be
/// checked, and without a word a rig of any load would read clean. One warning per
/// rope the sub-rig's lines use, naming the largest tension it carries there in any
/// case (either end of a span); not a failure, since the strength is optional.
fn strength_unknown_checks(rig: &Rig, sub: &SubRigSolution) -> Vec<Warning> {
    let mut largest: IdVec<RopeId, Option<Real>> = IdVec::filled(None, rig.ropes.len());
    for (l, _) in sub.forward.tension.entries() {
        let rope = rig.lines[l].rope;
        if rig.ropes[rope].breaking_strength.is_some() {
            continue;
        }
        let worst = [&sub.ideal, &sub.forward, &sub.back]
            .iter()
            .flat_map(|c| {
                let start = c.tension.get(l).into_iter().flatten();
                start.chain(c.tension_end.get(l).into_iter().flatten())
            })
            .copied()
            .filter(|t| t.is_finite())
            .fold(0.0, Real::max);
        largest[rope] = Some(largest[rope].map_or(worst, |w| w.max(worst)));
    }
    let mut out = Vec::new();
    for (rope, worst) in largest.enumerate() {
        let Some(worst) = *worst else { continue };
        // A slack rope (every tension negative) has no largest tension to name.
        let largest = if worst > 0.0 {
            format!(
                " (largest tension {})",
                rig.units.show(worst, Dimension::Force)
            )
        } else {
            String::new()
        };
        out.push(warn(
            "strength-unknown",
            None,
            false,
            format!(
                "rope `{}` gives no `breaking_strength`, so the safety factor of its spans is not checked against the design factor {}{largest}; add the rope's rated strength",
                rig.ropes[rope].name,
                rig.limits.design_factor,
            ),
        ));
    }
    out
}

/// Lines along which friction multiplies the tension beyond any rope's range
/// ([`crate::friction::PHYSICAL_RATIO_LIMIT`]), passage ratios in series between the
/// line's ends and drums (a drum's ratio is its load torque's, not friction's). Every
/// passage may be ordinary and the line still lock: the product is what fails.
fn friction_lock_checks(rig: &Rig, sub: &SubRigSolution) -> Vec<Warning> {
    let mut out = Vec::new();
    // The sub-rig's lines, in line order.
    for (l, _) in sub.forward.tension.entries() {
        let line = &rig.lines[l];
        // The largest product of one run: (product, first entry, last entry).
        let mut worst: Option<(Real, usize, usize)> = None;
        for case in [&sub.forward, &sub.back] {
            let Some(ratios) = case.ratio.get(l).filter(|_| !case.tension[l].is_empty()) else {
                continue;
            };
            let (mut product, mut start) = (1.0, 0);
            for (e, entry) in line.path.iter().enumerate().skip(1) {
                if matches!(rig.parts[entry.part].kind, PartKind::Drum(_)) {
                    (product, start) = (1.0, e);
                    continue;
                }
                product *= ratios[e].unwrap_or(1.0);
                if !worst.is_some_and(|(w, _, _)| product <= w) {
                    worst = Some((product, start, e));
                }
            }
        }
        let Some((product, start, end)) = worst else {
            continue;
        };
        if product > crate::friction::PHYSICAL_RATIO_LIMIT {
            let name = |e: usize| &rig.parts[line.path[e].part].name;
            out.push(warn(
                "friction-lock",
                Some(&line.name),
                true,
                format!(
                    "line `{}`: friction multiplies the tension {}-fold from `{}` to `{}`, beyond what any rope spans (above {:e}): the rig locks there and the figures mean nothing; fewer wraps or less friction along it",
                    line.name,
                    crate::units::significant(product, 3),
                    name(start),
                    name(end),
                    crate::friction::PHYSICAL_RATIO_LIMIT
                ),
            ));
        }
    }
    out
}

/// The checks of one sub-rig's solution, as [`run`] lists them after the rig's own
/// (a study that solves one sub-rig again checks that one again).
pub fn subrig_checks(rig: &Rig, sub: &SubRigSolution) -> Vec<Warning> {
    let mut out = Vec::new();
    let drive = &rig.parts[sub.drive].name;
    let force = |x: Real| rig.units.show(x, Dimension::Force);
    // Does the drive do what the rig needs: move it, or hold back a load that runs it
    // forward by itself? One verdict, the one the report and the studies read.
    let show = |x: Real| rig.units.show(x, sub.quantity.dimension());
    if let Some(available) = crate::solve::given_quantity(rig, sub.solve_for) {
        let (a, f, b) = (
            show(available),
            show(sub.forward.value),
            show(sub.back.value),
        );
        match sub.outcome(available) {
            Outcome::Moves | Outcome::HoldsBack => {}
            outcome if sub.drive_unknown() => {
                let (code, message) = match outcome {
                    Outcome::RunsAway => (
                        "runs-away",
                        format!(
                            "`{drive}` cannot hold the rig: the load runs it forward by itself (forward {f}) and the available {a} {}, so it runs away; holding it needs {f} or less (if forward should haul in, the drive's `side` or sign is the wrong way round)",
                            if available >= 0.0 {
                                "pushes the same way"
                            } else {
                                "holds back less than that"
                            }
                        ),
                    ),
                    Outcome::RunsBack => (
                        "cannot-move",
                        format!(
                            "`{drive}` cannot move the rig: {a} available, {f} needed to start it forward; below {b} the rig runs back{}",
                            if available < 0.0 { " (the available value acts backward)" } else { "" }
                        ),
                    ),
                    _ => (
                        "cannot-move",
                        format!(
                            "`{drive}` cannot move the rig: {a} available, {f} needed to start it forward{}",
                            if available < 0.0 { " (the available value acts backward)" } else { "" }
                        ),
                    ),
                };
                out.push(warn(code, Some(drive), true, message));
            }
            _ => {
                let part = &rig.parts[sub.solve_for].name;
                out.push(warn(
                    "cannot-move",
                    Some(part),
                    true,
                    format!(
                        "the drive cannot move `{part}`: its stated {} {a} exceeds the most the drive moves, {f}",
                        sub.quantity.name(),
                    ),
                ));
            }
        }
    }
    // The load does the work going forward: forward lowers or pays out.
    if sub.drive_unknown() && sub.ideal.value < 0.0 {
        out.push(warn(
            "drive-reversed",
            Some(drive),
            false,
            format!(
                "with `{drive}` moving forward the load does the work (ideal {}): forward lowers or pays out, and the values are what the drive must hold back; for a drum check `side` on its path entry if that is not what you meant",
                show(sub.ideal.value)
            ),
        ));
    }
    // Static friction: it may run once started but not start from rest.
    if let (Some(available), Some(breakaway)) = (
        crate::solve::given_quantity(rig, sub.solve_for),
        sub.breakaway.as_ref(),
    ) {
        let short = if sub.drive_holds_back() {
            // Static friction only helps a drive that holds the load back.
            false
        } else if sub.drive_unknown() {
            available >= sub.forward.value && available < breakaway.value
        } else {
            available <= sub.forward.value && available > breakaway.value
        };
        if short {
            out.push(warn(
                "may-not-start",
                Some(drive),
                false,
                format!(
                    "the drive keeps the rig moving once started ({} forward) but may not start it from rest: breakaway needs {} with the static coefficients",
                    show(sub.forward.value),
                    show(breakaway.value)
                ),
            ));
        }
    }
    // Safety factor of every span of the sub-rig's lines (in line order), worst case of
    // forward and back.
    for (l, _) in sub.forward.tension.entries() {
        let line = &rig.lines[l];
        let rope = rig.rope_of(l);
        let Some(strength) = rope.breaking_strength else {
            continue;
        };
        // Both ends of every span: with rope weight the higher end is the tighter.
        let worst = [&sub.forward, &sub.back, &sub.ideal]
            .iter()
            .flat_map(|c| {
                let start = c.tension.get(l).into_iter().flatten();
                start
                    .chain(c.tension_end.get(l).into_iter().flatten())
                    .copied()
            })
            .fold(0.0, Real::max);
        if worst > 0.0 && strength / worst < rig.limits.design_factor {
            out.push(warn(
                "safety-factor",
                Some(&line.name),
                true,
                format!(
                    "line `{}`: safety factor {:.2} (breaking strength {} over largest tension {}) is below the design factor {}",
                    line.name,
                    strength / worst,
                    force(strength),
                    force(worst),
                    rig.limits.design_factor
                ),
            ));
        }
    }
    out.extend(strength_unknown_checks(rig, sub));
    out.extend(friction_lock_checks(rig, sub));
    for case in [&sub.forward, &sub.back] {
        let name = case.case.name();
        for slip in &case.slipping {
            let part = &rig.parts[rig.lines[slip.line].path[slip.entry].part].name;
            out.push(warn(
                "drum-slip",
                Some(part),
                true,
                format!(
                    "{name}: the rope slips on `{part}`: it needs a tension ratio of {:.3} but the wrap holds only {:.3}; add turns or tie the line",
                    slip.ratio, slip.limit
                ),
            ));
        }
        for &(l, e) in &case.stalled {
            let part = &rig.parts[rig.lines[l].path[e].part].name;
            let tail = format!(": `{part}` does not turn: its bearing (with the sheave's own weight in the pin load) needs more than the groove can transmit, so the rope slides over it at the capstan ratio");
            out.push(
                warn("stalled-sheave", Some(part), false, format!("{name}{tail}")).grouped_as(
                    String::new(),
                    name.to_string(),
                    &tail,
                ),
            );
        }
        for &(l, j) in &case.slack {
            let line = &rig.lines[l];
            // With rope weight the span's ends differ: show the lower (negative) one.
            let start = case.tension[l][j];
            let end = case.tension_end.get(l).and_then(|t| t.get(j)).copied();
            let shown = match end {
                Some(end) if end < start => format!("{} at its end", force(end)),
                _ => force(start),
            };
            out.push(warn(
                "slack-span",
                Some(&line.name),
                true,
                format!(
                    "{name}: span {j} of line `{}` would need a negative tension ({shown}); the rope goes slack there and the figures do not hold",
                    line.name
                ),
            ));
        }
        if let Status::OutOfIterations { iterations, change } = case.status {
            out.push(warn(
                "not-converged",
                Some(drive),
                true,
                format!("{name}: pin-load friction did not settle in {iterations} iterations (last change {change:.2e}); the figures are not reliable"),
            ));
        }
        if case.audit_residual > 1e-6 {
            out.push(warn(
                "energy-audit",
                Some(drive),
                true,
                format!("{name}: the energy audit misses by {:.2e} of the drive power; please report this rig", case.audit_residual),
            ));
        }
    }
    if [&sub.ideal, &sub.forward, &sub.back]
        .iter()
        .any(|c| c.indeterminate)
    {
        // Name the load the lines share, not the drive.
        let shared = sub
            .load_part
            .map_or(drive.as_str(), |p| rig.parts[p].name.as_str());
        let by_stiffness = [&sub.ideal, &sub.forward, &sub.back]
            .iter()
            .all(|c| !c.indeterminate || c.split_by_stiffness);
        out.push(warn(
            "indeterminate",
            Some(shared),
            false,
            if by_stiffness {
                "statics alone does not fix how lines that share one block split its load; the split shown follows the stiffness of the ropes (their stretch must match as the block moves rigidly), so it holds only as far as the given stiffnesses and the drawn positions do".to_string()
            } else {
                "statics alone does not fix how lines that share one block split its load; the least-squares split is shown, but the real split depends on rope stretch and where the load sits (give every rope of these lines a `stiffness` to split it by stretch)".to_string()
            },
        ));
    }
    if sub.self_locking() && rig.runs_back {
        out.push(warn(
            "self-locking",
            Some(drive),
            false,
            "the rig is self-locking (it will not run back by itself), but the rig file says it must run back (`runs_back: true`)".to_string(),
        ));
    }
    // Remove duplicate messages from ideal/back repeats.
    out.dedup();
    out
}
