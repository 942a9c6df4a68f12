//! `spread`: Monte Carlo over every value the rig file gives as a range
//! (`{min, max}` uniform, `{mean, sd}` normal truncated at zero). Each sample draws all
//! of them together, sets them on the resolved model where every ranged key is a model
//! value (keeping the rig's geometry and motion, [`super::local`]) or else applies them
//! as overrides on the parsed tree, and solves; the solver is untouched. Sample `i` always uses random stream `i` of the seed
//! ([`Rng::stream`]), so the numbers do not depend on the number of threads.

use std::collections::BTreeMap;

use serde::Serialize;

use crate::math::Real;
use crate::model::vary::{Distribution, Uncertain};
use crate::report::Asked;
use crate::report::{finite, CAUTION};
use crate::units::UnitSystem;

use super::local::Local;
use super::rng::Rng;
use super::{
    assess, largest_tension, largest_tension_of, ModelSampler, Progress, RigSource, StudyError,
    Verdict,
};
use crate::report::text::not_moving_words;
use crate::solve::statics::Layout;

/// How many samples a thread solves between two reports to the progress bar.
const PROGRESS_BATCH: usize = 64;

/// Draws one value of a distribution.
pub fn draw(d: &Distribution, rng: &mut Rng) -> Real {
    match *d {
        Distribution::Uniform { min, max } => min + (max - min) * rng.uniform(),
        Distribution::Normal { mean, sd } => {
            if sd == 0.0 {
                return mean.max(0.0);
            }
            // Truncated at zero by rejection; a mean far below zero falls back to 0.
            for _ in 0..1000 {
                let v = mean + sd * rng.normal();
                if v >= 0.0 {
                    return v;
                }
            }
            0.0
        }
    }
}

/// The outcome of one sample.
#[derive(Debug, Clone, PartialEq)]
pub struct Sample {
    /// Forward value.
    pub forward: Real,
    /// Back value.
    pub back: Real,
    /// Largest span tension, N.
    pub largest_tension: Real,
    /// What `check` concludes about the sample.
    pub verdict: Verdict,
}

/// The drawn values of sample `i`, one per uncertain value, in the written unit.
pub fn draws_of(ranges: &[Uncertain], seed: u64, i: u64) -> Vec<Real> {
    let mut values = Vec::with_capacity(ranges.len());
    draw_into(&mut values, ranges, seed, i);
    values
}

/// The ranged keys with their written units.
pub fn keys_of(ranges: &[Uncertain]) -> Vec<(String, String)> {
    ranges
        .iter()
        .map(|u| (u.key.clone(), u.unit.clone()))
        .collect()
}

/// The draws of sample `i`: one override per uncertain value.
pub fn settings_of(ranges: &[Uncertain], seed: u64, i: u64) -> Vec<(String, String)> {
    ranges
        .iter()
        .zip(draws_of(ranges, seed, i))
        .map(|(u, v)| u.setting(v))
        .collect()
}

/// Solves sample `i`; None when that rig cannot be solved.
pub fn run_sample(source: &RigSource, ranges: &[Uncertain], seed: u64, i: u64) -> Option<Sample> {
    run_sample_on(source, None, None, &mut Worker::default(), ranges, seed, i)
}

/// What one thread keeps from sample to sample, so that a sample on the model path
/// allocates nothing it does not return.
#[derive(Default)]
struct Worker {
    /// The thread's rig for the model path (made on first use, and again after a draw
    /// the model refuses).
    work: Option<crate::model::Rig>,
    /// The thread's own copy of the sub-rigs' statics layouts ([`Local::layouts`]).
    layouts: Vec<Layout>,
    /// The draws of the sample.
    values: Vec<Real>,
}

/// Draws sample `i` into `values` (as [`draws_of`]).
fn draw_into(values: &mut Vec<Real>, ranges: &[Uncertain], seed: u64, i: u64) {
    let mut rng = Rng::stream(seed, i);
    values.clear();
    values.extend(ranges.iter().map(|u| draw(&u.distribution, &mut rng)));
}

/// Solves sample `i`, on the resolved model when `model` gives every ranged key as a
/// model parameter and the drawn values pass their checks, else on the file.
fn run_sample_on(
    source: &RigSource,
    model: Option<&ModelSampler>,
    local: Option<&Local>,
    worker: &mut Worker,
    ranges: &[Uncertain],
    seed: u64,
    i: u64,
) -> Option<Sample> {
    draw_into(&mut worker.values, ranges, seed, i);
    let values = &worker.values;
    // On the model, the rig's geometry and motion kept: only the statics and the
    // sub-rigs' checks run again.
    if let (Some(model), Some(local)) = (model, local) {
        let rig = match worker.work.take() {
            Some(mut rig) => model.set(&mut rig, values).map(|()| rig),
            None => model.rig(values),
        };
        if let Some(rig) = rig {
            if worker.layouts.is_empty() {
                worker.layouts = local.layouts();
            }
            let answer = local.solve_all_on(&rig, &worker.layouts);
            worker.work = Some(rig);
            let (subs, verdict) = answer.ok()?;
            let main = &subs[0];
            return Some(Sample {
                forward: finite(main.forward.value)?,
                back: finite(main.back.value)?,
                largest_tension: largest_tension_of(&subs)?,
                verdict,
            });
        }
    }
    let (rig, s) = source.solve_values(model, &keys_of(ranges), values).ok()?;
    let main = s.main();
    Some(Sample {
        forward: finite(main.forward.value)?,
        back: finite(main.back.value)?,
        largest_tension: largest_tension(&s)?,
        verdict: Verdict::assess(&rig, &s),
    })
}

