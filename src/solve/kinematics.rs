//! Kinematics: the rig's degrees of freedom, the line-length constraints of each line
//! segment (a line split at drum passages, where the rope cannot slip), their null space
//! (the rig's motions), and the forward motion with the drive at unit speed.
//!
//! # The constraint
//! For a segment from entry `a` to entry `b`, with span unit directions `u_j`:
//! `Σ_j u_j · (V_end(j) − V_start(j)) = 0`, where `V` is the velocity of the part's
//! centre (points, sheaves) or, at a drum, of the drum's surface at the tangent point,
//! so that the rope a drum winds in or pays out is counted. For translating circles
//! this is exact: the tangent points' sliding cancels against the change of wrap
//! (DESIGN.md §2). Each span's contribution per unit velocity of each degree of freedom
//! is one row of [`Kinematics::span_rows`]; the same numbers, with the sign reversed,
//! are the span's generalized forces per unit tension in the statics.
//!
//! # Sizes
//! A span moves with at most the two parts it joins, so its row is sparse
//! ([`SpanRow`]: two entries at most), and every dense matrix (the constraints, their
//! null space) is one sub-rig's: rows its segments, columns its degrees of freedom.
//! A rig of many independent sub-rigs costs the sum of their sizes, not their product.

use nalgebra::{DMatrix, DVector};

use crate::geometry::Geometry;
use crate::math::{Direction, Real, Vector};
use crate::model::network::Link;
use crate::model::Network;
use crate::model::{IdVec, LineId, PartId, PartKind, Rig};
use petgraph::visit::EdgeRef;

use super::SolveError;

/// How a degree of freedom moves its part.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Motion {
    /// Translation along a direction (blocks, weights, haul ends), m/s per unit speed.
    Translate(Direction),
    /// Rotation about a fixed axle through the part's centre (drums), rad/s.
    Rotate(Direction),
}

/// One degree of freedom: a moving or turning part.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Dof {
    /// The part.
    pub part: PartId,
    /// How it moves.
    pub motion: Motion,
}

/// A run of a line between two ends or drum passages, with one unknown tension.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Segment {
    /// The line.
    pub line: LineId,
    /// First path entry (an end or a drum).
    pub first: usize,
    /// Last path entry (an end or a drum).
    pub last: usize,
}

/// A span's rate of lengthening per unit speed of each degree of freedom: nonzero at
/// most for the moving parts at its two ends, so at most two entries `(dof, rate)`, in
/// dof order; every other degree of freedom's rate is zero.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct SpanRow {
    entries: [(usize, Real); 2],
    len: usize,
}

impl SpanRow {
    fn push(&mut self, dof: usize, rate: Real) {
        if let Some(e) = self.entries[..self.len].iter_mut().find(|e| e.0 == dof) {
            e.1 += rate;
        } else {
            self.entries[self.len] = (dof, rate);
            self.len += 1;
        }
    }

    /// The nonzero rates, `(dof, rate)`, in dof order.
    pub fn iter(&self) -> impl Iterator<Item = (usize, Real)> + '_ {
        self.entries[..self.len].iter().copied()
    }

    /// The rate for degree of freedom `dof` (zero where the span does not move with it).
    pub fn get(&self, dof: usize) -> Real {
        self.iter().find(|e| e.0 == dof).map_or(0.0, |e| e.1)
    }

    /// The span's rate of lengthening for the dof speeds `speeds` (one per dof).
    pub fn dot(&self, speeds: &DVector<Real>) -> Real {
        self.iter().map(|(i, b)| b * speeds[i]).sum()
    }
}

/// The rig's kinematics.
#[derive(Debug, Clone)]
pub struct Kinematics {
    /// Degrees of freedom, in part order.
    pub dofs: Vec<Dof>,
    /// For each part, its degree of freedom, if it moves.
    pub dof_of_part: IdVec<PartId, Option<usize>>,
    /// Segments, line by line.
    pub segments: Vec<Segment>,
    /// `span_rows[line][span]`: the span's rate of lengthening per unit speed of each
    /// degree of freedom (sparse: the dofs of the parts at its ends).
    pub span_rows: IdVec<LineId, Vec<SpanRow>>,
    /// Forward speed of every degree of freedom, drive at +1 (0 outside moving sub-rigs).
    pub forward: DVector<Real>,
    /// The rope's speed over each path entry, relative to that part and along the path
    /// direction, in the forward motion (`rope_speed[line][entry]`).
    pub rope_speed: IdVec<LineId, Vec<Real>>,
    /// Per line, the rope speed (per unit drive speed) below which the rope counts as
    /// standing still on a part: round-off, not motion.
    pub rope_speed_floor: IdVec<LineId, Real>,
}

