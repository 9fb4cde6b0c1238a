//! The routes library against brute force: neighbours and links by
//! comparing every pair, regions by a breadth-first search, lanes by a
//! Kruskal over all pairs, shortest routes by a plain O(n²) Dijkstra, the
//! smallest connecting range by a Kruskal over the complete graph; plus
//! small hand-built graphs whose answers are worked out by hand.
//!
//! The reference computations here are written independently of
//! `src/routes` (no shared code beyond the distance formula).

use starloom::Catalogue;
use starloom::catalogue::StarRow;
use starloom::physics::{Fidelity, KindChoice, StarRequest, star_profile};
use starloom::routes::{
    JumpNetwork, RouteBy, Systems, connecting_jump_ly, map_overlay, neighbours, resolve_system,
    shortest_route,
};
use starloom::spec::{SectorSpec, Shape};
use starloom::units::{Gigayears, SolarMasses};

fn sector(seed: u64, radius_ly: f64) -> Catalogue {
    let spec = SectorSpec::new(seed, Shape::Sphere { radius_ly }, [0.0, 0.0, 0.0]);
    starloom::sampler::generate(&spec, &|_, _| {}).expect("small sector generates")
}

fn dist(a: &[f64; 3], b: &[f64; 3]) -> f64 {
    ((a[0] - b[0]).powi(2) + (a[1] - b[1]).powi(2) + (a[2] - b[2]).powi(2)).sqrt()
}

/// Every pair within `r`, i < j, sorted by (i, j).
fn brute_pairs(p: &[[f64; 3]], r: f64) -> Vec<(usize, usize, f64)> {
    let mut out = Vec::new();
    for i in 0..p.len() {
        for j in i + 1..p.len() {
            let d = dist(&p[i], &p[j]);
            if d <= r {
                out.push((i, j, d));
            }
        }
    }
    out
}

/// A plain union-find for the reference Kruskal.
struct Dsu(Vec<usize>);
impl Dsu {
    fn new(n: usize) -> Dsu {
        Dsu((0..n).collect())
    }
    fn find(&mut self, x: usize) -> usize {
        let mut r = x;
        while self.0[r] != r {
            r = self.0[r];
        }
        let mut y = x;
        while self.0[y] != r {
            let next = self.0[y];
            self.0[y] = r;
            y = next;
        }
        r
    }
    fn join(&mut self, a: usize, b: usize) -> bool {
        let (ra, rb) = (self.find(a), self.find(b));
        if ra == rb {
            return false;
        }
        self.0[ra] = rb;
        true
    }
}

/// Reference Dijkstra over a dense matrix: cost (jumps, distance) when
/// `by_jumps`, else distance; returns the best cost to `to`.
fn reference_dijkstra(
    p: &[[f64; 3]],
    r: f64,
    from: usize,
    to: usize,
    by_jumps: bool,
    allowed: &dyn Fn(usize) -> bool,
) -> Option<(usize, f64)> {
    let n = p.len();
    let ok = |v: usize| v == from || v == to || allowed(v);
    let mut best: Vec<Option<(usize, f64)>> = vec![None; n];
    let mut done = vec![false; n];
    best[from] = Some((0, 0.0));
    let better = |a: (usize, f64), b: (usize, f64)| {
        if by_jumps {
            a.0 < b.0 || (a.0 == b.0 && a.1 < b.1)
        } else {
            a.1 < b.1
        }
    };
    loop {
        let mut u = None;
        for v in 0..n {
            if let (false, Some(c)) = (done[v], best[v])
                && u.is_none_or(|w: usize| better(c, best[w].unwrap()))
            {
                u = Some(v);
            }
        }
        let Some(u) = u else { return None };
        if u == to {
            return best[u];
        }
        done[u] = true;
        let cu = best[u].unwrap();
        for v in 0..n {
            if v == u || done[v] || !ok(v) {
                continue;
            }
            let d = dist(&p[u], &p[v]);
            if d <= r {
                let c = (cu.0 + 1, cu.1 + d);
                if best[v].is_none_or(|b| better(c, b)) {
                    best[v] = Some(c);
                }
            }
        }
    }
}