/// P5, P50 and P95 of a set of values.
#[derive(Debug, Clone, Copy, Serialize, PartialEq)]
pub struct Percentiles {
    /// 5th percentile.
    pub p5: Real,
    /// Median.
    pub p50: Real,
    /// 95th percentile.
    pub p95: Real,
}

/// Percentile `p` (0 to 100) of sorted values by linear interpolation between order
/// statistics (Hyndman and Fan 1996, definition 7, the spreadsheet default).
pub fn percentile(sorted: &[Real], p: Real) -> Option<Real> {
    let n = sorted.len();
    if n == 0 {
        return None;
    }
    let h = (n - 1) as Real * p / 100.0;
    let lo = h.floor() as usize;
    let hi = (lo + 1).min(n - 1);
    Some(sorted[lo] + (h - lo as Real) * (sorted[hi] - sorted[lo]))
}

fn percentiles(mut values: Vec<Real>) -> Option<Percentiles> {
    values.sort_by(Real::total_cmp);
    Some(Percentiles {
        p5: percentile(&values, 5.0)?,
        p50: percentile(&values, 50.0)?,
        p95: percentile(&values, 95.0)?,
    })
}

/// One uncertain input, as reported.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Input {
    /// Key path.
    pub key: String,
    /// `uniform` or `normal`.
    pub distribution: &'static str,
    /// min and max, or mean and sd, in the written unit.
    pub parameters: [Real; 2],
    /// The written unit (empty: the file's unit or a ratio).
    pub unit: String,
}

/// The Monte Carlo result.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Spread {
    /// The asked quantity.
    pub solve_for: Asked,
    /// Samples asked for.
    pub samples: usize,
    /// Seed.
    pub seed: u64,
    /// Samples that could not be solved.
    pub failed: usize,
    /// The uncertain inputs.
    pub inputs: Vec<Input>,
    /// Deterministic (nominal) forward value.
    pub nominal_forward: Option<Real>,
    /// Deterministic back value.
    pub nominal_back: Option<Real>,
    /// Forward value percentiles.
    pub forward: Option<Percentiles>,
    /// Back value percentiles.
    pub back: Option<Percentiles>,
    /// Largest span tension percentiles, N.
    pub largest_tension_n: Option<Percentiles>,
    /// Share of solved samples in which the drive does not move the rig (where the
    /// asked part's quantity is given).
    pub share_not_moving: Option<Real>,
    /// What `check` concludes about the nominal rig.
    pub nominal_verdict: Verdict,
    /// Margin percentiles (where the asked part's quantity is given).
    pub margin: Option<Percentiles>,
    /// Share of solved samples in which a check fails (`check` would exit 1).
    pub share_failing: Option<Real>,
    /// Per failing check code, the share of solved samples in which it fails.
    pub failing_share: BTreeMap<&'static str, Real>,
    /// What the drive fails to do where it does not move the rig, worded for what it
    /// is (for text output).
    #[serde(skip)]
    pub not_moving: String,
    /// The caution.
    pub caution: &'static str,
    /// Units of the rig, for text output.
    #[serde(skip)]
    pub units: UnitSystem,
    /// Units of the CSV: `None` for SI (as the JSON), else those of `--units`.
    #[serde(skip)]
    pub csv_units: Option<UnitSystem>,
}

impl Spread {
    /// Whether the nominal rig or any solved sample fails a check (exit 1).
    pub fn fails(&self) -> bool {
        self.nominal_verdict.fails || self.share_failing.is_some_and(|x| x > 0.0)
    }
}

