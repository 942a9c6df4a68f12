//! `compare`: rigs or named variants side by side, one column each, with every
//! column's change against the first in percent. Rigs of different make-up (sheave
//! counts, drives) compare as they are: each column is its own rig's answer.
//!
//! Only like compares with like: columns are grouped by the asked quantity (its unit,
//! and whether it is a drive's effort or a load's greatest value), each group is its
//! own table, and a change is against the first column of the same group; between
//! groups (a mass and a force) there is no percentage.

use serde::Serialize;

use crate::math::Real;
use crate::model::Rig;
use crate::report::Asked;
use crate::report::CAUTION;
use crate::units::UnitSystem;

use super::{figures, Figures, RigSource, StudyError};

/// The comparison: one [`Figures`] per column, grouped by the asked quantity; the first
/// column of each group is that group's reference.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Comparison {
    /// The columns, in the order given.
    pub columns: Vec<Figures>,
    /// Per column, the change of each figure against the first column of its group,
    /// percent.
    pub change_pct: Vec<Changes>,
    /// The groups of like columns, in order of first appearance.
    pub groups: Vec<Group>,
    /// The caution.
    pub caution: &'static str,
    /// Units of the first rig, for text output.
    #[serde(skip)]
    pub units: UnitSystem,
    /// Units of the CSV: `None` for SI (as the JSON), else those of `--units`.
    #[serde(skip)]
    pub csv_units: Option<UnitSystem>,
}

/// Columns that ask for the same quantity (and unit, of a drive or of a load alike).
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Group {
    /// The asked quantity (the part of the group's first column).
    pub solve_for: Asked,
    /// Indices into `columns`, the first the group's reference.
    pub columns: Vec<usize>,
}

/// Changes against the first column of the group, percent (None where either value is missing or
/// the reference is zero).
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Changes {
    /// Ideal value.
    pub ideal: Option<Real>,
    /// Forward value.
    pub forward: Option<Real>,
    /// Back value.
    pub back: Option<Real>,
    /// Forward efficiency.
    pub efficiency: Option<Real>,
    /// Friction at the drive, forward.
    pub friction_forward: Option<Real>,
    /// Friction at the drive, back.
    pub friction_back: Option<Real>,
    /// Largest span tension.
    pub largest_tension_n: Option<Real>,
    /// Lowest safety factor.
    pub lowest_safety_factor: Option<Real>,
    /// Largest fleet angle.
    pub largest_fleet_deg: Option<Real>,
    /// Smallest D/d.
    pub smallest_bend_ratio: Option<Real>,
}

/// Percent change of `x` against `reference`.
pub fn change_pct(x: Option<Real>, reference: Option<Real>) -> Option<Real> {
    let (x, r) = (x?, reference?);
    let c = (x - r) / r.abs() * 100.0;
    // Round-off differences show as no change rather than "-0.0 %".
    let c = if c.abs() < 1e-9 { 0.0 } else { c };
    (r != 0.0 && c.is_finite()).then_some(c)
}

/// Builds the comparison from labelled, solved rigs.
pub fn compare(columns: Vec<Figures>, units: UnitSystem) -> Comparison {
    let mut groups: Vec<Group> = Vec::new();
    for (i, f) in columns.iter().enumerate() {
        match groups.iter_mut().find(|g| g.solve_for.like(&f.solve_for)) {
            Some(g) => g.columns.push(i),
            None => groups.push(Group {
                solve_for: f.solve_for.clone(),
                columns: vec![i],
            }),
        }
    }
    let reference = |i: usize| {
        groups
            .iter()
            .find(|g| g.columns.contains(&i))
            .map(|g| &columns[g.columns[0]])
    };
    let change_pct = columns
        .iter()
        .enumerate()
        .map(|(i, c)| {
            let r = reference(i);
            let ch = |f: &dyn Fn(&Figures) -> Option<Real>| change_pct(f(c), r.and_then(f));
            Changes {
                ideal: ch(&|f| f.ideal),
                forward: ch(&|f| f.forward),
                back: ch(&|f| f.back),
                efficiency: ch(&|f| f.efficiency),
                friction_forward: ch(&|f| f.friction_forward),
                friction_back: ch(&|f| f.friction_back),
                largest_tension_n: ch(&|f| f.largest_tension_n),
                lowest_safety_factor: ch(&|f| f.lowest_safety_factor),
                largest_fleet_deg: ch(&|f| f.largest_fleet_deg),
                smallest_bend_ratio: ch(&|f| f.smallest_bend_ratio),
            }
        })
        .collect();
    Comparison {
        columns,
        change_pct,
        groups,
        caution: CAUTION,
        units,
        csv_units: None,
    }
}

/// Solves each source as it is, labelled by its file name.
///
/// # Errors
/// The first rig that does not load or solve.
pub fn compare_rigs(sources: &[RigSource]) -> Result<Comparison, StudyError> {
    let mut columns = Vec::new();
    let mut units = None;
    for s in sources {
        let (rig, solution) = s.solve(&[])?;
        units.get_or_insert(rig.units);
        columns.push(figures(&label_of(&s.source), &rig, &solution));
    }
    Ok(compare(columns, units.unwrap_or_default()))
}

/// Solves the rig as written (column `base`) and then each of its variants.
///
/// # Errors
/// When the file has no variants, or one does not load or solve (named).
pub fn compare_variants(source: &RigSource) -> Result<Comparison, StudyError> {
    let variants = source.variants()?;
    if variants.is_empty() {
        return Err(StudyError::Input(format!(
            "{}: the rig has no `variants:` to compare; add e.g. `variants: {{rolling: [\"parts.head.bearing={{kind: rolling, bore: 10, mu: 0.0015}}\"]}}`",
            source.source
        )));
    }
    let (rig, solution) = source.solve(&[])?;
    let units = rig.units;
    let mut columns = vec![figures("base", &rig, &solution)];
    for v in &variants {
        let (rig, solution) = source
            .solve(&v.settings)
            .map_err(|e| StudyError::Input(format!("variant `{}`: {}", v.name, e.chain())))?;
        columns.push(figures(&v.name, &rig, &solution));
    }
    Ok(compare(columns, units))
}

/// The file name of a path, for a column heading.
pub fn label_of(source: &str) -> String {
    std::path::Path::new(source)
        .file_name()
        .map_or(source.to_string(), |f| f.to_string_lossy().into_owned())
}

impl Comparison {
    /// The comparison of one group's columns alone (its changes are already against
    /// the group's first column).
    pub fn group(&self, g: &Group) -> Comparison {
        Comparison {
            columns: g.columns.iter().map(|&i| self.columns[i].clone()).collect(),
            change_pct: g
                .columns
                .iter()
                .map(|&i| self.change_pct[i].clone())
                .collect(),
            groups: vec![Group {
                solve_for: g.solve_for.clone(),
                columns: (0..g.columns.len()).collect(),
            }],
            caution: self.caution,
            units: self.units,
            csv_units: self.csv_units,
        }
    }

    /// Whether any column fails a check (the comparison exits 1, as `check` would).
    pub fn fails(&self) -> bool {
        self.columns.iter().any(|f| f.verdict.fails)
    }
}

/// Units of a rig (for callers that build a comparison by hand).
pub fn units_of(rig: &Rig) -> UnitSystem {
    rig.units
}