#[test]
fn neighbours_match_brute_force() {
    let cat = sector(11, 45.0);
    let systems = Systems::from_catalogue(&cat);
    let p = &systems.positions_ly;
    assert!(p.len() > 300, "sector has {} systems", p.len());
    for (k, within) in [(Some(4), None), (None, Some(7.5)), (Some(3), Some(6.0))] {
        let table = neighbours(&systems, k, within);
        assert_eq!(table.len(), p.len());
        for i in 0..p.len() {
            let mut all: Vec<(f64, usize)> = (0..p.len())
                .filter(|&j| j != i)
                .map(|j| (dist(&p[i], &p[j]), j))
                .filter(|&(d, _)| within.is_none_or(|r| d <= r))
                .collect();
            all.sort_by(|a, b| a.0.total_cmp(&b.0).then(a.1.cmp(&b.1)));
            if let Some(k) = k {
                all.truncate(k);
            }
            let got: Vec<(f64, usize)> = table[i].iter().map(|&(j, d)| (d, j as usize)).collect();
            assert_eq!(got, all, "system {i}, k {k:?}, within {within:?}");
        }
    }
}

#[test]
fn links_regions_and_lanes_match_brute_force() {
    let cat = sector(12, 45.0);
    let systems = Systems::from_catalogue(&cat);
    let p = &systems.positions_ly;
    for jump in [4.0, 7.0, 10.0] {
        let net = JumpNetwork::build(p, jump);
        let want = brute_pairs(p, jump);
        let got: Vec<(usize, usize, f64)> = net
            .links
            .iter()
            .map(|l| (l.a as usize, l.b as usize, l.distance_ly))
            .collect();
        assert_eq!(got, want, "links at jump {jump}");

        // Regions by breadth-first search over the brute-force pairs.
        let mut adj = vec![Vec::new(); p.len()];
        for &(i, j, _) in &want {
            adj[i].push(j);
            adj[j].push(i);
        }
        let mut seen = vec![false; p.len()];
        let mut sizes = Vec::new();
        for s in 0..p.len() {
            if seen[s] {
                continue;
            }
            seen[s] = true;
            let mut queue = vec![s];
            let mut size = 0;
            while let Some(u) = queue.pop() {
                size += 1;
                for &v in &adj[u] {
                    if !seen[v] {
                        seen[v] = true;
                        queue.push(v);
                    }
                }
            }
            sizes.push(size);
        }
        // Lanes by a Kruskal over the brute-force pairs.
        let mut sorted = want.clone();
        sorted.sort_by(|a, b| a.2.total_cmp(&b.2));
        let mut dsu = Dsu::new(p.len());
        let (mut lanes, mut total) = (0u64, 0.0);
        for &(i, j, d) in &sorted {
            if dsu.join(i, j) {
                lanes += 1;
                total += d;
            }
        }
        let forest = net.spanning_forest();
        let s = net.summary(&forest);
        assert_eq!(s.systems, p.len() as u64);
        assert_eq!(s.links, want.len() as u64);
        assert_eq!(s.regions, sizes.len() as u64, "regions at jump {jump}");
        assert_eq!(
            s.isolated_systems,
            sizes.iter().filter(|&&z| z == 1).count() as u64
        );
        assert_eq!(s.largest_region, *sizes.iter().max().unwrap() as u64);
        assert_eq!(s.lanes, lanes);
        assert_eq!(s.lanes, s.systems - s.regions);
        // Sums of the same lengths in another order: rounding only.
        assert!(
            (s.lanes_ly - total).abs() <= 1e-9 * total,
            "lanes {} vs {total}",
            s.lanes_ly
        );
        // Lanes come sorted by (a, b) and are links of the network.
        assert!(forest.lanes.windows(2).all(|w| w[0] < w[1]));
    }
}

#[test]
fn routes_match_an_independent_dijkstra() {
    let cat = sector(13, 40.0);
    let systems = Systems::from_catalogue(&cat);
    let p = &systems.positions_ly;
    let jump = 8.0;
    let net = JumpNetwork::build(p, jump);
    let adj = net.adjacency();
    let n = p.len();
    // Avoid every fifth system (other than the ends).
    let avoid = |v: usize| v % 5 == 3;
    let mut checked = 0;
    for t in 0..12usize {
        let from = (t * 37) % n;
        let to = (t * 101 + 17) % n;
        for by in [RouteBy::Distance, RouteBy::Jumps] {
            for use_avoid in [false, true] {
                let allowed = |v: usize| !use_avoid || !avoid(v);
                let want = reference_dijkstra(p, jump, from, to, by == RouteBy::Jumps, &allowed);
                let got = shortest_route(&adj, p, from as u32, to as u32, by, &|v| {
                    allowed(v as usize)
                });
                match (want, got) {
                    (None, None) => {}
                    (Some((jumps, d)), Some(r)) => {
                        checked += 1;
                        assert_eq!(r.systems[0] as usize, from);
                        assert_eq!(*r.systems.last().unwrap() as usize, to);
                        for w in r.systems.windows(2) {
                            assert!(dist(&p[w[0] as usize], &p[w[1] as usize]) <= jump);
                        }
                        for &v in &r.systems[1..r.systems.len().saturating_sub(1)] {
                            assert!(allowed(v as usize), "route passes an avoided system");
                        }
                        assert!((r.distance_ly - d).abs() <= 1e-9 * d.max(1.0));
                        if by == RouteBy::Jumps {
                            assert_eq!(r.jumps(), jumps);
                        }
                    }
                    (w, g) => panic!("{from}->{to} {by:?}: reference {w:?}, got {g:?}"),
                }
            }
        }
    }
    assert!(checked > 10, "only {checked} routes found");
}

