//! Sector summary statistics: counts by kind and class, stars and
//! systems, density, multiplicity, habitable-host candidates and
//! nearest-neighbour distances between systems.

use crate::catalogue::Catalogue;
use crate::physics::StarKind;
use serde::Serialize;
use std::collections::BTreeMap;

/// The summary of one catalogue (serialised as the `summary --json` output).
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Summary {
    /// Rows (stars, remnants and brown dwarfs).
    pub objects: u64,
    /// Rows that are not brown dwarfs.
    pub stars: u64,
    /// Brown dwarfs.
    pub brown_dwarfs: u64,
    /// Systems.
    pub systems: u64,
    /// Kind name → count.
    pub by_kind: BTreeMap<String, u64>,
    /// Main-sequence class letter → count.
    pub main_sequence_by_class: BTreeMap<String, u64>,
    /// Volume used for densities, cubic light years (the bounding box of
    /// the positions unless the caller gives the sector's own volume).
    pub volume_ly3: f64,
    /// Stars per cubic light year.
    pub star_density_per_ly3: f64,
    /// Share of systems with more than one member.
    pub multiplicity_fraction: f64,
    /// Mean companions per system.
    pub companions_per_system: f64,
    /// Stars flagged as habitable-host candidates (a simplified model).
    pub habitable_hosts: u64,
    /// Mean nearest-neighbour distance between systems, light years.
    pub nearest_neighbour_mean_ly: f64,
    /// Median nearest-neighbour distance between systems, light years.
    pub nearest_neighbour_median_ly: f64,
    /// Poisson expectation of the mean, 0.55396 n^(-1/3) for system
    /// density n (Chandrasekhar 1943, Rev. Mod. Phys. 15, 1, from memory;
    /// coefficient Γ(4/3)(3/(4π))^(1/3) derived), light years.
    pub nearest_neighbour_poisson_mean_ly: f64,
}

/// Summarises `cat`; `volume_ly3` overrides the bounding-box volume.
pub fn summarise(cat: &Catalogue, volume_ly3: Option<f64>) -> Summary {
    let mut by_kind = BTreeMap::new();
    let mut by_class = BTreeMap::new();
    let (mut stars, mut bds, mut hab) = (0u64, 0u64, 0u64);
    for i in 0..cat.len() {
        let k = cat.kind[i];
        *by_kind.entry(k.as_str().to_string()).or_insert(0) += 1;
        if k == StarKind::BrownDwarf {
            bds += 1;
        } else {
            stars += 1;
        }
        if k == StarKind::MainSequence {
            *by_class
                .entry(cat.class[i].letter().to_string())
                .or_insert(0) += 1;
        }
        hab += cat.habitable_host[i] as u64;
    }
    let ranges = cat.system_ranges();
    let systems = ranges.len() as u64;
    let multiples = ranges.iter().filter(|r| r.len() > 1).count() as u64;
    let volume = volume_ly3.unwrap_or_else(|| {
        let span = |v: &[f64]| {
            let lo = v.iter().cloned().fold(f64::INFINITY, f64::min);
            let hi = v.iter().cloned().fold(f64::NEG_INFINITY, f64::max);
            (hi - lo).max(0.0)
        };
        span(&cat.x_ly) * span(&cat.y_ly) * span(&cat.z_ly)
    });
    let points: Vec<[f64; 3]> = ranges.iter().map(|r| cat.position_ly(r.start)).collect();
    let mut nn = nearest_neighbour_distances(&points);
    nn.sort_by(f64::total_cmp);
    // With fewer than two systems there is no neighbour: 0, not NaN.
    nn.retain(|d| d.is_finite());
    let mean = if nn.is_empty() {
        0.0
    } else {
        nn.iter().sum::<f64>() / nn.len() as f64
    };
    let median = if nn.is_empty() { 0.0 } else { nn[nn.len() / 2] };
    // An empty catalogue has no volume of its own: densities are 0 then.
    let per_volume = |n: u64| {
        if volume > 0.0 && volume.is_finite() {
            n as f64 / volume
        } else {
            0.0
        }
    };
    let n_sys = per_volume(systems);
    Summary {
        objects: cat.len() as u64,
        stars,
        brown_dwarfs: bds,
        systems,
        by_kind,
        main_sequence_by_class: by_class,
        volume_ly3: volume,
        star_density_per_ly3: per_volume(stars),
        multiplicity_fraction: if systems > 0 {
            multiples as f64 / systems as f64
        } else {
            0.0
        },
        companions_per_system: if systems > 0 {
            (cat.len() as u64 - systems) as f64 / systems as f64
        } else {
            0.0
        },
        habitable_hosts: hab,
        nearest_neighbour_mean_ly: mean,
        nearest_neighbour_median_ly: median,
        nearest_neighbour_poisson_mean_ly: if n_sys > 0.0 {
            0.553_96 * n_sys.powf(-1.0 / 3.0)
        } else {
            0.0
        },
    }
}

