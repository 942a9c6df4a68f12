//! Runs that change one part's or one rope's friction, solved where the change reaches:
//! the sub-rigs holding the part or the rope's lines, not the whole rig.
//!
//! Friction changes no geometry, graph or motion, so the rig as written keeps its
//! [`Solution`] for everything but the sub-rigs the change reaches
//! ([`solve::solve_again`]); the others' answers, and their checks, are the rig's as
//! written. A run's verdict is read from `check`'s warnings in `check`'s order: the rig's
//! own (geometry, drum sides, plumb, pulls, bearings: none of them fails or names a
//! stalled sheave, and none depends on a tension that friction changes but a pull's
//! wording), then each sub-rig's, the reached ones checked again.
//!
//! A change is made on the model ([`crate::model::param`], or the part's friction
//! removed) where the model path gives the very rig the file path loads with the same
//! overrides; that is checked, compared whole, the first time each kind of change is
//! made, and a kind that does not match (and any other change) takes the file path.

use std::collections::HashMap;
use std::sync::Mutex;

use crate::checks::{self, Warning};
use crate::math::Real;
use crate::model::param::Resolved;
use crate::model::{Bearing, IdVec, PartId, PartKind, Rig, RopeId};
use crate::solve::statics::Layout;
use crate::solve::{self, given_quantity, Outcome, Solution, SolveOptions, SubRigSolution};

use super::{RigSource, StudyError, Verdict};

/// The part or rope a run changes the friction of.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Subject {
    /// One part (its bearing, its surface, a drum's shaft and drag).
    Part(PartId),
    /// One rope, wherever it runs.
    Rope(RopeId),
}

/// A change on the model: a name for its kind (each kind is checked once against the
/// file path) and the edit (None when the model cannot take it; then the file path).
pub struct Edit<'a> {
    /// The kind of change, e.g. `frictionless sheave` or `ropes mu`.
    pub kind: &'static str,
    /// Makes the change on a copy of the rig as written.
    pub apply: &'a dyn Fn(&mut Rig) -> Option<()>,
}

/// What one run gives: the main sub-rig's forward value and, when asked, `check`'s
/// verdict of the changed rig.
pub struct Outcomes {
    /// Forward value of the main sub-rig, SI.
    pub forward: Real,
    /// The verdict, when asked for.
    pub verdict: Option<Verdict>,
}

/// The rig as written, solved, and what the runs need of it.
pub struct Local<'a> {
    source: &'a RigSource,
    rig: &'a Rig,
    solution: &'a Solution,
    /// Of each part: its sub-rig's index in `solution.subrigs`.
    subrig_of_part: IdVec<PartId, Option<usize>>,
    /// Of each rope: the sub-rigs (indices in `solution.subrigs`) whose lines it makes.
    subrigs_of_rope: IdVec<RopeId, Vec<usize>>,
    /// `check`'s warnings of the rig before the sub-rigs' own.
    rig_warnings: Vec<Warning>,
    /// Each sub-rig's warnings.
    subrig_warnings: Vec<Vec<Warning>>,
    /// The sub-rigs with any warning, in order: a run's verdict reads these and the
    /// ones it solved again, not every sub-rig (which made a `rank` of many sub-rigs
    /// quadratic).
    warned: Vec<usize>,
    /// Each sub-rig's statics layout, shared by every run (friction and loads change
    /// none of it).
    layouts: Vec<Layout>,
    /// The rig as written, changed in place by a run and put back after it.
    work: Mutex<Rig>,
    /// Whether each kind of model change gives the file path's rig (absent: not yet
    /// checked).
    trusted: Mutex<HashMap<&'static str, bool>>,
    /// How many parts of the rig as written give a static coefficient.
    static_parts: usize,
}

