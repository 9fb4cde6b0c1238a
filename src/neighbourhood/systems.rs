//! Grouping the extract's stars into systems.
//!
//! Hipparcos lists the resolved components of nearby multiple stars as
//! separate entries (α Cen A and B, 61 Cyg A and B, …) with independent
//! parallaxes. Two stars belong to one system when
//! - their projected separation, angle × mean distance, is at most
//!   [`MAX_PROJECTED_SEPARATION_AU`], and
//! - their distances agree within [`MAX_RADIAL_SIGMA`] combined standard
//!   errors (from the parallax errors), or within the same
//!   [`MAX_PROJECTED_SEPARATION_AU`].
//!
//! The rule is applied transitively (union–find). Chosen from the data:
//! the extract's close pairs thin out beyond about 12 000 au, Proxima lies
//! 10 000 au in projection from α Cen A/B and joins them (1.0 σ from α Cen B
//! in distance), while the next pairs out (by 11 800 au and more) differ
//! by 5.7 σ or more in distance. At the extract's density chance pairs
//! within the rule number well under one (our estimate).

use super::extract::HipparcosStar;

/// Largest projected separation between members of one system, au.
pub const MAX_PROJECTED_SEPARATION_AU: f64 = 15_000.0;

/// Largest distance difference between members, in combined standard errors.
pub const MAX_RADIAL_SIGMA: f64 = 3.0;

/// Astronomical units per parsec (648 000 / π; IAU 2015 B2 definition).
pub const AU_PER_PC: f64 = 648_000.0 / std::f64::consts::PI;

fn find_root(parent: &mut [usize], mut i: usize) -> usize {
    while parent[i] != i {
        parent[i] = parent[parent[i]];
        i = parent[i];
    }
    i
}

/// Angle between two stars, radians.
pub fn angle_rad(a: &HipparcosStar, b: &HipparcosStar) -> f64 {
    let (u, v) = (a.icrs_unit(), b.icrs_unit());
    // The cross-product form keeps small angles accurate.
    let c = [
        u[1] * v[2] - u[2] * v[1],
        u[2] * v[0] - u[0] * v[2],
        u[0] * v[1] - u[1] * v[0],
    ];
    let s = (c[0] * c[0] + c[1] * c[1] + c[2] * c[2]).sqrt();
    let d = u[0] * v[0] + u[1] * v[1] + u[2] * v[2];
    s.atan2(d)
}

/// True when `a` and `b` pass the pair rule of the module documentation.
pub fn are_companions(a: &HipparcosStar, b: &HipparcosStar) -> bool {
    let (da, db) = (a.distance_pc(), b.distance_pc());
    let projected_au = angle_rad(a, b) * 0.5 * (da + db) * AU_PER_PC;
    if projected_au > MAX_PROJECTED_SEPARATION_AU {
        return false;
    }
    let sa = da * a.e_plx_mas / a.plx_mas;
    let sb = db * b.e_plx_mas / b.plx_mas;
    let dd = (da - db).abs();
    dd <= MAX_RADIAL_SIGMA * sa.hypot(sb) || dd * AU_PER_PC <= MAX_PROJECTED_SEPARATION_AU
}

/// Groups of indices into `stars`, one per system. Within a group the
/// order is by `brightness` (smallest magnitude first, ties by HIP); the
/// groups are ordered by their primary's HIP number.
pub fn group_systems(stars: &[HipparcosStar], brightness: &[f64]) -> Vec<Vec<usize>> {
    let n = stars.len();
    let mut parent: Vec<usize> = (0..n).collect();
    // Sort by declination so only stars in a narrow band are compared.
    let mut order: Vec<usize> = (0..n).collect();
    order.sort_by(|&i, &j| stars[i].dec_deg.total_cmp(&stars[j].dec_deg));
    // 15 000 au at the nearest star of the extract (1.3 pc) is 3.2°.
    let band_deg = 3.5;
    for (k, &i) in order.iter().enumerate() {
        for &j in &order[k + 1..] {
            if stars[j].dec_deg - stars[i].dec_deg > band_deg {
                break;
            }
            if are_companions(&stars[i], &stars[j]) {
                let (ri, rj) = (find_root(&mut parent, i), find_root(&mut parent, j));
                if ri != rj {
                    parent[ri.max(rj)] = ri.min(rj);
                }
            }
        }
    }
    let mut groups: std::collections::BTreeMap<usize, Vec<usize>> = Default::default();
    for i in 0..n {
        let r = find_root(&mut parent, i);
        groups.entry(r).or_default().push(i);
    }
    let mut out: Vec<Vec<usize>> = groups
        .into_values()
        .map(|mut g| {
            g.sort_by(|&i, &j| {
                brightness[i]
                    .total_cmp(&brightness[j])
                    .then(stars[i].hip.cmp(&stars[j].hip))
            });
            g
        })
        .collect();
    out.sort_by_key(|g| stars[g[0]].hip);
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::neighbourhood::extract::{extract, find};

    #[test]
    fn known_multiples_are_grouped() {
        let stars = extract();
        let hp: Vec<f64> = stars.iter().map(|s| s.hp_mag).collect();
        let groups = group_systems(stars, &hp);
        let group_of = |hip: u32| {
            groups
                .iter()
                .find(|g| g.iter().any(|&i| stars[i].hip == hip))
                .map(|g| g.iter().map(|&i| stars[i].hip).collect::<Vec<_>>())
                .unwrap()
        };
        // α Centauri A, B and Proxima (HIP 71683, 71681, 70890), 61 Cygni A
        // and B (104214, 104217), Struve 2398 A and B (91768, 91772): known
        // physical systems (common knowledge; Proxima's bond to α Cen:
        // Kervella et al. 2017, A&A 598, L7, from memory).
        assert_eq!(group_of(71683), vec![71683, 71681, 70890]);
        assert_eq!(group_of(104214), vec![104214, 104217]);
        assert_eq!(group_of(91768), vec![91768, 91772]);
        // Sirius has no second Hipparcos entry; Barnard's star is single.
        assert_eq!(group_of(32349), vec![32349]);
        assert_eq!(group_of(87937), vec![87937]);
        // Every star is in exactly one group.
        assert_eq!(groups.iter().map(Vec::len).sum::<usize>(), stars.len());
    }

    #[test]
    fn pair_rule_check_values() {
        // α Cen A–B: 0.0032° apart at 1.29 pc → 25 au projected (hand
        // computation from the extract's coordinates).
        let (a, b) = (find(71683).unwrap(), find(71681).unwrap());
        let au = angle_rad(a, b) * 0.5 * (a.distance_pc() + b.distance_pc()) * AU_PER_PC;
        assert!((au - 25.0).abs() < 1.5, "{au}");
        assert!(are_companions(a, b));
        // Sirius and Procyon: far apart.
        assert!(!are_companions(find(32349).unwrap(), find(37279).unwrap()));
    }
}
