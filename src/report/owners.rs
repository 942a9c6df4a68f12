//! Who owns what in a solved rig, found once for [`super::Report::build`].

use crate::model::{IdVec, LineId, PartId, Rig};
use crate::solve::Solution;

/// Who owns what, found once per report: the sub-rig solution (its index in
/// `solution.subrigs`) of each part and line, the passages at each part and the
/// sub-rigs whose lines reach it. Each is one pass over the parts or the lines' paths,
/// so building the report is linear in the rig, however many sub-rigs it has.
pub(super) struct Owners {
    /// Of each part: the solution of its sub-rig.
    pub(super) part: IdVec<PartId, Option<usize>>,
    /// Of each line: the solution of its sub-rig.
    pub(super) line: IdVec<LineId, Option<usize>>,
    /// At each part: its path entries `(line, entry)`, in line then entry order.
    pub(super) entries: IdVec<PartId, Vec<(LineId, usize)>>,
    /// At each part: the solutions whose lines reach it, ascending, each once.
    pub(super) reached_by: IdVec<PartId, Vec<usize>>,
}

impl Owners {
    pub(super) fn of(rig: &Rig, solution: &Solution) -> Owners {
        let network = &solution.network;
        let mut of_component = vec![None; network.components.len()];
        for (k, s) in solution.subrigs.iter().enumerate().rev() {
            // The first solution of a component, as a search from the front finds it.
            of_component[s.component] = Some(k);
        }
        let part: IdVec<PartId, Option<usize>> = rig
            .parts
            .ids()
            .map(|p| of_component[network.component_of[p]])
            .collect();
        let line_owner: IdVec<LineId, Option<usize>> = rig
            .lines
            .ids()
            .map(|l| {
                crate::solve::kinematics::line_component(rig, network, l)
                    .and_then(|c| of_component[c])
            })
            .collect();
        let mut entries = IdVec::filled(Vec::new(), rig.parts.len());
        let mut reached_by: IdVec<PartId, Vec<usize>> = IdVec::filled(Vec::new(), rig.parts.len());
        for (l, line) in rig.lines.enumerate() {
            for (e, entry) in line.path.iter().enumerate() {
                entries[entry.part].push((l, e));
                if let Some(k) = line_owner[l] {
                    reached_by[entry.part].push(k);
                }
            }
        }
        for r in reached_by.iter_mut() {
            r.sort_unstable();
            r.dedup();
        }
        Owners {
            part,
            line: line_owner,
            entries,
            reached_by,
        }
    }
}
