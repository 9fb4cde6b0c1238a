//! Travel between systems: nearest neighbours, jump networks, regions,
//! lanes and shortest routes.
//!
//! Everything works on **systems**: the members of a multiple system share
//! the primary's position and travel together. [`Systems`] lists them in
//! order of system id, so node `i` of every network is `Systems::ids[i]`,
//! and links sorted by node index are sorted by system id too.
//!
//! * [`spatial_index`]: a k-d tree (kiddo) with parallel queries.
//! * [`jump_graph`]: the jump network (a link joins two systems at most
//!   the jump range apart), its regions and its lanes (the minimum
//!   spanning forest).
//! * [`route_search`]: shortest routes by distance or by jumps (petgraph's
//!   A*), and the smallest jump range that would connect two systems.
//!
//! Distances are light years throughout.

pub mod jump_graph;
pub mod route_search;
pub mod spatial_index;

use crate::catalogue::Catalogue;
use crate::catalogue::number_format::{push_fixed, push_u64};
use crate::error::{Error, Result};
use crate::physics::StarKind;
use crate::render::overlay::Overlay;
pub use jump_graph::{JumpNetwork, Link, NetworkSummary, SpanningForest};
pub use route_search::{Route, RouteBy, connecting_jump_ly, shortest_route};
pub use spatial_index::{SpatialIndex, distance_ly};

/// The catalogue columns a route uses (besides ids, systems and
/// positions), for [`crate::catalogue::reader::read_catalogue_columns`];
/// the network, regions and lanes need only positions.
pub const CATALOGUE_COLUMNS: crate::catalogue::reader::Columns =
    crate::catalogue::reader::Columns::NAME.with(crate::catalogue::reader::Columns::KIND);

/// Decimals written for distances in CSV files (a micro light year).
pub const DISTANCE_DECIMALS: usize = 6;

/// The systems of a catalogue, sorted by system id.
#[derive(Debug, Clone, Default)]
pub struct Systems {
    /// System ids (the primaries' star ids), ascending.
    pub ids: Vec<u64>,
    /// Row of each system's primary in the catalogue.
    pub primary_rows: Vec<usize>,
    /// Row ranges of each system's members (primary first).
    pub rows: Vec<std::ops::Range<usize>>,
    /// Position of each system, light years.
    pub positions_ly: Vec<[f64; 3]>,
}

impl Systems {
    /// Lists the systems of `cat` (from [`Catalogue::system_ranges`]),
    /// sorted by system id (catalogue order among equal ids).
    pub fn from_catalogue(cat: &Catalogue) -> Systems {
        let mut ranges = cat.system_ranges();
        let sorted = ranges
            .windows(2)
            .all(|w| cat.system[w[0].start] <= cat.system[w[1].start]);
        if !sorted {
            ranges.sort_by_key(|r| (cat.system[r.start], r.start));
        }
        Systems {
            ids: ranges.iter().map(|r| cat.system[r.start]).collect(),
            primary_rows: ranges.iter().map(|r| r.start).collect(),
            positions_ly: ranges.iter().map(|r| cat.position_ly(r.start)).collect(),
            rows: ranges,
        }
    }

    /// Number of systems.
    pub fn len(&self) -> usize {
        self.ids.len()
    }

    /// True when there are none.
    pub fn is_empty(&self) -> bool {
        self.ids.is_empty()
    }

    /// The node index of system id `id`.
    pub fn index_of_id(&self, id: u64) -> Option<u32> {
        self.ids.binary_search(&id).ok().map(|i| i as u32)
    }

    /// The node index of the system that catalogue row `row` belongs to.
    pub fn index_of_row(&self, cat: &Catalogue, row: usize) -> Option<u32> {
        let id = cat.system.get(row)?;
        let first = self.ids.partition_point(|x| x < id);
        (first..self.ids.len())
            .take_while(|&i| self.ids[i] == *id)
            .find(|&i| self.rows[i].contains(&row))
            .map(|i| i as u32)
    }
}

/// A system found by [`resolve_system`].
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct SystemMatch {
    /// The system id (the primary's star id).
    pub system_id: u64,
    /// The catalogue row of the system's primary.
    pub primary_row: usize,
}

