//! The line-and-sheave network as resolved: a petgraph graph with one node per part and
//! one edge per span, and the independent sub-rigs (connected components) that the
//! solver treats separately. Graph indices never leave this module's users: results
//! carry part and line names.

use petgraph::graph::{NodeIndex, UnGraph};
use petgraph::unionfind::UnionFind;

use crate::model::{LineId, PartId, Rig};

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
    pub component_of: Vec<usize>,
    /// Parts of each sub-rig, in file order.
    pub components: Vec<Vec<PartId>>,
}

impl Network {
    /// Builds the graph and finds the sub-rigs. Fixed tie points (anchors) do not join
    /// sub-rigs: two lines tied to one anchor are mechanically independent
    /// (a pick point carried by a block moves with it, and does join).
    pub fn build(rig: &Rig) -> Network {
        let mut graph = UnGraph::with_capacity(rig.parts.len(), 0);
        let nodes: Vec<NodeIndex> = (0..rig.parts.len()).map(|p| graph.add_node(p)).collect();
        let mut joined = UnionFind::new(rig.parts.len());
        for (line_id, line) in rig.lines.iter().enumerate() {
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
            // Every moving or turning part of one line moves with the line.
            let mut members = line
                .path
                .iter()
                .map(|e| e.part)
                .filter(|&p| !rig.parts[p].is_fixed_anchor());
            if let Some(first) = members.next() {
                for other in members {
                    joined.union(first, other);
                }
            }
        }
        for (id, part) in rig.parts.iter().enumerate() {
            if let Some(block) = part.block {
                graph.add_edge(nodes[id], nodes[block], Link::Carried);
                joined.union(id, block);
            }
        }
        let labels = joined.into_labeling();
        let mut component_of = vec![usize::MAX; rig.parts.len()];
        let mut components: Vec<Vec<PartId>> = Vec::new();
        let mut label_to_component = std::collections::HashMap::new();
        for (id, label) in labels.iter().enumerate() {
            let c = *label_to_component.entry(*label).or_insert_with(|| {
                components.push(Vec::new());
                components.len() - 1
            });
            component_of[id] = c;
            components[c].push(id);
        }
        Network {
            graph,
            component_of,
            components,
        }
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

    /// The lines that pass over or end at `part`, read from the graph's span edges,
    /// in line order without repeats.
    pub fn lines_at(&self, part: PartId) -> Vec<LineId> {
        let mut lines: Vec<LineId> = self
            .graph
            .edges(NodeIndex::new(part))
            .filter_map(|e| match *e.weight() {
                Link::Span { line, .. } => Some(line),
                Link::Carried => None,
            })
            .collect();
        lines.sort_unstable();
        lines.dedup();
        lines
    }

    /// The lines whose parts belong to sub-rig `component`.
    pub fn lines_of(&self, rig: &Rig, component: usize) -> Vec<LineId> {
        rig.lines
            .iter()
            .enumerate()
            .filter(|(_, l)| {
                l.path.iter().any(|e| {
                    !rig.parts[e.part].is_fixed_anchor() && self.component_of[e.part] == component
                })
            })
            .map(|(i, _)| i)
            .collect()
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
        assert_eq!(network.lines_at(id("head")), [0]);
        assert_eq!(network.lines_at(id("hook.a")), [0]);
        // The block itself is carried-to, not on the line.
        assert!(network.lines_at(id("hook")).is_empty());
    }
}