#[test]
fn connecting_range_matches_a_complete_graph_kruskal() {
    let cat = sector(14, 40.0);
    let systems = Systems::from_catalogue(&cat);
    let p = &systems.positions_ly;
    let n = p.len();
    let net = JumpNetwork::build(p, 3.0);
    let mut all = brute_pairs(p, f64::INFINITY);
    all.sort_by(|a, b| a.2.total_cmp(&b.2));
    for t in 0..6usize {
        let (from, to) = ((t * 53) % n, (t * 211 + 5) % n);
        if from == to {
            continue;
        }
        let mut dsu = Dsu::new(n);
        let mut want = f64::NAN;
        for &(i, j, d) in &all {
            dsu.join(i, j);
            if dsu.find(from) == dsu.find(to) {
                want = d;
                break;
            }
        }
        let got = connecting_jump_ly(&net, p, from as u32, to as u32, &|_| true);
        assert_eq!(got, want, "{from}->{to}");
        // With exactly that range a route exists; a hair less, none.
        let at = JumpNetwork::build(p, got);
        assert!(
            shortest_route(
                &at.adjacency(),
                p,
                from as u32,
                to as u32,
                RouteBy::Jumps,
                &|_| true
            )
            .is_some()
        );
        let below = JumpNetwork::build(p, got * (1.0 - 1e-9));
        assert!(
            shortest_route(
                &below.adjacency(),
                p,
                from as u32,
                to as u32,
                RouteBy::Jumps,
                &|_| { true }
            )
            .is_none()
        );
    }
}

#[test]
fn same_links_whatever_the_thread_count() {
    let cat = sector(15, 40.0);
    let systems = Systems::from_catalogue(&cat);
    let run = |threads: usize| {
        rayon::ThreadPoolBuilder::new()
            .num_threads(threads)
            .build()
            .unwrap()
            .install(|| {
                let net = JumpNetwork::build(&systems.positions_ly, 7.0);
                let f = net.spanning_forest();
                (net.links, f.lanes, f.lanes_ly.to_bits())
            })
    };
    assert_eq!(run(1), run(3));
}

/// A catalogue of single stars at hand-picked positions (x, y in ly).
fn hand_catalogue(points: &[(&str, f64, f64)]) -> Catalogue {
    let mut cat = Catalogue::default();
    for (i, &(name, x, y)) in points.iter().enumerate() {
        let profile = star_profile(
            &StarRequest {
                mass: SolarMasses::new(1.0).unwrap(),
                age: Gigayears::new(4.6).unwrap(),
                kind: KindChoice::Auto,
            },
            Fidelity::Fitted,
        );
        cat.push(StarRow {
            id: 100 + i as u64,
            system: 100 + i as u64,
            name: name.to_string(),
            position_ly: [x, y, 0.0],
            profile,
            separation_au: 0.0,
            period_days: 0.0,
            origin: Default::default(),
        });
    }
    cat
}

/// The hand graph, jump 2.4 ly (distances worked out by hand):
/// A(0,0) B1(4/3,0) B2(8/3,0) C(4,0) on a straight line, 4/3 ly apart;
/// E(2,1.2) with A–E = E–C = √5.44 = 2.3324; F(2,−1) with A–F = F–C =
/// √5 = 2.2361; Z(20,0) far away. Shortest by distance: A B1 B2 C, 4 ly,
/// 3 jumps. Fewest jumps: two 2-jump routes, A F C (4.4721 ly) beats
/// A E C (4.6648 ly) on distance.
fn hand_graph() -> (Catalogue, Systems, JumpNetwork) {
    let cat = hand_catalogue(&[
        ("Ash", 0.0, 0.0),
        ("Birch", 4.0 / 3.0, 0.0),
        ("Bramble", 8.0 / 3.0, 0.0),
        ("Cedar", 4.0, 0.0),
        ("Elm", 2.0, 1.2),
        ("Fern", 2.0, -1.0),
        ("Zelkova", 20.0, 0.0),
    ]);
    let systems = Systems::from_catalogue(&cat);
    let net = JumpNetwork::build(&systems.positions_ly, 2.4);
    (cat, systems, net)
}

