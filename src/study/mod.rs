//! Design studies over the solver as it is: compare rigs or named variants side by side
//! ([`compare`]), sweep one value or move the drive through its stroke ([`sweep`]), rank
//! bearing upgrades and friction sensitivities ([`rank`]), and spread uncertain inputs
//! by Monte Carlo ([`spread`]).
//!
//! Every study works on a [`RigSource`]: the rig file, behind the model's [`RigFile`]
//! (implemented by `rig::RigText`, so that no study imports the file layer), and the
//! `--set` overrides every run applies. A study changes a rig only through more
//! overrides on the parsed tree (so a changed value gets the loader's checks), by
//! setting model values where that gives the very rig the overrides give
//! ([`ModelSampler`], [`local`]), or, for the stroke, by moving the resolved parts; none
//! has physics of its own. A change of friction or load moves no part, so such a run
//! keeps the rig's geometry and motion and solves only the sub-rigs it reaches
//! ([`local`]). Results are plain structs that
//! serialize to JSON with units in the keys; [`crate::report::study`] writes them out
//! as text, Markdown, CSV or JSON, and [`crate::report::chart`] draws their charts.
//!
//! Every solved run is also judged as `check` judges it ([`Verdict`], through
//! `checks::run` and `Report::fails`), so a study shows each run's margin and failing
//! checks and fails (exit 1) where `check` would fail any of its rigs.

pub mod compare;
pub mod local;
pub mod rank;
pub mod rng;
pub mod spread;
pub mod sweep;

/// Told how far a long study has got (the trait lives in [`crate::progress`], which the
/// solver's motion shares).
pub use crate::progress::Progress;

use std::sync::Arc;

use serde::Serialize;

use crate::checks;
use crate::math::Real;
use crate::model::param::{Names, Resolved};
use crate::model::vary::{Uncertain, Variant};
use crate::model::{LoadError, Rig, RigFile};
use crate::report::{Asked, Report};
use crate::solve::{self, Solution, SolveError, SolveOptions};

/// Why a study cannot run (exit 2).
#[derive(Debug, Clone, thiserror::Error)]
pub enum StudyError {
    /// The rig file (with its overrides) does not load.
    #[error(transparent)]
    Load(#[from] LoadError),
    /// The rig loads but cannot be solved; the solve error is the `source()`.
    #[error("{source_name}")]
    Solve {
        /// The rig file, with the line, column and part or key where the error can be
        /// located (`rig.yaml:6:3: parts.h`), as `check` words it.
        source_name: String,
        /// Why.
        #[source]
        error: SolveError,
    },
    /// A study setting is wrong (message says what was expected).
    #[error("{0}")]
    Input(String),
}

impl StudyError {
    /// The message with its causes, `context: cause`, for a table note or a step that
    /// could not be solved (the command line prints the same chain).
    pub fn chain(&self) -> String {
        crate::text::error_chain(self)
    }
}

/// A rig file with the overrides every run of a study applies.
#[derive(Debug, Clone)]
pub struct RigSource {
    /// Its name in messages (the path as given).
    pub source: String,
    /// `KEY=VALUE` overrides applied before a study's own.
    pub overrides: Vec<(String, String)>,
    /// The file, loaded again for every run (parsed once: `rig::RigText`).
    file: Arc<dyn RigFile>,
}

impl RigSource {
    /// The rig `file` with the base `overrides` (`--set`) of every run.
    pub fn new(file: impl RigFile + 'static, overrides: &[(String, String)]) -> RigSource {
        RigSource {
            source: file.name().to_string(),
            overrides: overrides.to_vec(),
            file: Arc::new(file),
        }
    }

    /// Rig text held in memory, for the unit tests (the library's callers build a
    /// `rig::RigText` and give it to [`RigSource::new`]).
    #[cfg(test)]
    pub(crate) fn from_text(text: &str, source: &str, overrides: &[(String, String)]) -> Self {
        RigSource::new(crate::rig::RigText::from_text(text, source), overrides)
    }

    /// Loads the rig with the base overrides and then `extra`.
    ///
    /// # Errors
    /// [`StudyError::Load`] naming every problem.
    pub fn load(&self, extra: &[(String, String)]) -> Result<Rig, StudyError> {
        let mut all = self.overrides.clone();
        all.extend_from_slice(extra);
        Ok(self.file.load(&all)?)
    }

    /// Loads and solves with `extra` overrides.
    ///
    /// # Errors
    /// [`StudyError`] when the rig does not load or solve.
    pub fn solve(&self, extra: &[(String, String)]) -> Result<(Rig, Solution), StudyError> {
        let rig = self.load(extra)?;
        let solution = self.solve_rig(&rig)?;
        Ok((rig, solution))
    }