/// Distance from each point to its nearest other point, light years.
pub fn nearest_neighbour_distances(points: &[[f64; 3]]) -> Vec<f64> {
    use kiddo::{ImmutableKdTree, SquaredEuclidean};
    use rayon::prelude::*;
    if points.len() < 2 {
        return Vec::new();
    }
    let Ok(tree) = ImmutableKdTree::<f64, 3>::new_from_slice_parallel(points) else {
        return Vec::new();
    };
    let two = std::num::NonZeroUsize::new(2).expect("2 is not zero");
    points
        .par_iter()
        .map(|p| {
            let res = tree
                .query(p)
                .nearest_n::<SquaredEuclidean<f64>>(two)
                .execute();
            res.get(1).map(|r| r.distance.sqrt()).unwrap_or(f64::NAN)
        })
        .collect()
}
/// The summary as readable text, one fact per line (what `summary`
/// prints without `--json`).
pub fn summary_text(cat: &Catalogue, s: &Summary) -> String {
    use std::fmt::Write as _;
    let mut out = String::new();
    if let Some(t) = &cat.meta.title {
        let _ = writeln!(out, "{t}");
    }
    let _ = writeln!(
        out,
        "{}: {}, {}, in {}",
        counted(s.objects, "object", "objects"),
        counted(s.stars, "star", "stars"),
        counted(s.brown_dwarfs, "brown dwarf", "brown dwarfs"),
        counted(s.systems, "system", "systems")
    );
    let _ = writeln!(
        out,
        "volume {:.4e} ly³, {:.5} stars per ly³",
        s.volume_ly3, s.star_density_per_ly3
    );
    let _ = writeln!(
        out,
        "multiple systems {:.1} %, {:.3} companions per system",
        100.0 * s.multiplicity_fraction,
        s.companions_per_system
    );
    let _ = writeln!(out, "by kind:");
    for (k, n) in &s.by_kind {
        let _ = writeln!(
            out,
            "  {k:<18} {n:>10}  {:>6.2} %",
            100.0 * *n as f64 / s.objects.max(1) as f64
        );
    }
    let ms: u64 = s.main_sequence_by_class.values().sum();
    let _ = writeln!(out, "main sequence by class:");
    for (c, n) in &s.main_sequence_by_class {
        let _ = writeln!(
            out,
            "  {c:<18} {n:>10}  {:>6.2} %",
            100.0 * *n as f64 / ms.max(1) as f64
        );
    }
    let _ = writeln!(
        out,
        "habitable-host candidates (simplified model, for fiction): {}",
        s.habitable_hosts
    );
    if s.systems < 2 {
        let _ = writeln!(out, "nearest system: none (fewer than two systems)");
        return out;
    }
    let _ = writeln!(
        out,
        "nearest system: mean {:.2} ly, median {:.2} ly (random placement expects a mean of {:.2} ly)",
        s.nearest_neighbour_mean_ly,
        s.nearest_neighbour_median_ly,
        s.nearest_neighbour_poisson_mean_ly
    );
    out
}

/// `n` and the noun that goes with it: `1 star`, `2 stars`, `0 stars`
/// (for the messages and reports the program prints).
pub fn counted(n: impl Into<u64>, one: &str, many: &str) -> String {
    let n = n.into();
    format!("{n} {}", if n == 1 { one } else { many })
}

#[cfg(test)]
mod counted_tests {
    use super::counted;

    #[test]
    fn counts_take_the_singular_only_for_one() {
        assert_eq!(counted(0u64, "star", "stars"), "0 stars");
        assert_eq!(counted(1u64, "star", "stars"), "1 star");
        assert_eq!(counted(2u64, "star", "stars"), "2 stars");
        assert_eq!(
            counted(1u32, "brown dwarf", "brown dwarfs"),
            "1 brown dwarf"
        );
    }
}