/// Finds a system from what a user typed: a system id, the id of any of
/// its stars, or the name of any of its stars (case-insensitive).
///
/// # Errors
/// [`Error::UnknownName`] with up to three close names when nothing
/// matches; [`Error::Usage`] when a name belongs to several systems.
pub fn resolve_system(cat: &Catalogue, text: &str) -> Result<SystemMatch> {
    let t = text.trim();
    let primary_of = |row: usize| {
        let id = cat.system[row];
        let mut r = row;
        while r > 0 && cat.system[r - 1] == id {
            r -= 1;
        }
        SystemMatch {
            system_id: id,
            primary_row: r,
        }
    };
    if let Ok(v) = t.parse::<u64>() {
        if let Some(row) = cat.system.iter().position(|&s| s == v) {
            return Ok(primary_of(row));
        }
        if let Some(row) = cat.id.iter().position(|&s| s == v) {
            return Ok(primary_of(row));
        }
    }
    let lower = t.to_lowercase();
    let same = |name: &str| {
        if name.is_ascii() && lower.is_ascii() {
            name.eq_ignore_ascii_case(&lower)
        } else {
            name.to_lowercase() == lower
        }
    };
    let mut found: Vec<SystemMatch> = Vec::new();
    for (row, name) in cat.name.iter().enumerate() {
        if same(name) {
            let m = primary_of(row);
            if !found.contains(&m) {
                found.push(m);
            }
        }
    }
    match found.len() {
        1 => Ok(found[0]),
        0 => Err(Error::UnknownName {
            what: "system".into(),
            given: t.to_string(),
            suggestion: suggestion_clause(&close_names(cat, &lower)),
        }),
        n => {
            let ids: Vec<String> = found
                .iter()
                .take(5)
                .map(|m| m.system_id.to_string())
                .collect();
            let more = if n > 5 { ", ..." } else { "" };
            Err(Error::Usage(format!(
                "the name '{t}' belongs to {n} systems (ids {}{more}); give a system id instead",
                ids.join(", ")
            )))
        }
    }
}

/// Up to three catalogue names closest to `lower` (already lowercase) by
/// edit distance, nearest first (ties in name order), within a third of
/// its length (at least 2).
pub(crate) fn close_names(cat: &Catalogue, lower: &str) -> Vec<String> {
    let target: Vec<char> = lower.chars().collect();
    let limit = (target.len() / 3).max(2);
    let mut best: Vec<(usize, String)> = Vec::new();
    let mut seen = std::collections::HashSet::new();
    for name in &cat.name {
        let len = name.chars().count();
        if len.abs_diff(target.len()) > limit || !seen.insert(name) {
            continue;
        }
        let cand: Vec<char> = name.to_lowercase().chars().collect();
        let d = edit_distance(&target, &cand);
        if d <= limit {
            best.push((d, name.to_string()));
        }
    }
    best.sort();
    best.dedup_by(|a, b| a.1 == b.1);
    best.into_iter().take(3).map(|(_, n)| n).collect()
}

/// "; did you mean A, B or C?" or empty.
fn suggestion_clause(names: &[String]) -> String {
    match names {
        [] => String::new(),
        [one] => format!("; did you mean {one}?"),
        [rest @ .., last] => format!("; did you mean {} or {last}?", rest.join(", ")),
    }
}

/// Levenshtein distance (insertions, deletions, substitutions).
pub(crate) fn edit_distance(a: &[char], b: &[char]) -> usize {
    let mut prev: Vec<usize> = (0..=b.len()).collect();
    let mut cur = vec![0; b.len() + 1];
    for (i, ca) in a.iter().enumerate() {
        cur[0] = i + 1;
        for (j, cb) in b.iter().enumerate() {
            let sub = prev[j] + usize::from(ca != cb);
            cur[j + 1] = sub.min(prev[j + 1] + 1).min(cur[j] + 1);
        }
        std::mem::swap(&mut prev, &mut cur);
    }
    prev[b.len()]
}

/// Checks a jump range: positive and finite.
pub fn check_jump_ly(option: &str, jump_ly: f64) -> Result<f64> {
    if jump_ly.is_finite() && jump_ly > 0.0 {
        Ok(jump_ly)
    } else {
        Err(Error::invalid(
            option,
            jump_ly,
            "it must be a positive, finite number of light years",
        ))
    }
}

/// Parses a comma-separated list of kinds (`white-dwarf,neutron-star`).
pub fn parse_kinds(option: &str, text: &str) -> Result<Vec<StarKind>> {
    let mut kinds = Vec::new();
    for part in text.split(',') {
        let p = part.trim().to_ascii_lowercase().replace(['_', ' '], "-");
        match StarKind::parse(&p) {
            Some(k) => {
                if !kinds.contains(&k) {
                    kinds.push(k);
                }
            }
            None => {
                return Err(Error::invalid(
                    option,
                    text,
                    format!(
                        "it must be a comma-separated list of kinds: {}",
                        StarKind::names()
                    ),
                ));
            }
        }
    }
    Ok(kinds)
}

/// For each system, whether its primary is of one of `kinds`.
pub fn systems_of_kinds(cat: &Catalogue, systems: &Systems, kinds: &[StarKind]) -> Vec<bool> {
    systems
        .primary_rows
        .iter()
        .map(|&r| kinds.contains(&cat.kind[r]))
        .collect()
}

/// The sentence for a route that does not exist. The range is rounded
/// up to a thousandth of a light year, so that the printed value itself
/// connects the two systems.
pub fn unreachable_sentence(from: &str, to: &str, jump_ly: f64, needed_ly: f64) -> String {
    let shown = (needed_ly * 1000.0 - 1e-6).ceil() / 1000.0;
    format!(
        "{to} cannot be reached from {from} with a jump range of {jump_ly} ly; the smallest jump range that connects them is {shown:.3} ly"
    )
}

