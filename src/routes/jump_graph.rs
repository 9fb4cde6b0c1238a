//! The jump network: every pair of systems within the jump range, its
//! regions (connected components) and its lanes (the minimum spanning
//! forest, by Kruskal's method over a petgraph union-find).

use super::spatial_index::SpatialIndex;
use petgraph::csr::Csr;
use petgraph::unionfind::UnionFind;
use rayon::prelude::*;
use serde::Serialize;

/// One link of the network between systems `a < b` (indices into the
/// system list), `distance_ly` apart.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Link {
    /// The lower system index.
    pub a: u32,
    /// The higher system index.
    pub b: u32,
    /// Distance between the two systems, light years.
    pub distance_ly: f64,
}

/// The adjacency of a network in compressed sparse rows: both directions
/// of every link, weights in light years.
pub type Adjacency = Csr<(), f64, petgraph::Directed, u32>;

/// A jump network over a list of points.
#[derive(Debug, Clone)]
pub struct JumpNetwork {
    /// The jump range, light years: a link joins two systems whose
    /// distance is at most this.
    pub jump_ly: f64,
    /// Number of systems (nodes), linked or not.
    pub node_count: usize,
    /// The links, sorted by `(a, b)`, each with `a < b`.
    pub links: Vec<Link>,
}

/// The regions and lanes of a network.
#[derive(Debug, Clone)]
pub struct SpanningForest {
    /// Region of each system, numbered 0.. in order of each region's
    /// first system.
    pub region_of: Vec<u32>,
    /// Number of systems in each region.
    pub region_sizes: Vec<u32>,
    /// Indices into [`JumpNetwork::links`] of the lanes (the minimum
    /// spanning forest), ascending, so lanes come sorted by `(a, b)`.
    pub lanes: Vec<u32>,
    /// Total length of the lanes, light years.
    pub lanes_ly: f64,
}

/// What `routes --json` reports about a network.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct NetworkSummary {
    /// The jump range, light years.
    pub jump_ly: f64,
    /// Number of systems (every system, brown-dwarf-only ones too).
    pub systems: u64,
    /// Number of links.
    pub links: u64,
    /// Number of regions (connected components; an isolated system is a
    /// region of its own).
    pub regions: u64,
    /// Number of systems with no link.
    pub isolated_systems: u64,
    /// Number of systems in the largest region.
    pub largest_region: u64,
    /// Number of lanes (links of the minimum spanning forest).
    pub lanes: u64,
    /// Total length of the minimum spanning forest, light years.
    pub lanes_ly: f64,
}

impl JumpNetwork {
    /// Links every pair of `points` at most `jump_ly` apart (`jump_ly`
    /// positive and finite, checked by the caller).
    pub fn build(points: &[[f64; 3]], jump_ly: f64) -> JumpNetwork {
        let index = SpatialIndex::new(points);
        JumpNetwork::build_with(&index, jump_ly)
    }

    /// As [`JumpNetwork::build`], with a tree already built.
    pub fn build_with(index: &SpatialIndex<'_>, jump_ly: f64) -> JumpNetwork {
        let links = index
            .pairs_within(jump_ly, &|_, _| true)
            .into_iter()
            .map(|(a, b, distance_ly)| Link { a, b, distance_ly })
            .collect();
        JumpNetwork {
            jump_ly,
            node_count: index.points().len(),
            links,
        }
    }

    /// Regions and lanes: Kruskal's method over the links in order of
    /// (distance, a, b), so equal lengths are settled the same way on
    /// every run.
    pub fn spanning_forest(&self) -> SpanningForest {
        let mut order: Vec<(u64, u32)> = self
            .links
            .par_iter()
            .enumerate()
            .map(|(k, l)| (l.distance_ly.to_bits(), k as u32))
            .collect();
        // Distances are non-negative, so their bit patterns sort like the
        // numbers; link indices break ties in (a, b) order.
        order.par_sort_unstable();
        let mut uf = UnionFind::<u32>::new(self.node_count);
        let mut lanes = Vec::with_capacity(self.node_count);
        let mut lanes_ly = 0.0;
        for &(_, k) in &order {
            let l = &self.links[k as usize];
            if uf.union(l.a, l.b) {
                lanes.push(k);
                lanes_ly += l.distance_ly;
                if lanes.len() + 1 == self.node_count {
                    break;
                }
            }
        }
        drop(order);
        lanes.par_sort_unstable();
        let labels = uf.into_labeling();
        let mut region_of_root = vec![u32::MAX; self.node_count];
        let mut region_of = Vec::with_capacity(self.node_count);
        let mut region_sizes: Vec<u32> = Vec::new();
        for &root in &labels {
            let slot = &mut region_of_root[root as usize];
            if *slot == u32::MAX {
                *slot = region_sizes.len() as u32;
                region_sizes.push(0);
            }
            region_sizes[*slot as usize] += 1;
            region_of.push(*slot);
        }
        SpanningForest {
            region_of,
            region_sizes,
            lanes,
            lanes_ly,
        }
    }

    /// The summary of the network and its forest.
    pub fn summary(&self, forest: &SpanningForest) -> NetworkSummary {
        NetworkSummary {
            jump_ly: self.jump_ly,
            systems: self.node_count as u64,
            links: self.links.len() as u64,
            regions: forest.region_sizes.len() as u64,
            isolated_systems: forest.region_sizes.iter().filter(|&&s| s == 1).count() as u64,
            largest_region: forest.region_sizes.iter().copied().max().unwrap_or(0) as u64,
            lanes: forest.lanes.len() as u64,
            lanes_ly: forest.lanes_ly,
        }
    }

    /// The adjacency in compressed sparse rows, for route searches.
    pub fn adjacency(&self) -> Adjacency {
        let n = self.node_count;
        // Neighbours of v are the a of links (a, v), all below v and met
        // in ascending a, then the b of links (v, b), all above v and
        // ascending: a counting sort gives every row already sorted.
        let mut start = vec![0usize; n + 1];
        for l in &self.links {
            start[l.a as usize + 1] += 1;
            start[l.b as usize + 1] += 1;
        }
        for v in 0..n {
            start[v + 1] += start[v];
        }
        let mut fill = start.clone();
        let mut edges = vec![(0u32, 0u32, 0.0f64); 2 * self.links.len()];
        for l in &self.links {
            let slot = &mut fill[l.b as usize];
            edges[*slot] = (l.b, l.a, l.distance_ly);
            *slot += 1;
        }
        for l in &self.links {
            let slot = &mut fill[l.a as usize];
            edges[*slot] = (l.a, l.b, l.distance_ly);
            *slot += 1;
        }
        let mut csr =
            Adjacency::from_sorted_edges(&edges).expect("rows built by counting sort are sorted");
        while csr.node_count() < n {
            csr.add_node(());
        }
        csr
    }
}