    /// Solves an already loaded (possibly moved) rig, naming this source in errors.
    ///
    /// # Errors
    /// [`StudyError::Solve`].
    pub fn solve_rig(&self, rig: &Rig) -> Result<Solution, StudyError> {
        solve::solve(rig, &SolveOptions::default()).map_err(|error| self.solve_error(rig, error))
    }

    /// A solve error of `rig`, located in this source as `check` words it.
    pub fn solve_error(&self, rig: &Rig, error: SolveError) -> StudyError {
        let source_name = match error.location(rig) {
            Some((l, subject)) if l.line > 0 => {
                format!("{}:{}:{}: {subject}", self.source, l.line, l.column)
            }
            _ => self.source.clone(),
        };
        StudyError::Solve { source_name, error }
    }

    /// Whether the mapping at `path` (exact key names, e.g. `["parts", "hook.a",
    /// "bearing"]`) holds `key` in the file as written with the base overrides: which
    /// of two spellings of one value (`factor` or `efficiency`) the file uses.
    pub fn has_key(&self, path: &[&str], key: &str) -> bool {
        self.file.has_key(&self.overrides, path, key)
    }

    /// The file's named variants, after the base overrides (`--set variants.NAME=...`
    /// changes one, `--set variants=~` removes them all), as [`RigSource::ranges`] reads
    /// the ranges.
    ///
    /// # Errors
    /// [`StudyError::Load`] when `variants` is malformed or an override does not apply.
    pub fn variants(&self) -> Result<Vec<Variant>, StudyError> {
        Ok(self.file.variants(&self.overrides)?)
    }

    /// The file's ranged values (after the base overrides).
    ///
    /// # Errors
    /// [`StudyError::Load`] when a range is malformed.
    pub fn ranges(&self) -> Result<Vec<Uncertain>, StudyError> {
        Ok(self.file.ranges(&self.overrides)?)
    }

    /// The model value that the file key `key` (written with `unit`, empty for a bare
    /// number) sets on `rig`, a rig this source loaded ([`RigFile::resolve`]).
    pub fn resolve(&self, rig: &Rig, key: &str, unit: &str) -> Option<Resolved> {
        self.file.resolve(rig, key, unit)
    }

    /// [`RigSource::resolve`] against the rig `names` index ([`RigFile::resolve_in`]).
    pub fn resolve_in(&self, names: &Names, key: &str, unit: &str) -> Option<Resolved> {
        self.file.resolve_in(names, key, unit)
    }
}

/// A loaded rig with a study's ranged keys resolved to model parameters
/// ([`crate::model::param`]): a sample is the rig with its drawn values set, not a new
/// read of the file. Every such parameter is a coefficient of friction or a load:
/// none moves a part, so a sample keeps the rig's geometry and motion
/// ([`local::Local::solve_all`]).
#[derive(Debug, Clone)]
pub struct ModelSampler {
    base: Rig,
    params: Vec<Resolved>,
}

impl ModelSampler {
    /// The rig with `values` (in the written units, one per ranged key) set; None when
    /// one does not convert or fails its check (the caller takes the file path).
    pub fn rig(&self, values: &[Real]) -> Option<Rig> {
        let mut rig = self.base.clone();
        self.set(&mut rig, values)?;
        Some(rig)
    }

    /// [`ModelSampler::rig`] written into `rig`, a rig this sampler made (every ranged
    /// value is set again, so one rig serves every sample of a thread). None, and `rig`
    /// possibly changed, as there.
    pub fn set(&self, rig: &mut Rig, values: &[Real]) -> Option<()> {
        for (p, &v) in self.params.iter().zip(values) {
            p.param.set(rig, p.si(&self.base, v)?)?;
        }
        Some(())
    }
}

impl RigSource {
    /// The model path for `keys` (each a file key with the unit its values are written
    /// in, empty for bare numbers) on the loaded `rig`, when every key is a model
    /// parameter and, for the values `probe`, the rig it gives is the very rig the file
    /// path loads with those values as overrides (compared whole); None otherwise.
    pub fn sampler(
        &self,
        rig: &Rig,
        keys: &[(String, String)],
        probe: &[Real],
    ) -> Option<ModelSampler> {
        let params = keys
            .iter()
            .map(|(key, unit)| self.resolve(rig, key, unit))
            .collect::<Option<Vec<_>>>()?;
        let sampler = ModelSampler {
            base: rig.clone(),
            params,
        };
        let fast = sampler.rig(probe)?;
        let settings: Vec<_> = keys
            .iter()
            .zip(probe)
            .map(|((key, unit), &v)| (key.clone(), with_unit(v, unit)))
            .collect();
        let slow = self.load(&settings).ok()?;
        (format!("{fast:?}") == format!("{slow:?}")).then_some(sampler)
    }