/// The direction a haul end is pulled: given, or along its span away from the line.
pub fn haul_direction(rig: &Rig, geometry: &Geometry, part: PartId) -> Option<Direction> {
    haul_direction_over(rig, geometry, part, rig.lines.ids())
}

/// [`haul_direction`], asking the network which lines reach the part (the lines in
/// order, as that function scans them).
fn haul_direction_in(
    rig: &Rig,
    network: &Network,
    geometry: &Geometry,
    part: PartId,
) -> Option<Direction> {
    haul_direction_over(rig, geometry, part, network.lines_at(part))
}

/// [`haul_direction`] over the lines `lines` (in order): the first that ends at the
/// haul gives its direction.
fn haul_direction_over(
    rig: &Rig,
    geometry: &Geometry,
    part: PartId,
    lines: impl IntoIterator<Item = LineId>,
) -> Option<Direction> {
    let PartKind::Haul(h) = &rig.parts[part].kind else {
        return None;
    };
    if let Some(p) = h.pull {
        return Some(p);
    }
    for l in lines {
        let (path, g) = (&rig.lines[l].path, &geometry.lines[l]);
        if path[path.len() - 1].part == part {
            return g.spans.last().map(|s| s.direction);
        }
        if path[0].part == part {
            return g.spans.first().map(|s| -s.direction);
        }
    }
    None
}