/// Runs `samples` samples on `threads` threads (0: as many as the machine has),
/// telling `progress` of each sample done.
///
/// # Errors
/// When the rig as written does not load or solve.
pub fn spread(
    source: &RigSource,
    samples: usize,
    seed: u64,
    threads: usize,
    progress: &dyn Progress,
) -> Result<Spread, StudyError> {
    let ranges = source.ranges()?;
    let (rig, nominal) = source.solve(&[])?;
    if ranges.is_empty() {
        return Err(StudyError::Input(format!(
            "{}: the rig gives no value as a range, so every sample would be the same rig: nothing to spread; write an uncertain value as `{{min: a, max: b}}` or `{{mean: m, sd: s}}`, in the file or with --set (e.g. `--set \"ropes.NAME.mu={{min: 0.1, max: 0.2}}\"`)",
            source.source
        )));
    }
    let main = nominal.main();
    // Ranged keys that are plain model values are set on the resolved rig (no re-read
    // of the file per sample); any other key, or a draw the model path refuses, takes
    // the file path, which gives the loader's checks and messages.
    let model = source.sampler(&rig, &keys_of(&ranges), &draws_of(&ranges, seed, 0));
    let local = model
        .as_ref()
        .and_then(|_| Local::new(source, &rig, &nominal));
    let threads = if threads == 0 {
        std::thread::available_parallelism().map_or(1, |n| n.get())
    } else {
        threads
    }
    .clamp(1, samples.max(1));
    let mut results: Vec<Option<Sample>> = vec![None; samples];
    progress.start(samples);
    std::thread::scope(|scope| {
        // Thread t takes samples t, t + threads, ...; each sample uses its own stream.
        // Each thread has its own rig, layouts and results, and tells `progress` of its
        // samples in batches: the threads share nothing they write.
        let chunks: Vec<Vec<(usize, Option<Sample>)>> = (0..threads)
            .map(|t| {
                let (ranges, model, local) = (&ranges, model.as_ref(), local.as_ref());
                scope.spawn(move || {
                    let mut worker = Worker::default();
                    let mut out = Vec::with_capacity(samples.div_ceil(threads));
                    let mut unreported = 0;
                    for i in (t..samples).step_by(threads) {
                        let r = run_sample_on(
                            source,
                            model,
                            local,
                            &mut worker,
                            ranges,
                            seed,
                            i as u64,
                        );
                        out.push((i, r));
                        unreported += 1;
                        if unreported == PROGRESS_BATCH {
                            progress.steps(unreported);
                            unreported = 0;
                        }
                    }
                    progress.steps(unreported);
                    out
                })
            })
            .collect::<Vec<_>>()
            .into_iter()
            .map(|h| h.join().unwrap_or_default())
            .collect();
        for (i, r) in chunks.into_iter().flatten() {
            results[i] = r;
        }
    });
    progress.finish();
    let nominal_report = assess(&rig, &nominal);
    let ok: Vec<Sample> = results.into_iter().flatten().collect();
    let judged: Vec<bool> = ok.iter().filter_map(|s| s.verdict.moves).collect();
    let share = |n: usize| n as Real / ok.len() as Real;
    let mut failing_share = BTreeMap::new();
    for s in &ok {
        for code in &s.verdict.failing {
            *failing_share.entry(*code).or_insert(0.0) += 1.0;
        }
    }
    for v in failing_share.values_mut() {
        *v = share(*v as usize);
    }
    Ok(Spread {
        solve_for: Asked::of(&rig, main),
        samples,
        seed,
        failed: samples - ok.len(),
        inputs: ranges
            .iter()
            .map(|u| {
                let (distribution, parameters) = match u.distribution {
                    Distribution::Uniform { min, max } => ("uniform", [min, max]),
                    Distribution::Normal { mean, sd } => ("normal", [mean, sd]),
                };
                Input {
                    key: u.key.clone(),
                    distribution,
                    parameters,
                    unit: u.unit.clone(),
                }
            })
            .collect(),
        nominal_forward: finite(main.forward.value),
        nominal_back: finite(main.back.value),
        forward: percentiles(ok.iter().map(|s| s.forward).collect()),
        back: percentiles(ok.iter().map(|s| s.back).collect()),
        largest_tension_n: percentiles(ok.iter().map(|s| s.largest_tension).collect()),
        share_not_moving: (!judged.is_empty())
            .then(|| judged.iter().filter(|m| !**m).count() as Real / judged.len() as Real),
        nominal_verdict: Verdict::of(&nominal_report),
        not_moving: not_moving_words(&nominal_report.headline),
        margin: percentiles(ok.iter().filter_map(|s| s.verdict.margin).collect()),
        share_failing: (!ok.is_empty())
            .then(|| share(ok.iter().filter(|s| s.verdict.fails).count())),
        failing_share,
        caution: CAUTION,
        units: rig.units,
        csv_units: None,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn percentile_interpolates() {
        let v = [1.0, 2.0, 3.0, 4.0, 5.0];
        assert_eq!(percentile(&v, 50.0), Some(3.0));
        assert_eq!(percentile(&v, 0.0), Some(1.0));
        assert_eq!(percentile(&v, 100.0), Some(5.0));
        // Hand calculation: h = 4 × 0.05 = 0.2 → 1 + 0.2 × (2 − 1) = 1.2.
        assert!((percentile(&v, 5.0).unwrap() - 1.2).abs() < 1e-12);
        assert_eq!(percentile(&[], 50.0), None);
    }

    #[test]
    fn zero_width_draws_are_exact() {
        let mut r = Rng::stream(3, 9);
        assert_eq!(
            draw(
                &Distribution::Uniform {
                    min: 0.15,
                    max: 0.15
                },
                &mut r
            ),
            0.15
        );
        assert_eq!(
            draw(
                &Distribution::Normal {
                    mean: 0.15,
                    sd: 0.0
                },
                &mut r
            ),
            0.15
        );
        for _ in 0..100 {
            assert!(
                draw(
                    &Distribution::Normal {
                        mean: 0.01,
                        sd: 0.1
                    },
                    &mut r
                ) >= 0.0
            );
        }
    }
}