impl<'a> Local<'a> {
    /// Sets up the runs on `rig` as `source` loads it, solved as `solution`. None when
    /// `check`'s warnings do not end with the sub-rigs' own in order (then every run
    /// takes the whole rig).
    pub fn new(source: &'a RigSource, rig: &'a Rig, solution: &'a Solution) -> Option<Local<'a>> {
        let network = &solution.network;
        let mut of_component = vec![None; network.components.len()];
        for (k, s) in solution.subrigs.iter().enumerate().rev() {
            of_component[s.component] = Some(k);
        }
        let subrig_of_part = rig
            .parts
            .ids()
            .map(|p| of_component[network.component_of[p]])
            .collect();
        let mut subrigs_of_rope: IdVec<RopeId, Vec<usize>> =
            IdVec::filled(Vec::new(), rig.ropes.len());
        for (l, line) in rig.lines.enumerate() {
            let owner =
                solve::kinematics::line_component(rig, network, l).and_then(|c| of_component[c]);
            if let Some(k) = owner {
                subrigs_of_rope[line.rope].push(k);
            }
        }
        for r in subrigs_of_rope.iter_mut() {
            r.sort_unstable();
            r.dedup();
        }
        let all = checks::run(rig, solution);
        let subrig_warnings: Vec<Vec<Warning>> = solution
            .subrigs
            .iter()
            .map(|s| checks::subrig_checks(rig, s))
            .collect();
        let tail: usize = subrig_warnings.iter().map(Vec::len).sum();
        let split = all.len().checked_sub(tail)?;
        let (own, rest) = all.split_at(split);
        if !rest.iter().eq(subrig_warnings.iter().flatten()) {
            return None;
        }
        Some(Local {
            source,
            rig,
            solution,
            subrig_of_part,
            subrigs_of_rope,
            rig_warnings: own.to_vec(),
            warned: (0..subrig_warnings.len())
                .filter(|&k| !subrig_warnings[k].is_empty())
                .collect(),
            subrig_warnings,
            layouts: (0..solution.subrigs.len())
                .map(|k| solve::layout_of(rig, solution, k))
                .collect(),
            work: Mutex::new(rig.clone()),
            trusted: Mutex::new(HashMap::new()),
            static_parts: rig
                .parts
                .ids()
                .filter(|&p| solve::static_friction_at(rig, p))
                .count(),
        })
    }

    fn trusted(&self) -> std::sync::MutexGuard<'_, HashMap<&'static str, bool>> {
        self.trusted.lock().unwrap_or_else(|e| e.into_inner())
    }

    /// The sub-rigs (indices in `solution.subrigs`) a change of `subject` reaches.
    fn reached(&self, subject: Subject) -> Vec<usize> {
        match subject {
            Subject::Part(p) => self.subrig_of_part[p].into_iter().collect(),
            Subject::Rope(r) => self.subrigs_of_rope[r].clone(),
        }
    }

    /// The run with `settings` (the same change as `edit`, as file overrides) on
    /// `subject`: the main forward value and, with `judge`, the verdict.
    ///
    /// # Errors
    /// [`StudyError`] as the whole rig's load and solve would give it.
    pub fn run(
        &self,
        subject: Subject,
        edit: Option<Edit>,
        settings: &[(String, String)],
        judge: bool,
    ) -> Result<Outcomes, StudyError> {
        let reached = self.reached(subject);
        if let Some(edit) = edit.filter(|e| self.trusted().get(e.kind) != Some(&false)) {
            let mut work = self.work.lock().unwrap_or_else(|e| e.into_inner());
            let applied = (edit.apply)(&mut work).is_some();
            let trusted = applied && self.check_kind(edit.kind, &work, settings);
            // Only the changed part can have gained or lost a static coefficient.
            let breakaway = match subject {
                Subject::Part(p) => {
                    self.static_parts - usize::from(solve::static_friction_at(self.rig, p))
                        + usize::from(solve::static_friction_at(&work, p))
                        > 0
                }
                Subject::Rope(_) => self.static_parts > 0,
            };
            let answer = trusted.then(|| self.outcomes(&work, &reached, breakaway, judge));
            // Put the rig back as written.
            match subject {
                Subject::Part(p) => work.parts[p] = self.rig.parts[p].clone(),
                Subject::Rope(r) => work.ropes[r] = self.rig.ropes[r].clone(),
            }
            if let Some(answer) = answer {
                return answer;
            }
        }
        let rig = self.source.load(settings)?;
        self.outcomes(&rig, &reached, solve::has_static_friction(&rig), judge)
    }

    /// Whether the model change of `kind` gives the file path's rig: checked once.
    fn check_kind(&self, kind: &'static str, changed: &Rig, settings: &[(String, String)]) -> bool {
        if let Some(&known) = self.trusted().get(kind) {
            return known;
        }
        let same = self
            .source
            .load(settings)
            .is_ok_and(|slow| format!("{slow:?}") == format!("{changed:?}"));
        self.trusted().insert(kind, same);
        same
    }

    fn outcomes(
        &self,
        rig: &Rig,
        reached: &[usize],
        breakaway: bool,
        judge: bool,
    ) -> Result<Outcomes, StudyError> {
        let options = SolveOptions::default();
        // In the solution's order, so the first error is the one the whole solve meets.
        let again: Vec<(usize, SubRigSolution)> = reached
            .iter()
            .map(|&k| {
                solve::solve_again_on(
                    rig,
                    self.solution,
                    k,
                    breakaway,
                    &options,
                    Some(&self.layouts[k]),
                )
                .map(|s| (k, s))
                .map_err(|e| self.source.solve_error(rig, e))
            })
            .collect::<Result<_, _>>()?;
        let sub = |k: usize| {
            again
                .iter()
                .find(|(j, _)| *j == k)
                .map_or(&self.solution.subrigs[k], |(_, s)| s)
        };
        let main = sub(0);
        let forward = crate::report::finite(main.forward.value)
            .ok_or_else(|| StudyError::Input("the forward value is not finite".to_string()))?;
        let verdict = judge.then(|| {
            let available = given_quantity(rig, main.solve_for);
            let mut checked: Vec<(usize, Vec<Warning>)> = again
                .iter()
                .map(|(k, s)| (*k, checks::subrig_checks(rig, s)))
                .collect();
            checked.sort_by_key(|(k, _)| *k);
            let warnings = self
                .rig_warnings
                .iter()
                .chain(self.in_order(&checked).into_iter().flatten());
            Verdict::from_warnings(
                available.and_then(|a| main.margin(a)),
                available.map(|a| main.outcome(a)).map(Outcome::succeeds),
                warnings,
            )
        });
        Ok(Outcomes { forward, verdict })
    }
}

impl Local<'_> {
    /// Each sub-rig's warnings in the solution's order, `again` (sorted by sub-rig)
    /// standing for the sub-rigs it holds, leaving out the sub-rigs without any: the
    /// verdict reads the sub-rigs with a warning as written and the ones solved again,
    /// not every sub-rig (which made a `rank` of many sub-rigs quadratic).
    fn in_order<'s>(&'s self, again: &'s [(usize, Vec<Warning>)]) -> Vec<&'s [Warning]> {
        let mut out = Vec::with_capacity(self.warned.len() + again.len());
        let mut warned = self.warned.iter().copied().peekable();
        let mut again = again.iter().peekable();
        loop {
            match (warned.peek().copied(), again.peek().map(|(k, _)| *k)) {
                (Some(k), Some(j)) if j <= k => {
                    out.extend(again.next().map(|(_, w)| w.as_slice()));
                    if j == k {
                        warned.next();
                    }
                }
                (Some(k), _) => {
                    out.push(self.subrig_warnings[k].as_slice());
                    warned.next();
                }
                (None, Some(_)) => out.extend(again.next().map(|(_, w)| w.as_slice())),
                (None, None) => return out,
            }
        }
    }