/// The map overlay: the links of the jump network of range `jump_ly`
/// (only its lanes when `lanes_only`), and, for `route = Some((a, b))`,
/// the shortest route by distance from `a` to `b` (each a system id or a
/// star name, as [`resolve_system`] takes them). Links and route are
/// catalogue rows of the systems' primaries.
///
/// # Errors
/// A bad jump range or an unknown name (see [`resolve_system`]), and
/// [`Error::Usage`] when no route joins the two systems.
pub fn map_overlay(
    cat: &Catalogue,
    jump_ly: f64,
    lanes_only: bool,
    route: Option<(&str, &str)>,
) -> Result<Overlay> {
    check_jump_ly("--jump", jump_ly)?;
    let systems = Systems::from_catalogue(cat);
    let ends = match route {
        Some((a, b)) => Some((resolve_system(cat, a)?, resolve_system(cat, b)?)),
        None => None,
    };
    let network = JumpNetwork::build(&systems.positions_ly, jump_ly);
    let row_pair = |l: &Link| {
        [
            systems.primary_rows[l.a as usize],
            systems.primary_rows[l.b as usize],
        ]
    };
    let links = if lanes_only {
        let forest = network.spanning_forest();
        forest
            .lanes
            .iter()
            .map(|&k| row_pair(&network.links[k as usize]))
            .collect()
    } else {
        network.links.iter().map(row_pair).collect()
    };
    let mut path = Vec::new();
    if let Some((a, b)) = ends {
        let node = |m: &SystemMatch| {
            systems
                .index_of_row(cat, m.primary_row)
                .expect("a resolved system is in the system list")
        };
        let (na, nb) = (node(&a), node(&b));
        let adjacency = network.adjacency();
        match shortest_route(
            &adjacency,
            &systems.positions_ly,
            na,
            nb,
            RouteBy::Distance,
            &|_| true,
        ) {
            Some(r) => {
                path = r
                    .systems
                    .iter()
                    .map(|&n| systems.primary_rows[n as usize])
                    .collect()
            }
            None => {
                let needed = connecting_jump_ly(&network, &systems.positions_ly, na, nb, &|_| true);
                return Err(Error::Usage(unreachable_sentence(
                    &cat.name[a.primary_row],
                    &cat.name[b.primary_row],
                    jump_ly,
                    needed,
                )));
            }
        }
    }
    Ok(Overlay { links, route: path })
}

/// The neighbour table: for each system (in [`Systems`] order) up to `k`
/// nearest systems, or all within `within_ly`, or both limits, sorted by
/// (distance, system id).
pub fn neighbours(
    systems: &Systems,
    k: Option<usize>,
    within_ly: Option<f64>,
) -> Vec<Vec<(u32, f64)>> {
    SpatialIndex::new(&systems.positions_ly).nearest(k, within_ly)
}

/// Writes the neighbour table as CSV: `system,neighbour,rank,distance_ly`.
pub fn write_neighbours_csv(
    w: &mut impl std::io::Write,
    systems: &Systems,
    table: &[Vec<(u32, f64)>],
) -> std::io::Result<()> {
    w.write_all(b"system,neighbour,rank,distance_ly\n")?;
    let mut buf = Vec::with_capacity(1 << 16);
    for (i, row) in table.iter().enumerate() {
        for (rank, &(j, d)) in row.iter().enumerate() {
            push_u64(&mut buf, systems.ids[i]);
            buf.push(b',');
            push_u64(&mut buf, systems.ids[j as usize]);
            buf.push(b',');
            push_u64(&mut buf, rank as u64 + 1);
            buf.push(b',');
            push_fixed(&mut buf, d, DISTANCE_DECIMALS);
            buf.push(b'\n');
        }
        if buf.len() > 1 << 16 {
            w.write_all(&buf)?;
            buf.clear();
        }
    }
    w.write_all(&buf)
}

/// Writes links as CSV: `from_system,to_system,distance_ly` (system ids,
/// `from_system < to_system`), in the order given.
pub fn write_links_csv<'a>(
    w: &mut impl std::io::Write,
    systems: &Systems,
    links: impl IntoIterator<Item = &'a Link>,
) -> std::io::Result<()> {
    w.write_all(b"from_system,to_system,distance_ly\n")?;
    let mut buf = Vec::with_capacity(1 << 16);
    for l in links {
        push_u64(&mut buf, systems.ids[l.a as usize]);
        buf.push(b',');
        push_u64(&mut buf, systems.ids[l.b as usize]);
        buf.push(b',');
        push_fixed(&mut buf, l.distance_ly, DISTANCE_DECIMALS);
        buf.push(b'\n');
        if buf.len() > 1 << 16 {
            w.write_all(&buf)?;
            buf.clear();
        }
    }
    w.write_all(&buf)
}
