//! Shortest routes over a jump network (petgraph's A* on the compressed
//! adjacency), and the smallest jump range that would connect two
//! systems when no route exists.

use super::jump_graph::{Adjacency, JumpNetwork};
use super::spatial_index::{SpatialIndex, distance_ly};
use petgraph::algo::astar;
use petgraph::unionfind::UnionFind;
use petgraph::visit::NodeFiltered;
use std::ops::Add;

/// What a route minimises.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum RouteBy {
    /// Total distance travelled.
    Distance,
    /// Number of jumps, ties broken by total distance.
    Jumps,
}

impl RouteBy {
    /// The name used on the command line and in JSON.
    pub fn as_str(self) -> &'static str {
        match self {
            RouteBy::Distance => "distance",
            RouteBy::Jumps => "jumps",
        }
    }

    /// Parses `distance` or `jumps`.
    pub fn parse(text: &str) -> Option<RouteBy> {
        match text.trim().to_ascii_lowercase().as_str() {
            "distance" => Some(RouteBy::Distance),
            "jumps" => Some(RouteBy::Jumps),
            _ => None,
        }
    }
}

/// A route through the network.
#[derive(Debug, Clone, PartialEq)]
pub struct Route {
    /// System indices from start to end (one entry when start is end).
    pub systems: Vec<u32>,
    /// Length of each leg, light years (one fewer than `systems`).
    pub legs_ly: Vec<f64>,
    /// Total length, light years.
    pub distance_ly: f64,
}

impl Route {
    /// Number of jumps.
    pub fn jumps(&self) -> usize {
        self.legs_ly.len()
    }
}

/// Cost for the fewest-jumps search: jumps first, then distance.
#[derive(Debug, Clone, Copy, Default, PartialEq, PartialOrd)]
struct JumpCost {
    jumps: u32,
    distance_ly: f64,
}

impl Add for JumpCost {
    type Output = JumpCost;
    fn add(self, o: JumpCost) -> JumpCost {
        JumpCost {
            jumps: self.jumps + o.jumps,
            distance_ly: self.distance_ly + o.distance_ly,
        }
    }
}

/// The heuristic is the straight-line distance, shrunk by a hair so that
/// rounding in a sum of legs can never make it overestimate.
const HEURISTIC_SHRINK: f64 = 1.0 - 1e-12;

/// Finds the best route from `from` to `to` by `by` over `adjacency` (the
/// network's, see [`JumpNetwork::adjacency`]) whose intermediate stops all
/// pass `allowed` (the two ends are always allowed). `None` when `to`
/// cannot be reached.
pub fn shortest_route(
    adjacency: &Adjacency,
    points: &[[f64; 3]],
    from: u32,
    to: u32,
    by: RouteBy,
    allowed: &dyn Fn(u32) -> bool,
) -> Option<Route> {
    let graph = NodeFiltered::from_fn(adjacency, |n: u32| n == from || n == to || allowed(n));
    let goal = points[to as usize];
    let path = match by {
        RouteBy::Distance => {
            astar(
                &graph,
                from,
                |n| n == to,
                |e| *e.weight(),
                |n| distance_ly(&points[n as usize], &goal) * HEURISTIC_SHRINK,
            )?
            .1
        }
        RouteBy::Jumps => {
            astar(
                &graph,
                from,
                |n| n == to,
                |e| JumpCost {
                    jumps: 1,
                    distance_ly: *e.weight(),
                },
                |n| JumpCost {
                    jumps: 0,
                    distance_ly: distance_ly(&points[n as usize], &goal) * HEURISTIC_SHRINK,
                },
            )?
            .1
        }
    };
    let legs_ly: Vec<f64> = path
        .windows(2)
        .map(|w| distance_ly(&points[w[0] as usize], &points[w[1] as usize]))
        .collect();
    let distance_ly = legs_ly.iter().sum();
    Some(Route {
        systems: path,
        legs_ly,
        distance_ly,
    })
}

/// The smallest jump range, light years, with which `from` and `to` are
/// joined through systems that pass `allowed` (the ends always do): the
/// longest link on the path between them in the minimum spanning tree of
/// all allowed systems (the minimax or bottleneck distance).
///
/// Computed exactly by widening the range: start from the union-find of
/// `network` (links between allowed systems), then for ranges growing by
/// half each step list every pair within the range that joins two
/// different components and run Kruskal's method over them in order of
/// distance until the two ends join; the link that joins them is the
/// answer. Pairs inside one component never matter, so only pairs between
/// components are kept.
pub fn connecting_jump_ly(
    network: &JumpNetwork,
    points: &[[f64; 3]],
    from: u32,
    to: u32,
    allowed: &dyn Fn(u32) -> bool,
) -> f64 {
    if from == to {
        return 0.0;
    }
    let ok = |n: u32| n == from || n == to || allowed(n);
    // The allowed systems, renumbered 0.. in order.
    let members: Vec<u32> = (0..points.len() as u32).filter(|&n| ok(n)).collect();
    let mut local = vec![u32::MAX; points.len()];
    for (k, &n) in members.iter().enumerate() {
        local[n as usize] = k as u32;
    }
    let sub_points: Vec<[f64; 3]> = members.iter().map(|&n| points[n as usize]).collect();
    let (a, b) = (local[from as usize], local[to as usize]);
    let mut uf = UnionFind::<u32>::new(members.len());
    for l in &network.links {
        let (la, lb) = (local[l.a as usize], local[l.b as usize]);
        if la != u32::MAX && lb != u32::MAX {
            uf.union(la, lb);
        }
    }
    // Ranges already searched: everything up to `range_ly` is merged.
    let mut range_ly = network.jump_ly;
    if uf.equiv(a, b) {
        // Joined within the network's own range: start again from single
        // systems, so the first step finds the bottleneck inside it.
        uf = UnionFind::new(members.len());
        range_ly = 0.0;
    }
    let index = SpatialIndex::new(&sub_points);
    loop {
        let next_ly = if range_ly == 0.0 {
            network.jump_ly
        } else {
            range_ly * 1.5
        };
        let labels = uf.clone().into_labeling();
        let mut pairs = index.pairs_within(next_ly, &|i, j| labels[i] != labels[j]);
        pairs.sort_unstable_by(|x, y| x.2.total_cmp(&y.2).then(x.0.cmp(&y.0)).then(x.1.cmp(&y.1)));
        for (i, j, d) in pairs {
            if uf.union(i, j) && uf.equiv(a, b) {
                return d;
            }
        }
        if !next_ly.is_finite() {
            return f64::INFINITY;
        }
        range_ly = next_ly;
    }
}