    /// Every sub-rig of `rig` solved again, `rig` being the rig as written with other
    /// coefficients of friction or loads (a sample of a spread: no part moves), and
    /// `check`'s verdict of it.
    ///
    /// # Errors
    /// [`StudyError::Solve`] as the whole rig's solve would give it.
    pub fn solve_all(&self, rig: &Rig) -> Result<(Vec<SubRigSolution>, Verdict), StudyError> {
        self.solve_all_on(rig, &self.layouts)
    }

    /// A copy of every sub-rig's statics layout for one thread of runs
    /// ([`Local::solve_all_on`]): threads that share none write to no common memory.
    pub fn layouts(&self) -> Vec<Layout> {
        self.layouts.clone()
    }

    /// [`Local::solve_all`] on the sub-rigs' layouts `layouts` (from [`Local::layouts`]).
    ///
    /// # Errors
    /// As [`Local::solve_all`].
    pub fn solve_all_on(
        &self,
        rig: &Rig,
        layouts: &[Layout],
    ) -> Result<(Vec<SubRigSolution>, Verdict), StudyError> {
        let options = SolveOptions::default();
        let breakaway = solve::has_static_friction(rig);
        let subs: Vec<SubRigSolution> = (0..self.solution.subrigs.len())
            .map(|k| {
                solve::solve_again_on(
                    rig,
                    self.solution,
                    k,
                    breakaway,
                    &options,
                    Some(&layouts[k]),
                )
                .map_err(|e| self.source.solve_error(rig, e))
            })
            .collect::<Result<_, _>>()?;
        let main = &subs[0];
        let available = given_quantity(rig, main.solve_for);
        let checked: Vec<Vec<Warning>> =
            subs.iter().map(|s| checks::subrig_checks(rig, s)).collect();
        let verdict = Verdict::from_warnings(
            available.and_then(|a| main.margin(a)),
            available.map(|a| main.outcome(a)).map(Outcome::succeeds),
            self.rig_warnings.iter().chain(checked.iter().flatten()),
        );
        Ok((subs, verdict))
    }
}