    /// Solves with the values of `keys` set: on the model when `model` takes them,
    /// else through the file with the same values as overrides.
    ///
    /// # Errors
    /// [`StudyError`] when the rig does not load or solve.
    pub fn solve_values(
        &self,
        model: Option<&ModelSampler>,
        keys: &[(String, String)],
        values: &[Real],
    ) -> Result<(Rig, Solution), StudyError> {
        if let Some(rig) = model.and_then(|m| m.rig(values)) {
            let solution = self.solve_rig(&rig)?;
            return Ok((rig, solution));
        }
        let settings: Vec<_> = keys
            .iter()
            .zip(values)
            .map(|((key, unit), &v)| (key.clone(), with_unit(v, unit)))
            .collect();
        self.solve(&settings)
    }
}

/// What `check` concludes about one solved rig, read through [`checks::run`] and
/// [`Report`]: the margin, whether the drive moves the rig, the checks that fail (a
/// study exits 1 when any run fails one, as `check` does), and the sheaves that stall.
#[derive(Debug, Clone, Default, Serialize, PartialEq)]
pub struct Verdict {
    /// Relative margin of the asked quantity over its given value (the report's
    /// `margin`), where one is given.
    pub margin: Option<Real>,
    /// Whether the drive moves the rig (None when nothing is given to compare).
    pub moves: Option<bool>,
    /// Whether a check fails (`check` would exit 1).
    pub fails: bool,
    /// Codes of the failing checks, each once, in the order `check` lists them.
    pub failing: Vec<&'static str>,
    /// Sheaves that stall (do not turn; the rope slides over them) forward or back:
    /// past a stall the values stop following that sheave's bearing.
    pub stalled: Vec<String>,
}

impl Verdict {
    /// The verdict of a built report.
    pub fn of(report: &Report) -> Verdict {
        Verdict::from_warnings(
            report.headline.margin,
            report.headline.moves,
            &report.warnings,
        )
    }

    /// The verdict from the main sub-rig's margin and whether it moves, and the
    /// warnings in the order `check` lists them (what [`Verdict::of`] reads of a
    /// report).
    pub fn from_warnings<'a>(
        margin: Option<Real>,
        moves: Option<bool>,
        warnings: impl IntoIterator<Item = &'a checks::Warning>,
    ) -> Verdict {
        let mut failing = Vec::new();
        let mut stalled = Vec::new();
        let mut fails = false;
        for w in warnings {
            fails |= w.fails;
            if w.fails && !failing.contains(&w.code) {
                failing.push(w.code);
            }
            if w.code == STALLED {
                if let Some(p) = w.part.as_ref().filter(|p| !stalled.contains(*p)) {
                    stalled.push(p.clone());
                }
            }
        }
        Verdict {
            margin,
            moves,
            fails,
            failing,
            stalled,
        }
    }

    /// The verdict of a solved rig (runs the checks).
    pub fn assess(rig: &Rig, solution: &Solution) -> Verdict {
        Verdict::of(&assess(rig, solution))
    }
}

/// The code of the stalled-sheave warning.
const STALLED: &str = "stalled-sheave";

/// The report of a solved rig with its checks, as `check` builds it.
pub fn assess(rig: &Rig, solution: &Solution) -> Report {
    Report::build(rig, solution, checks::run(rig, solution))
}

/// The headline figures of one solved rig, as compared and swept. SI units.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Figures {
    /// Column label (file name or variant name).
    pub label: String,
    /// The asked quantity.
    pub solve_for: Asked,
    /// Ideal value.
    pub ideal: Option<Real>,
    /// Forward value.
    pub forward: Option<Real>,
    /// Back value.
    pub back: Option<Real>,
    /// Forward efficiency (0 to 1).
    pub efficiency: Option<Real>,
    /// Back efficiency.
    pub back_efficiency: Option<Real>,
    /// The friction at the drive going forward, in the asked unit (the report's
    /// `friction_forward`).
    pub friction_forward: Option<Real>,
    /// The friction at the drive running back (the report's `friction_back`).
    pub friction_back: Option<Real>,
    /// Holding band [low, high].
    pub holding_band: [Option<Real>; 2],
    /// Whether the rig will not run back by itself.
    pub self_locking: bool,
    /// Largest span tension over the forward and back cases, N.
    pub largest_tension_n: Option<Real>,
    /// Lowest span safety factor.
    pub lowest_safety_factor: Option<Real>,
    /// Largest fleet angle, degrees.
    pub largest_fleet_deg: Option<Real>,
    /// Smallest tread-to-rope diameter ratio.
    pub smallest_bend_ratio: Option<Real>,
    /// Number of warnings from the checks.
    pub warnings: usize,
    /// What `check` concludes (margin, moves, failing checks, stalled sheaves).
    #[serde(flatten)]
    pub verdict: Verdict,
}

