//! The layout of a sub-rig's statics: what the statics take from its graph, motion,
//! reeving and the ropes' own weight, none of which depends on friction or loads, so a
//! study that changes only those builds it once and shares it.

use std::sync::Arc;

use nalgebra::DVector;

use crate::geometry::Geometry;
use crate::math::{Real, Vector};
use crate::model::{Id, LineId, Link, Network, PartId, PartKind, Rig};

use super::super::kinematics::{line_component, Kinematics};
use super::super::selfweight::RopeWeight;

/// What the statics of one sub-rig take from its graph, kinematics, reeving and the
/// ropes' own weight: its degrees of freedom, lines, segments and parts, which spans
/// touch which part, and the ropes' weight on its spans.
/// None of it depends on friction or loads, so a study that changes only those (a
/// spread's sample) builds it once ([`Layout::new`]) and hands it to every
/// [`Problem::with_layout`](super::Problem::with_layout).
///
/// A clone copies the results' key slices too (`line_ids`, `part_ids`): each thread
/// of a study works on its own clone, so the threads never touch one reference count
/// (every case's results hold these keys).
#[derive(Debug)]
pub struct Layout {
    /// Global dof indices of the sub-rig, ascending.
    pub(super) dofs: Vec<usize>,
    /// Global segment indices of the sub-rig.
    pub(super) segs: Vec<usize>,
    /// For each of `segs`, its line's local index.
    pub(super) seg_line: Vec<usize>,
    /// Lines of the sub-rig, ascending.
    pub(super) lines: Vec<LineId>,
    /// Parts its lines reach and parts it moves, ascending.
    pub(super) parts: Vec<PartId>,
    /// `path_part[local line][entry]`: the entry's part, as an index into `parts`.
    pub(super) path_part: Vec<Vec<usize>>,
    /// For each of `dofs`, its part as an index into `parts`.
    pub(super) dof_part: Vec<usize>,
    /// For each of `dofs` that is a block, the parts it carries ([`carried_by`]).
    pub(super) carried: Vec<Vec<PartId>>,
    /// The spans touching each local part, `(local line, span, at its end)`, at
    /// `touches[touch_start[lp]..touch_start[lp + 1]]`, in the order the lines and
    /// their spans run (which fixes the order their forces add up in).
    pub(super) touches: Vec<(usize, usize, bool)>,
    /// See `touches`.
    pub(super) touch_start: Vec<usize>,
    /// `lines` and `parts` as the results' keys, shared by every case.
    pub(super) line_ids: Arc<[LineId]>,
    pub(super) part_ids: Arc<[PartId]>,
    /// The ropes' own weight on each span (zero for weightless ropes; DESIGN.md §7):
    /// the ropes' mass and the geometry fix it, not friction or loads.
    pub(super) weight: RopeWeight,
    /// The generalized load of the ropes' weight beyond the start tensions, per dof
    /// (order of `dofs`).
    pub(super) rope_load: DVector<Real>,
    /// The weight of the rope lying on each local part's arcs, N (along gravity; zero
    /// for weightless ropes and point parts): it loads the part's pin.
    pub(super) arc_load: Vec<Vector>,
}

/// The parts a block carries, from the network's `Carried` edges (each stored as
/// carried part to block), ascending, each once.
fn carried_by(network: &Network, block: PartId) -> Vec<PartId> {
    let graph = &network.graph;
    let mut carried: Vec<PartId> = graph
        .edges(Network::node(block))
        .filter(|e| *petgraph::visit::EdgeRef::weight(e) == Link::Carried)
        .filter_map(|e| graph.edge_endpoints(petgraph::visit::EdgeRef::id(&e)))
        .filter(|&(_, b)| graph[b] == block)
        .map(|(p, _)| graph[p])
        .collect();
    carried.sort_unstable();
    carried.dedup();
    carried
}

impl Clone for Layout {
    fn clone(&self) -> Layout {
        Layout {
            dofs: self.dofs.clone(),
            segs: self.segs.clone(),
            seg_line: self.seg_line.clone(),
            lines: self.lines.clone(),
            parts: self.parts.clone(),
            path_part: self.path_part.clone(),
            dof_part: self.dof_part.clone(),
            carried: self.carried.clone(),
            touches: self.touches.clone(),
            touch_start: self.touch_start.clone(),
            line_ids: self.line_ids.as_ref().into(),
            part_ids: self.part_ids.as_ref().into(),
            weight: self.weight.clone(),
            rope_load: self.rope_load.clone(),
            arc_load: self.arc_load.clone(),
        }
    }
}