impl Kinematics {
    /// Builds degrees of freedom and constraints, finds each sub-rig's motion and
    /// scales it so that the sub-rig's drive moves forward at unit speed.
    ///
    /// `drives[c]` is the drive of sub-rig `c` (None for a sub-rig with no moving part).
    ///
    /// # Errors
    /// [`SolveError`] when a sub-rig cannot move, has more motions than drives, or its
    /// drive is held still by the others.
    pub fn build(
        rig: &Rig,
        network: &Network,
        geometry: &Geometry,
        drives: &[Option<PartId>],
        rank_tolerance: Real,
    ) -> Result<Kinematics, SolveError> {
        let mut dofs = Vec::new();
        let mut dof_of_part = IdVec::filled(None, rig.parts.len());
        // From the network's graph: which parts a line reaches, and which blocks carry
        // a part that a line reaches (each `Carried` edge joins a carried part to its
        // block; one pass over the edges).
        let in_line: IdVec<PartId, bool> = rig
            .parts
            .ids()
            .map(|p| !network.lines_at(p).is_empty())
            .collect();
        let mut carries = IdVec::filled(false, rig.parts.len());
        for e in network.graph.edge_references() {
            if *e.weight() == Link::Carried {
                let (carried, block) = (network.graph[e.source()], network.graph[e.target()]);
                if in_line[carried] {
                    carries[block] = true;
                }
            }
        }
        for (id, part) in rig.parts.enumerate() {
            let motion = match &part.kind {
                PartKind::Block(b) => Some(Motion::Translate(b.moves)),
                PartKind::Weight(_) => Some(Motion::Translate(rig.gravity)),
                PartKind::Haul(_) => {
                    haul_direction_in(rig, network, geometry, id).map(Motion::Translate)
                }
                PartKind::Drum(d) => Some(Motion::Rotate(d.axle)),
                _ => None,
            };
            if let Some(motion) = motion {
                if in_line[id] || carries[id] {
                    dof_of_part[id] = Some(dofs.len());
                    dofs.push(Dof { part: id, motion });
                }
            }
        }

        let mut span_rows = IdVec::new();
        for (l, line) in rig.lines.enumerate() {
            let g = &geometry.lines[l];
            let mut rows = Vec::with_capacity(g.spans.len());
            for (j, span) in g.spans.iter().enumerate() {
                let u = span.direction.into_inner();
                let end = point_velocity_along(
                    rig,
                    &dofs,
                    &dof_of_part,
                    line.path[j + 1].part,
                    &span.end,
                    &u,
                );
                let start = point_velocity_along(
                    rig,
                    &dofs,
                    &dof_of_part,
                    line.path[j].part,
                    &span.start,
                    &u,
                );
                // end − start, as 0 − v where only one end moves.
                let mut row = SpanRow::default();
                let mut sum = |d: Option<(usize, Real)>, sign: Real| {
                    if let Some((i, v)) = d {
                        if sign > 0.0 {
                            row.push(i, v);
                        } else if let Some(e) = row.entries[..row.len].iter_mut().find(|e| e.0 == i)
                        {
                            e.1 -= v;
                        } else {
                            row.push(i, 0.0 - v);
                        }
                    }
                };
                sum(end, 1.0);
                sum(start, -1.0);
                // Round-off of a span square to a part's motion (u · d of order 1e-17)
                // is no motion: an exact zero keeps the rig's pattern for the walk.
                let mut kept = SpanRow::default();
                let mut entries: Vec<(usize, Real)> = row.iter().collect();
                entries.sort_by_key(|e| e.0);
                for (i, v) in entries {
                    if v.abs() >= 1e-13 {
                        kept.push(i, v);
                    }
                }
                rows.push(kept);
            }
            span_rows.push(rows);
        }

        // Segments: split each line at drum passages.
        let mut segments = Vec::new();
        for (l, line) in rig.lines.enumerate() {
            let mut first = 0;
            for (e, entry) in line.path.iter().enumerate().skip(1) {
                let is_drum = matches!(rig.parts[entry.part].kind, PartKind::Drum(_));
                if e == line.path.len() - 1 || is_drum {
                    segments.push(Segment {
                        line: l,
                        first,
                        last: e,
                    });
                    first = e;
                }
            }
        }

        // Constraint rows, one per segment, sparse: the sum of its span rows.
        let constraint: Vec<Vec<(usize, Real)>> = segments
            .iter()
            .map(|seg| {
                let mut row: Vec<(usize, Real)> = Vec::new();
                for span in &span_rows[seg.line][seg.first..seg.last] {
                    for (i, v) in span.iter() {
                        match row.iter_mut().find(|e| e.0 == i) {
                            Some(e) => e.1 += v,
                            None => row.push((i, 0.0 + v)),
                        }
                    }
                }
                row.sort_by_key(|e| e.0);
                row
            })
            .collect();

        // Nothing that is not a finite number may reach the SVD (it panics on NaN).
        if let Some(g) =
            (0..segments.len()).find(|&g| constraint[g].iter().any(|e| !e.1.is_finite()))
        {
            let seg = segments[g];
            return Err(SolveError::NonFinite {
                stage: "the kinematics",
                what: "the rate of change of the line's length",
                line: Some(rig.lines[seg.line].name.clone()),
                part: Some(
                    rig.parts[rig.lines[seg.line].path[seg.first].part]
                        .name
                        .clone(),
                ),
            });
        }

        // Each line's sub-rig, once; each sub-rig's segments.
        let line_comp: IdVec<LineId, Option<usize>> = rig
            .lines
            .ids()
            .map(|l| line_component(rig, network, l))
            .collect();
        let mut rows_of: Vec<Vec<usize>> = vec![Vec::new(); network.components.len()];
        for (g, seg) in segments.iter().enumerate() {
            if let Some(c) = line_comp[seg.line] {
                rows_of[c].push(g);
            }
        }

        // Each sub-rig on its own.
        let mut forward = DVector::zeros(dofs.len());
        let mut walked = vec![false; network.components.len()];
        for (c, members) in network.components.iter().enumerate() {
            let cols: Vec<usize> = members.iter().filter_map(|&p| dof_of_part[p]).collect();
            if cols.is_empty() {
                continue;
            }
            // The sub-rig's constraint matrix, its segments by its dofs, by rows.
            let a: Vec<Vec<(usize, Real)>> = rows_of[c]
                .iter()
                .map(|&g| {
                    constraint[g]
                        .iter()
                        .filter_map(|&(i, v)| cols.binary_search(&i).ok().map(|k| (k, v)))
                        .collect()
                })
                .collect();
            let names = |ids: &[usize]| -> Vec<String> {
                ids.iter()
                    .map(|&i| rig.parts[dofs[i].part].name.clone())
                    .collect()
            };
            let drive = drives.get(c).copied().flatten();
            // A determinate sub-rig (one constraint per moving part but the drive, in
            // an order that brings in one part at a time) is walked to full precision;
            // the null space by SVD below is for the rest.
            if let Some(speeds) = walk_motion(
                rig,
                &dofs,
                &a,
                &cols,
                drive.and_then(|d| dof_of_part[d]),
                rank_tolerance,
            )? {
                for (r, &col) in cols.iter().enumerate() {
                    forward[col] = speeds[r];
                }
                walked[c] = true;
                continue;
            }
            let mut dense: DMatrix<Real> = DMatrix::zeros(a.len(), cols.len());
            for (r, row) in a.iter().enumerate() {
                for &(k, v) in row {
                    dense[(r, k)] = v;
                }
            }
            let null = null_space(&dense, rank_tolerance);
            match (null.ncols(), drive) {
                (0, _) => {
                    return Err(SolveError::CannotMove {
                        parts: names(&cols),
                    });
                }
                (_, None) => {
                    return Err(SolveError::NoDrive {
                        parts: names(&cols),
                    });
                }
                (k, Some(drive)) => {
                    let Some(d) = dof_of_part[drive] else {
                        return Err(SolveError::DriveCannotMove {
                            drive: rig.parts[drive].name.clone(),
                        });
                    };
                    let dpos = cols.iter().position(|&i| i == d).unwrap_or(usize::MAX);
                    if dpos == usize::MAX {
                        return Err(SolveError::DriveCannotMove {
                            drive: rig.parts[drive].name.clone(),
                        });
                    }
                    // Rotate the null basis so that one vector carries the drive.
                    let drive_row: DVector<Real> = null.row(dpos).transpose();
                    let norm = drive_row.norm();
                    if norm < rank_tolerance {
                        return Err(SolveError::DriveCannotMove {
                            drive: rig.parts[drive].name.clone(),
                        });
                    }
                    if k > 1 {
                        // Motions that leave the drive still: the parts they move are free.
                        let w = &drive_row / norm;
                        let mut free = Vec::new();
                        for (r, &col) in cols.iter().enumerate() {
                            let row: DVector<Real> = null.row(r).transpose();
                            let orth = &row - &w * w.dot(&row);
                            if orth.norm() > 1e-6 {
                                free.push(col);
                            }
                        }
                        return Err(SolveError::FreeParts {
                            drive: rig.parts[drive].name.clone(),
                            parts: names(&free),
                        });
                    }
                    let scale = 1.0 / null[(dpos, 0)];
                    for (r, &col) in cols.iter().enumerate() {
                        let v = null[(r, 0)] * scale;
                        forward[col] = if v.abs() < 1e-12 { 0.0 } else { v };
                    }
                }
            }
        }

        // Rope speed over each entry: s_e = −Σ_{i<e in its segment} row_i · q̇.
        let mut rope_speed: IdVec<LineId, Vec<Real>> =
            rig.lines.iter().map(|l| vec![0.0; l.path.len()]).collect();
        for seg in &segments {
            let mut s = 0.0;
            for e in seg.first + 1..seg.last {
                s -= span_rows[seg.line][e - 1].dot(&forward);
                rope_speed[seg.line][e] = s;
            }
        }

        // Below what speed the rope counts as standing on a part: 1e-12 of the drive's
        // speed where the motion came from the SVD (whose round-off is relative to the
        // drive), 1e-12 of the line's own speeds where it was walked (exact to its own
        // scale: a cascade's far lines run at 2^-N of the drive and still run).
        let rope_speed_floor: IdVec<LineId, Real> = rig
            .lines
            .ids()
            .map(|l| {
                let walked_line = line_comp[l].is_some_and(|c| walked[c]);
                if !walked_line {
                    return 1e-12;
                }
                let scale = span_rows[l]
                    .iter()
                    .map(|row| {
                        row.iter()
                            .map(|(i, b)| (b * forward[i]).abs())
                            .sum::<Real>()
                    })
                    .fold(0.0, Real::max);
                1e-12 * scale
            })
            .collect();

        Ok(Kinematics {
            dofs,
            dof_of_part,
            segments,
            span_rows,
            forward,
            rope_speed,
            rope_speed_floor,
        })
    }
}