fn fold_max(values: impl Iterator<Item = Real>) -> Option<Real> {
    values
        .filter(|v| v.is_finite())
        .fold(None, |a: Option<Real>, x| Some(a.map_or(x, |a| a.max(x))))
}

fn fold_min(values: impl Iterator<Item = Real>) -> Option<Real> {
    values
        .filter(|v| v.is_finite())
        .fold(None, |a: Option<Real>, x| Some(a.map_or(x, |a| a.min(x))))
}

/// Largest tension of any span of the rig over the forward and back cases, N.
pub fn largest_tension(solution: &Solution) -> Option<Real> {
    largest_tension_of(&solution.subrigs)
}

/// [`largest_tension`] over the sub-rigs' answers `subrigs`.
pub fn largest_tension_of(subrigs: &[solve::SubRigSolution]) -> Option<Real> {
    fold_max(subrigs.iter().flat_map(|s| {
        [&s.forward, &s.back]
            .into_iter()
            // Both ends of every span: with rope weight the higher end is the tighter.
            .flat_map(|c| {
                c.tension
                    .entries()
                    .chain(c.tension_end.entries())
                    .flat_map(|(_, t)| t)
                    .copied()
            })
    }))
}

/// Largest fleet angle at any passage, degrees.
pub fn largest_fleet_deg(solution: &Solution) -> Option<Real> {
    fold_max(
        solution
            .geometry
            .lines
            .iter()
            .flat_map(|l| l.entries.iter())
            .flat_map(|e| e.fleet_in.into_iter().chain(e.fleet_out))
            .map(Real::to_degrees),
    )
}

/// The figures of a solved rig (runs the checks for the warning count and verdict).
pub fn figures(label: &str, rig: &Rig, solution: &Solution) -> Figures {
    let report = assess(rig, solution);
    let main = solution.main();
    let h = &report.headline;
    Figures {
        label: label.to_string(),
        solve_for: Asked::of(rig, main),
        ideal: h.ideal.value,
        forward: h.forward.value,
        back: h.back.value,
        efficiency: h.forward.efficiency,
        back_efficiency: h.back.efficiency,
        friction_forward: h.friction_forward,
        friction_back: h.friction_back,
        holding_band: h.holding_band,
        self_locking: h.self_locking,
        largest_tension_n: largest_tension(solution),
        lowest_safety_factor: fold_min(report.spans.iter().filter_map(|s| s.safety_factor)),
        largest_fleet_deg: fold_max(report.parts.iter().filter_map(|p| p.fleet_deg)),
        smallest_bend_ratio: fold_min(report.parts.iter().filter_map(|p| p.bend_ratio)),
        warnings: report.warnings.len(),
        verdict: Verdict::of(&report),
    }
}

/// Splits `"60 kg"` into 60 and `kg`, `"0.2"` into 0.2 and an empty unit.
pub fn number_and_unit(text: &str) -> Option<(Real, String)> {
    let text = text.trim();
    let split = text
        .char_indices()
        .find(|&(i, c)| {
            !(c.is_ascii_digit()
                || c == '.'
                || ((c == '+' || c == '-') && (i == 0 || text[..i].ends_with(['e', 'E'])))
                || ((c == 'e' || c == 'E')
                    && text[i + 1..]
                        .starts_with(|d: char| d.is_ascii_digit() || d == '-' || d == '+')))
        })
        .map_or(text.len(), |(i, _)| i);
    let (number, unit) = text.split_at(split);
    let v: Real = number.trim().parse().ok()?;
    v.is_finite().then(|| (v, unit.trim().to_string()))
}

/// An override value: the number with its unit, if any.
pub fn with_unit(value: Real, unit: &str) -> String {
    if unit.is_empty() {
        format!("{value}")
    } else {
        format!("{value} {unit}")
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_and_units_split() {
        assert_eq!(number_and_unit("60 kg"), Some((60.0, "kg".to_string())));
        assert_eq!(number_and_unit("0.2"), Some((0.2, String::new())));
        assert_eq!(number_and_unit("1e-3"), Some((1e-3, String::new())));
        assert_eq!(number_and_unit("-2.5in"), Some((-2.5, "in".to_string())));
        assert_eq!(number_and_unit("2.5 N*m"), Some((2.5, "N*m".to_string())));
        assert_eq!(number_and_unit("kg"), None);
    }
}
