//! The line-and-sheave network as resolved: a petgraph graph with one node per part and
//! one edge per span, and the independent sub-rigs (connected components) that the
//! solver treats separately. Graph indices never leave this module's users: results
//! carry part and line names.

use petgraph::graph::{NodeIndex, UnGraph};
use petgraph::visit::{Dfs, NodeFiltered};

use crate::model::{IdVec, LineId, PartId, Rig};

/// What a graph edge stands for.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Link {
    /// Span `index` of line `line` (joins path entries `index` and `index + 1`).
    Span {
        /// The line.
        line: LineId,
        /// The span's index along the line.
        index: usize,
    },
    /// A sheave or pick point carried by a moving block.
    Carried,
}

/// The rig as a graph.
#[derive(Debug, Clone)]
pub struct Network {
    /// Node weight: the part; edge weight: the link.
    pub graph: UnGraph<PartId, Link>,
    /// For each part, its sub-rig index.
    pub component_of: IdVec<PartId, usize>,
    /// Parts of each sub-rig, in file order.
    pub components: Vec<Vec<PartId>>,
}

impl Network {
    /// Builds the graph and finds the sub-rigs. Fixed tie points (anchors) do not join
    /// sub-rigs: two lines tied to one anchor are mechanically independent
    /// (a pick point carried by a block moves with it, and does join).
    pub fn build(rig: &Rig) -> Network {
        let mut graph = UnGraph::with_capacity(rig.parts.len(), 0);
        // Node `k` is part `k`: the graph's indices are the parts' positions.
        let nodes: IdVec<PartId, NodeIndex> = rig.parts.ids().map(|p| graph.add_node(p)).collect();
        for (line_id, line) in rig.lines.enumerate() {
            for (index, pair) in line.path.windows(2).enumerate() {
                let (a, b) = (pair[0].part, pair[1].part);
                graph.add_edge(
                    nodes[a],
                    nodes[b],
                    Link::Span {
                        line: line_id,
                        index,
                    },
                );
            }
        }
        for (id, part) in rig.parts.enumerate() {
            if let Some(block) = part.block {
                graph.add_edge(nodes[id], nodes[block], Link::Carried);
            }
        }
        // Sub-rigs are the components of the graph without its fixed anchors: every
        // moving or turning part of one line moves with the line, a carried part with
        // its block, but two lines tied to one anchor stay independent. Each fixed
        // anchor is a sub-rig of its own. Components are numbered by their first part
        // in file order.
        let moving = NodeFiltered::from_fn(&graph, |n: NodeIndex| {
            !rig.parts[graph[n]].is_fixed_anchor()
        });
        let mut component_of = IdVec::filled(usize::MAX, rig.parts.len());
        let mut components: Vec<Vec<PartId>> = Vec::new();
        for id in rig.parts.ids() {
            if component_of[id] != usize::MAX {
                continue;
            }
            let c = components.len();
            let mut members = vec![id];
            if !rig.parts[id].is_fixed_anchor() {
                members.clear();
                let mut dfs = Dfs::new(&moving, nodes[id]);
                while let Some(n) = dfs.next(&moving) {
                    members.push(graph[n]);
                }
            }
            members.sort_unstable();
            for &p in &members {
                component_of[p] = c;
            }
            components.push(members);
        }
        Network {
            graph,
            component_of,
            components,
        }
    }

    /// The graph node of `part`: node `k` is part `k`, as [`Network::build`] adds them.
    pub fn node(part: PartId) -> NodeIndex {
        NodeIndex::new(part.index())
    }

    /// The parts that block `block` carries (its sheaves and pick points), read from the
    /// graph's `Carried` edges (each joins the carried part to its block), file order.
    pub fn carried_by(&self, block: PartId) -> Vec<PartId> {
        let mut carried: Vec<PartId> = self
            .graph
            .edge_indices()
            .filter(|&e| self.graph[e] == Link::Carried)
            .filter_map(|e| self.graph.edge_endpoints(e))
            .filter(|&(_, b)| self.graph[b] == block)
            .map(|(p, _)| self.graph[p])
            .collect();
        carried.sort_unstable();
        carried
    }