/// The sub-rig a line belongs to (None for a line between anchors only).
pub fn line_component(rig: &Rig, network: &Network, line: LineId) -> Option<usize> {
    rig.lines[line]
        .path
        .iter()
        .find(|e| !rig.parts[e.part].is_fixed_anchor())
        .map(|e| network.component_of[e.part])
}

/// `u · V` for the contact point of `part` at `at`, per unit speed of the one dof that
/// moves it (its own, or its block's), if any: `(dof, rate)`.
fn point_velocity_along(
    rig: &Rig,
    dofs: &[Dof],
    dof_of_part: &IdVec<PartId, Option<usize>>,
    part: PartId,
    at: &crate::math::Point,
    u: &Vector,
) -> Option<(usize, Real)> {
    // Carried parts (sheaves, pick points) move with their block.
    let mover = match &rig.parts[part].kind {
        PartKind::Sheave(_) | PartKind::Anchor => rig.parts[part].block,
        _ => Some(part),
    };
    let m = mover?;
    let i = dof_of_part[m]?;
    Some((
        i,
        match dofs[i].motion {
            Motion::Translate(d) => d.dot(u),
            Motion::Rotate(axle) => {
                let r = at - rig.parts[m].at;
                axle.cross(&r).dot(u)
            }
        },
    ))
}