/// The model change that makes `part` frictionless, as
/// [`super::rank::frictionless_settings`] writes it to the file.
pub fn frictionless(rig: &mut Rig, part: PartId) -> Option<()> {
    match &mut rig.parts.get_mut(part)?.kind {
        PartKind::Sheave(s) => s.bearing = Bearing::None,
        PartKind::Guide(g) => g.mu = Some(0.0),
        PartKind::Drum(d) => {
            d.shaft = None;
            d.drag = 0.0;
        }
        _ => return None,
    }
    Some(())
}

/// The kind of the frictionless change of `part`, for [`Edit::kind`].
pub fn frictionless_kind(rig: &Rig, part: PartId) -> &'static str {
    match &rig.parts[part].kind {
        PartKind::Sheave(_) => "frictionless sheave",
        PartKind::Guide(_) => "frictionless guide",
        _ => "frictionless drum",
    }
}

/// The model change that sets `key` (a bare number) to `value`, if the model has it
/// (`source` resolves the key), and its kind.
pub fn set_key(
    source: &RigSource,
    rig: &Rig,
    key: &str,
    value: Real,
) -> Option<(&'static str, impl Fn(&mut Rig) -> Option<()>)> {
    set_resolved(rig, &source.resolve(rig, key, "")?, value)
}