#[test]
fn hand_graph_routes() {
    let (_, systems, net) = hand_graph();
    let p = &systems.positions_ly;
    let adj = net.adjacency();
    let r = shortest_route(&adj, p, 0, 3, RouteBy::Distance, &|_| true).unwrap();
    assert_eq!(r.systems, vec![0, 1, 2, 3]);
    assert!((r.distance_ly - 4.0).abs() < 1e-12);
    let r = shortest_route(&adj, p, 0, 3, RouteBy::Jumps, &|_| true).unwrap();
    assert_eq!(r.systems, vec![0, 5, 3], "ties on jumps go to the shorter");
    assert!((r.distance_ly - 2.0 * 5f64.sqrt()).abs() < 1e-12);
    // Avoiding Fern leaves A E C for the fewest jumps.
    let r = shortest_route(&adj, p, 0, 3, RouteBy::Jumps, &|n| n != 5).unwrap();
    assert_eq!(r.systems, vec![0, 4, 3]);
    assert!((r.distance_ly - 2.0 * 5.44f64.sqrt()).abs() < 1e-12);
    // Zelkova is 16 ly from Cedar, the nearest system to it.
    assert!(shortest_route(&adj, p, 0, 6, RouteBy::Distance, &|_| true).is_none());
    assert_eq!(connecting_jump_ly(&net, p, 0, 6, &|_| true), 16.0);
    // A start that is its own end is a route of no jumps.
    let r = shortest_route(&adj, p, 2, 2, RouteBy::Distance, &|_| true).unwrap();
    assert_eq!((r.systems.len(), r.jumps()), (1, 0));
}

#[test]
fn hand_graph_network() {
    let (_, _, net) = hand_graph();
    // Links (by hand): A–B1, B1–B2, B2–C (4/3 each); A–E, E–C (2.3324);
    // A–F, F–C (2.2361); B1–E, B2–E: √(0.444+1.44) = 1.3727; B1–F, B2–F:
    // √(0.444+1) = 1.2019; B1–B2 already counted; A–B2, B1–C: 2.667 > 2.4.
    // E–F: 2.2 ≤ 2.4. Total 12 links.
    assert_eq!(net.links.len(), 12);
    let f = net.spanning_forest();
    let s = net.summary(&f);
    assert_eq!((s.systems, s.regions, s.isolated_systems), (7, 2, 1));
    assert_eq!(s.largest_region, 6);
    // Lanes: F–B1, F–B2 (1.2019 each) join B1, B2, F; then A–B1 and
    // B2–C (4/3 each) bring in A and C; E–B1 (1.3727) brings in E.
    let lanes = 2.0 * (4.0f64 / 9.0 + 1.0).sqrt() + 2.0 * 4.0 / 3.0 + (4.0f64 / 9.0 + 1.44).sqrt();
    assert!(
        (s.lanes_ly - lanes).abs() < 1e-12,
        "{} vs {lanes}",
        s.lanes_ly
    );
}

#[test]
fn names_and_ids_resolve_with_suggestions() {
    let (cat, _, _) = hand_graph();
    assert_eq!(resolve_system(&cat, "cedar").unwrap().primary_row, 3);
    assert_eq!(resolve_system(&cat, "103").unwrap().system_id, 103);
    let err = resolve_system(&cat, "Cedr").unwrap_err().to_string();
    assert!(err.contains("did you mean Cedar"), "{err}");
    let err = resolve_system(&cat, "Quux").unwrap_err().to_string();
    assert!(err.contains("'Quux' is not in the catalogue"), "{err}");
    // A generated companion resolves to its system's primary.
    let big = sector(16, 30.0);
    let r = (1..big.len())
        .find(|&r| big.system[r] == big.system[r - 1])
        .expect("some multiple system");
    let m = resolve_system(&big, &big.name[r]).unwrap();
    assert_eq!(m.system_id, big.system[r]);
    assert!(m.primary_row < r && big.system[m.primary_row] == big.system[r]);
}

#[test]
fn overlay_uses_primary_rows() {
    let (cat, _, net) = hand_graph();
    let o = map_overlay(&cat, 2.4, false, Some(("Ash", "cedar"))).unwrap();
    assert_eq!(o.links.len(), net.links.len());
    assert_eq!(o.route, vec![0, 1, 2, 3]);
    let o = map_overlay(&cat, 2.4, true, None).unwrap();
    assert_eq!(o.links.len(), 5);
    assert!(map_overlay(&cat, 2.4, false, Some(("Ash", "Zelkova"))).is_err());
    assert!(map_overlay(&cat, -1.0, false, None).is_err());
    assert!(map_overlay(&cat, f64::NAN, false, None).is_err());
}