/// The forward speeds of a sub-rig's degrees of freedom (`cols`, drive at +1) by
/// walking its constraint matrix `a` (its segments by `cols`, by rows: `(column,
/// value)` in column order), when it is determinate:
/// one constraint per moving part but the drive, ordered so that each brings in one
/// part (see [`super::walk`]); a pivot must be above the null-space threshold of the
/// SVD. None when the walk does not apply (then the SVD decides).
///
/// # Errors
/// [`SolveError::BeyondPrecision`] when a part's speed relative to the drive's is
/// beyond what a double holds (a cascade of more than about 1,000 movable pulleys).
fn walk_motion(
    rig: &Rig,
    dofs: &[Dof],
    a: &[Vec<(usize, Real)>],
    cols: &[usize],
    drive: Option<usize>,
    tolerance: Real,
) -> Result<Option<Vec<Real>>, SolveError> {
    let Some(dpos) = drive.and_then(|d| cols.iter().position(|&i| i == d)) else {
        return Ok(None);
    };
    if a.len() + 1 != cols.len() {
        return Ok(None);
    }
    let scale = a
        .iter()
        .flatten()
        .map(|e| e.1.abs())
        .fold(0.0, Real::max)
        .max(1.0);
    let mut known = vec![None; cols.len()];
    known[dpos] = Some(1.0);
    let entry = |r: usize, k: usize| {
        a[r].binary_search_by_key(&k, |e| e.0)
            .map_or(0.0, |p| a[r][p].1)
    };
    super::walk::substitute_rows(a, cols.len(), &vec![0.0; a.len()], &known, |r, k| {
        entry(r, k).abs() > tolerance * scale
    })
    .map_err(|e| SolveError::BeyondPrecision {
        stage: "the kinematics",
        what: "the speed",
        part: rig.parts[dofs[cols[e.col]].part].name.clone(),
    })
}

/// Orthonormal basis of the null space of one sub-rig's constraint matrix `a`.
fn null_space(a: &DMatrix<Real>, tolerance: Real) -> DMatrix<Real> {
    let n = a.ncols();
    let m = a.nrows().max(n);
    // Pad with zero rows so the SVD returns a full V.
    let mut sub = DMatrix::zeros(m, n);
    sub.rows_mut(0, a.nrows()).copy_from(a);
    let scale = sub.amax().max(1.0);
    let svd = sub.svd(false, true);
    let Some(v_t) = svd.v_t else {
        return DMatrix::zeros(n, 0);
    };
    let null: Vec<usize> = (0..n)
        .filter(|&k| svd.singular_values[k] <= tolerance * scale)
        .collect();
    let mut basis = DMatrix::zeros(n, null.len());
    for (j, &k) in null.iter().enumerate() {
        for i in 0..n {
            basis[(i, j)] = v_t[(k, i)];
        }
    }
    basis
}