impl Layout {
    /// The layout of sub-rig `component` of `rig` (its graph `network`, its geometry
    /// and its motion `kin`).
    pub fn new(
        rig: &Rig,
        network: &Network,
        geometry: &Geometry,
        kin: &Kinematics,
        component: usize,
    ) -> Layout {
        // The sub-rig's members (ascending) and their dofs (dofs are in part order).
        let dofs: Vec<usize> = network.components[component]
            .iter()
            .filter_map(|&p| kin.dof_of_part[p])
            .collect();
        // The lines at its moving or turning parts (as `Network::lines_of`, from the
        // graph's span edges, in one list).
        let mut lines: Vec<LineId> = network.components[component]
            .iter()
            .filter(|&&p| !rig.parts[p].is_fixed_anchor())
            .flat_map(|&p| {
                network.graph.edges(Network::node(p)).filter_map(|e| {
                    match *petgraph::visit::EdgeRef::weight(&e) {
                        Link::Span { line, .. } => Some(line),
                        Link::Carried => None,
                    }
                })
            })
            .collect();
        lines.sort_unstable();
        lines.dedup();
        lines.retain(|&l| line_component(rig, network, l) == Some(component));
        // Segments are stored line by line.
        let mut segs = Vec::new();
        let mut seg_line = Vec::new();
        for (li, &l) in lines.iter().enumerate() {
            let from = kin.segments.partition_point(|s| s.line < l);
            let to = kin.segments.partition_point(|s| s.line <= l);
            segs.extend(from..to);
            seg_line.extend(std::iter::repeat(li).take(to - from));
        }
        let mut parts: Vec<PartId> = lines
            .iter()
            .flat_map(|&l| rig.lines[l].path.iter().map(|e| e.part))
            .chain(dofs.iter().map(|&i| kin.dofs[i].part))
            .collect();
        parts.sort_unstable();
        parts.dedup();
        // `parts` holds every path part of these lines and every motion's part, the
        // only parts looked up below, so the search always finds them.
        let local = |p: PartId| parts.binary_search(&p).expect("a part of the sub-rig");
        let path_part: Vec<Vec<usize>> = lines
            .iter()
            .map(|&l| rig.lines[l].path.iter().map(|e| local(e.part)).collect())
            .collect();
        let dof_part: Vec<usize> = dofs.iter().map(|&i| local(kin.dofs[i].part)).collect();
        // Each span touches the part it leaves and the part it reaches.
        let mut touch_start = vec![0; parts.len() + 1];
        for path in &path_part {
            for pair in path.windows(2) {
                touch_start[pair[0] + 1] += 1;
                touch_start[pair[1] + 1] += 1;
            }
        }
        for lp in 0..parts.len() {
            touch_start[lp + 1] += touch_start[lp];
        }
        let mut touches = vec![(0, 0, false); touch_start[parts.len()]];
        let mut next = touch_start.clone();
        for (li, path) in path_part.iter().enumerate() {
            for (j, pair) in path.windows(2).enumerate() {
                for (lp, at_end) in [(pair[0], false), (pair[1], true)] {
                    touches[next[lp]] = (li, j, at_end);
                    next[lp] += 1;
                }
            }
        }
        let carried = dofs
            .iter()
            .map(|&i| {
                let part = kin.dofs[i].part;
                match rig.parts[part].kind {
                    PartKind::Block(_) => carried_by(network, part),
                    _ => Vec::new(),
                }
            })
            .collect();
        // The results' keys (`ById::keyed`), checked here once: ascending, each once,
        // ids of the rig.
        fn keys_hold<I: Id>(ids: &[I], len: usize) -> bool {
            ids.windows(2).all(|w| w[0] < w[1]) && ids.last().map_or(true, |&i| i.index() < len)
        }
        assert!(keys_hold(&lines, rig.lines.len()) && keys_hold(&parts, rig.parts.len()));
        let (line_ids, part_ids) = (lines.as_slice().into(), parts.as_slice().into());
        let weight = RopeWeight::build(rig, geometry, &lines);
        let rope_load = weight.generalized_load(rig, geometry, kin, &lines, &dofs);
        let mut arc_load = vec![Vector::zeros(); parts.len()];
        for (li, path) in path_part.iter().enumerate() {
            for (e, &lp) in path.iter().enumerate() {
                arc_load[lp] += weight.arc_weight(li, e);
            }
        }
        Layout {
            dofs,
            segs,
            seg_line,
            lines,
            parts,
            path_part,
            dof_part,
            carried,
            touches,
            touch_start,
            line_ids,
            part_ids,
            weight,
            rope_load,
            arc_load,
        }
    }
}