/// [`set_key`] of a key already resolved against `rig` (by
/// [`RigSource::resolve_in`], which finds a part without scanning them all).
pub fn set_resolved(
    rig: &Rig,
    resolved: &Resolved,
    value: Real,
) -> Option<(&'static str, impl Fn(&mut Rig) -> Option<()>)> {
    let si = resolved.si(rig, value)?;
    let kind = match resolved.param {
        crate::model::param::Param::RatedFactor(_) => "bearing factor",
        crate::model::param::Param::BearingMu(_) => "bearing mu",
        crate::model::param::Param::RopeMu(_) => "rope mu",
        crate::model::param::Param::LoadMass(_) => "load mass",
        crate::model::param::Param::LoadForce(_) => "load force",
    };
    let param = resolved.param;
    Some((kind, move |rig: &mut Rig| param.set(rig, si)))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::study::Verdict;

    /// Guards the local runs against the whole rig: each part of a rig of two
    /// sub-rigs made frictionless, and a rope's and a bearing's coefficient changed,
    /// give the forward value and verdict that loading the file with the same overrides
    /// and solving and checking the whole rig give, to the bit.
    #[test]
    fn local_runs_are_the_whole_rigs_runs() {
        local_runs_match(&[
            "tests/rigs/review/two-subrigs.yaml",
            "tests/rigs/review/load-unknown-capstan.yaml",
        ]);
    }

    /// The same guard on rigs whose ropes have stiffness, weight and a bend loss and
    /// whose sheaves have thrust faces (main's rope as a material and 3-D pin loads):
    /// a sub-rig solved again builds its rope weight, split by stiffness and spring
    /// rate from the changed rig, and gives the whole solve's figures to the bit.
    #[test]
    fn local_runs_with_rope_material_and_bend_loss_are_the_whole_rigs_runs() {
        let files = [
            "rigs/line-set.yaml",
            "rigs/gallery-panel.yaml",
            "rigs/cliff-raise.yaml",
            "rigs/ramp-winch.yaml",
            "tests/rigs/material/two-lift-lines.yaml",
            "tests/rigs/material/head-sheave-weight.yaml",
        ];
        local_runs_match(&files);
        for file in files {
            let text = std::fs::read_to_string(file).expect("example rig");
            let source = RigSource::from_text(&text, file, &[]);
            let (rig, solution) = source.solve(&[]).unwrap();
            for k in 0..solution.subrigs.len() {
                let breakaway = solve::has_static_friction(&rig);
                let again =
                    solve::solve_again(&rig, &solution, k, breakaway, &SolveOptions::default())
                        .unwrap();
                let whole = &solution.subrigs[k];
                let bits = |x: Option<Real>| x.map(Real::to_bits);
                assert_eq!(bits(again.drive_stiffness), bits(whole.drive_stiffness));
                assert_eq!(bits(again.lost_travel), bits(whole.lost_travel));
                for (a, b) in [
                    (&again.ideal, &whole.ideal),
                    (&again.forward, &whole.forward),
                    (&again.back, &whole.back),
                ] {
                    assert_eq!(a.value.to_bits(), b.value.to_bits(), "{file} {k}");
                    assert_eq!(a.tension_end, b.tension_end, "{file} {k}");
                    assert_eq!(a.losses, b.losses, "{file} {k}");
                    assert_eq!(a.split_by_stiffness, b.split_by_stiffness, "{file} {k}");
                }
            }
        }
    }

    /// Guards the verdict read from the sub-rigs with warnings and the ones solved
    /// again (not every sub-rig): four tackles, the second and fourth with a sheave
    /// that stalls (the fourth then cannot move: a failing check), so a run reaches a
    /// sub-rig before, between, after or at the warned ones.
    #[test]
    fn local_verdicts_keep_the_other_sub_rigs_warnings_in_order() {
        let tackle = |i: usize, lower_mu: &str, upper_mu: &str| {
            let y = 500 * i;
            format!(
                "  t{i}.hook: {{kind: block, at: [0, {y}, 0], load: {{mass: 500}}}}\n  \
                 t{i}.dead: {{kind: anchor, at: [-50, {y}, 3000]}}\n  \
                 t{i}.lower: {{kind: sheave, block: t{i}.hook, at: [0, {y}, 0], axle: [0, 1, 0], \
                 diameter: 92, bearing: {{kind: plain, {lower_mu}}}}}\n  \
                 t{i}.upper: {{kind: sheave, at: [100, {y}, 3000], axle: [0, 1, 0], \
                 diameter: 92, bearing: {{kind: plain, {upper_mu}}}}}\n  \
                 t{i}.hand: {{kind: haul, at: [150, {y}, -500], force: 3000}}\n"
            )
        };
        let (plain, stiff) = ("pin_diameter: 10, mu: 0.1", "pin_diameter: 80, mu: 0.9");
        let mut text = "format: 1\nropes:\n  w: {diameter: 8, mu: 0.12}\nparts:\n".to_string();
        text += &tackle(0, plain, plain);
        text += &tackle(1, stiff, plain);
        text += &tackle(2, plain, plain);
        text += &tackle(3, plain, stiff);
        text += "lines:\n";
        for i in 0..4 {
            text += &format!(
                "  t{i}.fall: {{rope: w, path: [t{i}.dead, {{part: t{i}.lower, side: right}}, \
                 {{part: t{i}.upper, side: left}}, t{i}.hand]}}\n"
            );
        }
        text += "drive: t0.hand\n";
        let source = RigSource::from_text(&text, "tackles.yaml", &[]);
        let (rig, solution) = source.solve(&[]).unwrap();
        let verdict = Verdict::assess(&rig, &solution);
        assert_eq!(verdict.failing, ["cannot-move"]);
        assert_eq!(verdict.stalled, ["t1.lower", "t3.upper"]);
        local_runs_match_on("tackles.yaml", &text);
    }

    fn local_runs_match(files: &[&str]) {
        for &path in files {
            let file = path.rsplit('/').next().unwrap_or(path);
            let text = std::fs::read_to_string(path).expect("test rig");
            local_runs_match_on(file, &text);
        }
    }

    fn local_runs_match_on(file: &str, text: &str) {
        {
            let source = RigSource::from_text(text, file, &[]);
            let (rig, solution) = source.solve(&[]).unwrap();
            let local = Local::new(&source, &rig, &solution).expect("check's order splits");
            let whole = |settings: &[(String, String)]| {
                let (r, s) = source.solve(settings).unwrap();
                (s.main().forward.value, Verdict::assess(&r, &s))
            };
            for part in rig.parts.ids() {
                let Some(settings) = super::super::rank::frictionless_settings(&rig, part) else {
                    continue;
                };
                let apply = |r: &mut Rig| frictionless(r, part);
                let edit = Edit {
                    kind: frictionless_kind(&rig, part),
                    apply: &apply,
                };
                let o = local
                    .run(Subject::Part(part), Some(edit), &settings, true)
                    .unwrap();
                let (forward, verdict) = whole(&settings);
                assert_eq!(o.forward.to_bits(), forward.to_bits(), "{file} {part:?}");
                assert_eq!(o.verdict, Some(verdict), "{file} {part:?}");
            }
            for (r, rope) in rig.ropes.enumerate() {
                let key = format!("ropes.{}.mu", rope.name);
                let settings = [(key.clone(), "0.3".to_string())];
                let (kind, apply) = set_key(&source, &rig, &key, 0.3).unwrap();
                let edit = Edit {
                    kind,
                    apply: &apply,
                };
                let o = local
                    .run(Subject::Rope(r), Some(edit), &settings, true)
                    .unwrap();
                let (forward, verdict) = whole(&settings);
                assert_eq!(o.forward.to_bits(), forward.to_bits(), "{file} {key}");
                assert_eq!(o.verdict, Some(verdict), "{file} {key}");
            }
        }
    }
}