    /// Whether one of `a` and `b` is a block carrying the other, read from the graph's
    /// `Carried` edge between them.
    pub fn carries(&self, a: PartId, b: PartId) -> bool {
        self.graph
            .edges_connecting(Network::node(a), Network::node(b))
            .chain(
                self.graph
                    .edges_connecting(Network::node(b), Network::node(a)),
            )
            .any(|e| *e.weight() == Link::Carried)
    }

    /// The lines that pass over or end at `part`, read from the graph's span edges,
    /// in line order without repeats.
    pub fn lines_at(&self, part: PartId) -> Vec<LineId> {
        let mut lines: Vec<LineId> = self
            .graph
            .edges(Network::node(part))
            .filter_map(|e| match *e.weight() {
                Link::Span { line, .. } => Some(line),
                Link::Carried => None,
            })
            .collect();
        lines.sort_unstable();
        lines.dedup();
        lines
    }

    /// The lines whose moving or turning parts belong to sub-rig `component`, read from
    /// the graph's span edges at its parts, in line order.
    pub fn lines_of(&self, rig: &Rig, component: usize) -> Vec<LineId> {
        let mut lines: Vec<LineId> = self.components[component]
            .iter()
            .filter(|&&p| !rig.parts[p].is_fixed_anchor())
            .flat_map(|&p| self.lines_at(p))
            .collect();
        lines.sort_unstable();
        lines.dedup();
        lines
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::rig::load_str;

    #[test]
    fn graph_queries_on_the_design_example() {
        let text = include_str!("../../tests/rigs/design-example.yaml");
        let rig = load_str(text, "hoist.yaml").unwrap();
        let network = Network::build(&rig);
        let id = |name: &str| rig.part_named(name).unwrap();
        assert_eq!(network.carried_by(id("hook")), [id("hook.a")]);
        assert!(network.carried_by(id("head")).is_empty());
        assert!(network.carries(id("hook"), id("hook.a")));
        assert!(network.carries(id("hook.a"), id("hook")));
        assert!(!network.carries(id("head"), id("hook.a")));
        assert_eq!(network.lines_at(id("head")), [LineId::new(0)]);
        assert_eq!(network.lines_at(id("hook.a")), [LineId::new(0)]);
        // The block itself is carried-to, not on the line.
        assert!(network.lines_at(id("hook")).is_empty());
    }

    /// Guards the rule that a fixed anchor does not join sub-rigs: two lines tied to one
    /// anchor are two sub-rigs; the anchor is one of its own.
    #[test]
    fn a_shared_fixed_anchor_does_not_join_sub_rigs() {
        let text = "format: 1
units: {length: mm, force: N, mass: kg}
ropes:
  cord4: {diameter: 4, mu: 0.2}
parts:
  eye:    {kind: anchor, at: [0, 0, 1000]}
  bar.a:  {kind: guide, at: [20, 0, 1000], axle: [0, 1, 0], diameter: 36}
  load.a: {kind: weight, at: [40, 0, 0], mass: 10}
  bar.b:  {kind: guide, at: [-20, 0, 1000], axle: [0, 1, 0], diameter: 36}
  hand.b: {kind: haul, at: [-40, 0, 0]}
lines:
  a: {rope: cord4, path: [eye, bar.a, load.a]}
  b: {rope: cord4, path: [eye, bar.b, hand.b]}
drive: hand.b
";
        let rig = load_str(text, "shared.yaml").unwrap();
        let network = Network::build(&rig);
        let id = |name: &str| rig.part_named(name).unwrap();
        assert_eq!(network.components.len(), 3);
        assert_eq!(
            network.components[network.component_of[id("eye")]],
            [id("eye")]
        );
        let a = network.component_of[id("bar.a")];
        let b = network.component_of[id("bar.b")];
        assert_ne!(a, b);
        assert_eq!(network.components[a], [id("bar.a"), id("load.a")]);
        assert_eq!(network.lines_of(&rig, a), [LineId::new(0)]);
        assert_eq!(network.lines_of(&rig, b), [LineId::new(1)]);
        assert!(network
            .lines_of(&rig, network.component_of[id("eye")])
            .is_empty());
    }
}
