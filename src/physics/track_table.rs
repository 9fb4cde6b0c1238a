//! Precomputed main-sequence values and evolutionary tracks on a fine grid
//! of initial mass, interpolated per star.
//!
//! Computing a track from the fitting formulae costs a few dozen `powf`
//! calls; a population of 10^6 stars asks for the same smooth functions
//! of mass again and again. The table holds about 5600 nodes from 0.075
//! to 150 Msun, 512 per octave (relative step 0.14–0.2 %), built once on
//! first use (a few milliseconds), and a star interpolates linearly in
//! mass between its two neighbours. Interpolation error is below 1e-4
//! relative for the smooth parts, a few 1e-4 next to the kinks of the
//! main-sequence prescription at 1 and 2 Msun and up to 2e-3 next to the
//! end of the ignition ramp at M_FGB (tested against the direct formulae). Nodes either side of
//! the white-dwarf threshold are never mixed: that cell is computed
//! directly. Only the default remnant thresholds use the table.
//!
//! # Allocations
//! One boxed slice, once per process.

use std::sync::LazyLock;

use super::evolution::{M_EC_MSUN, RemnantThresholds, Track};
use super::main_sequence;

const MIN_MSUN: f64 = 0.075;
const MAX_MSUN: f64 = 150.0;
/// Nodes are spaced by 2^-9 of an octave: mass bits step by 1 << SHIFT.
const SHIFT: u32 = 52 - 9;
/// The bits of the first node, at or just below MIN_MSUN.
const FIRST_BITS: u64 = (MIN_MSUN.to_bits() >> SHIFT) << SHIFT;
/// Number of nodes: the last one is at or just above MAX_MSUN.
const N_NODES: usize = (((MAX_MSUN.to_bits() - FIRST_BITS) >> SHIFT) + 2) as usize;

/// Main-sequence quantities of one mass, in the form the hot path uses,
/// with what a remnant needs from its track: one 64-byte cache line.
#[derive(Debug, Clone, Copy, PartialEq)]
#[repr(C, align(64))]
pub struct MainSequenceNode {
    /// ln L_ZAMS (Lsun).
    pub ln_l_zams: f64,
    /// ln R_ZAMS (Rsun).
    pub ln_r_zams: f64,
    /// ln(L_TMS / L_ZAMS).
    pub dln_l: f64,
    /// ln(R_TMS / R_ZAMS).
    pub dln_r: f64,
    /// Main-sequence lifetime, Gyr.
    pub t_ms_gyr: f64,
    /// End of the last burning stage, Gyr ([`Track::t_end_gyr`]).
    pub t_end_gyr: f64,
    /// Mass of the white dwarf left behind, Msun; 0 for a star that leaves
    /// a neutron star or a black hole.
    pub white_dwarf_msun: f64,
    /// Radius of that white dwarf, Rsun.
    pub white_dwarf_rsun: f64,
}

impl MainSequenceNode {
    fn new(m: f64, track: &Track) -> MainSequenceNode {
        MainSequenceNode {
            ln_l_zams: main_sequence::zams_luminosity_lsun(m).ln(),
            ln_r_zams: main_sequence::zams_radius_rsun(m).ln(),
            dln_l: main_sequence::delta_log_l_tms(m) * std::f64::consts::LN_10,
            dln_r: main_sequence::delta_log_r_tms(m) * std::f64::consts::LN_10,
            t_ms_gyr: main_sequence::t_ms_gyr(m),
            t_end_gyr: track.t_end_gyr,
            white_dwarf_msun: track.white_dwarf_msun(),
            white_dwarf_rsun: track.white_dwarf_rsun(),
        }
    }

    /// True when the star leaves a white dwarf.
    pub fn white_dwarf_progenitor(&self) -> bool {
        self.white_dwarf_msun > 0.0
    }

    /// Luminosity (Lsun) and radius (Rsun) at `age_gyr` on the main sequence.
    pub fn l_r(&self, age_gyr: f64) -> (f64, f64) {
        let (ln_l, ln_r) = self.ln_l_r(age_gyr);
        (ln_l.exp(), ln_r.exp())
    }

    /// ln L (Lsun) and ln R (Rsun) at `age_gyr` on the main sequence.
    #[inline]
    pub fn ln_l_r(&self, age_gyr: f64) -> (f64, f64) {
        let (shape_l, shape_r) = main_sequence::shapes(age_gyr / self.t_ms_gyr);
        (
            self.ln_l_zams + self.dln_l * shape_l,
            self.ln_r_zams + self.dln_r * shape_r,
        )
    }
}

/// Two neighbouring nodes and the weight of the upper one.
#[derive(Debug, Clone, Copy)]
pub struct Cell {
    lower: &'static MainSequenceNode,
    upper: &'static MainSequenceNode,
    weight: f64,
}

impl Cell {
    /// Linear interpolation of one quantity between the two nodes.
    #[inline]
    fn lerp(&self, f: impl Fn(&MainSequenceNode) -> f64) -> f64 {
        let a = f(self.lower);
        a + (f(self.upper) - a) * self.weight
    }

    /// Interpolated main-sequence lifetime, Gyr.
    #[inline]
    pub fn t_ms_gyr(&self) -> f64 {
        self.lerp(|n| n.t_ms_gyr)
    }

    /// Interpolated end of the last burning stage, Gyr (what
    /// [`track`] gives as `t_end_gyr` when [`Cell::same_remnant`] holds).
    #[inline]
    pub fn t_end_gyr(&self) -> f64 {
        self.lerp(|n| n.t_end_gyr)
    }

    /// Interpolated white-dwarf mass (Msun) and radius (Rsun).
    #[inline]
    pub fn white_dwarf(&self) -> (f64, f64) {
        (
            self.lerp(|n| n.white_dwarf_msun),
            self.lerp(|n| n.white_dwarf_rsun),
        )
    }

    /// True when both nodes leave the same kind of remnant (white dwarf or
    /// not): only then does [`track`] interpolate instead of computing directly.
    #[inline]
    pub fn same_remnant(&self) -> bool {
        self.lower.white_dwarf_progenitor() == self.upper.white_dwarf_progenitor()
    }

    /// True when the lower node leaves a white dwarf.
    #[inline]
    pub fn white_dwarf_progenitor(&self) -> bool {
        self.lower.white_dwarf_progenitor()
    }

    /// The fully interpolated node.
    pub fn node(&self) -> MainSequenceNode {
        MainSequenceNode {
            ln_l_zams: self.lerp(|n| n.ln_l_zams),
            ln_r_zams: self.lerp(|n| n.ln_r_zams),
            dln_l: self.lerp(|n| n.dln_l),
            dln_r: self.lerp(|n| n.dln_r),
            t_ms_gyr: self.lerp(|n| n.t_ms_gyr),
            t_end_gyr: self.lerp(|n| n.t_end_gyr),
            white_dwarf_msun: self.lerp(|n| n.white_dwarf_msun),
            white_dwarf_rsun: self.lerp(|n| n.white_dwarf_rsun),
        }
    }
}

struct Table {
    main_sequence: Box<[MainSequenceNode]>,
    tracks: Box<[Track]>,
}

static TABLE: LazyLock<Table> = LazyLock::new(|| {
    let thresholds = RemnantThresholds::default();
    let tracks: Box<[Track]> = (0..N_NODES)
        .map(|i| Track::new(node_mass(i), &thresholds))
        .collect();
    Table {
        main_sequence: (0..N_NODES)
            .map(|i| MainSequenceNode::new(node_mass(i), &tracks[i]))
            .collect(),
        tracks,
    }
});

fn node_mass(i: usize) -> f64 {
    f64::from_bits(FIRST_BITS + ((i as u64) << SHIFT))
}

/// (index of the lower node, weight of the upper one) for a mass in range.
///
/// Nodes are read straight from the bits of the mass: within one octave the
/// mantissa is linear in the mass, so the upper bits give the node and the
/// lower bits the interpolation weight, without a logarithm.
#[inline]
fn cell_index(mass_msun: f64) -> (usize, f64) {
    let m = mass_msun.clamp(MIN_MSUN, MAX_MSUN);
    let offset = m.to_bits() - FIRST_BITS;
    let i = ((offset >> SHIFT) as usize).min(N_NODES - 2);
    let low = offset - ((i as u64) << SHIFT);
    (i, low as f64 * (1.0 / (1u64 << SHIFT) as f64))
}

/// The two nodes around a mass of 0.075–150 Msun.
#[inline]
pub fn cell(mass_msun: f64) -> Cell {
    let (i, weight) = cell_index(mass_msun);
    let nodes: &'static [MainSequenceNode] = &LazyLock::force(&TABLE).main_sequence;
    Cell {
        lower: &nodes[i],
        upper: &nodes[i + 1],
        weight,
    }
}

/// Interpolated main-sequence values for a mass of 0.075–150 Msun.
pub fn main_sequence_node(mass_msun: f64) -> MainSequenceNode {
    cell(mass_msun).node()
}

/// The track of a mass of 0.075–150 Msun for the default remnant thresholds.
pub fn track(mass_msun: f64) -> Track {
    let (i, w) = cell_index(mass_msun);
    let tracks = &TABLE.tracks;
    let (a, b) = (&tracks[i], &tracks[i + 1]);
    if a.white_dwarf_progenitor() != b.white_dwarf_progenitor()
        || (mass_msun - M_EC_MSUN).abs() < 1e-9
    {
        return Track::new(mass_msun, &RemnantThresholds::default());
    }
    let mut t = a.lerp(b, w);
    t.mass_msun = mass_msun;
    t
}

#[cfg(test)]
mod tests {
    use super::*;

    fn rel(a: f64, b: f64) -> f64 {
        (a / b - 1.0).abs()
    }

    #[test]
    fn cells_cover_the_range_and_interpolate_linearly_in_mass() {
        assert!(node_mass(0) <= MIN_MSUN && node_mass(N_NODES - 1) >= MAX_MSUN);
        assert!(node_mass(N_NODES - 2) <= MAX_MSUN);
        for m in [0.075, 0.1, 0.75, 1.0, 1.37, 2.0, 63.0, 150.0] {
            let (i, w) = cell_index(m);
            let back = node_mass(i) + w * (node_mass(i + 1) - node_mass(i));
            assert!((back / m - 1.0).abs() < 1e-15, "{m}");
            assert!((0.0..=1.0).contains(&w));
        }
    }

    #[test]
    fn table_matches_the_direct_formulae() {
        // Interpolation error across the whole range, including points between nodes.
        let th = RemnantThresholds::default();
        let mut m = 0.0751;
        while m < 150.0 {
            let node = main_sequence_node(m);
            let exact = MainSequenceNode::new(m, &Track::new(m, &th));
            assert!(rel(node.t_ms_gyr, exact.t_ms_gyr) < 1e-4, "{m}");
            for tau in [0.0, 0.5, 1.0] {
                let (l, r) = node.l_r(tau * exact.t_ms_gyr);
                let (l0, r0) = main_sequence::main_sequence_l_r(m, tau);
                // 5e-4: the kinks of ΔlogL at 1 and 2 Msun give up to ~2.5e-4 (module docs).
                assert!(rel(l, l0) < 5e-4 && rel(r, r0) < 5e-4, "{m} {tau}");
            }
            let (t, t0) = (track(m), Track::new(m, &th));
            for (a, b) in [
                (t.t_bgb_gyr, t0.t_bgb_gyr),
                (t.t_hei_gyr, t0.t_hei_gyr),
                (t.t_end_gyr, t0.t_end_gyr),
            ] {
                assert!(rel(a, b) < 1e-3, "{m}: {a} {b}");
            }
            let mid = 0.5 * (t0.t_hei_gyr + t0.t_che_end_gyr);
            let (s, s0) = (t.state_at(mid, &th), t0.state_at(mid, &th));
            // 3e-3: next to the steep ignition-ratio ramp ending at M_FGB (module docs).
            assert!(rel(s.luminosity_lsun, s0.luminosity_lsun) < 3e-3, "{m}");
            assert!(rel(s.radius_rsun, s0.radius_rsun) < 3e-3, "{m}");
            m *= 1.0037;
        }
    }
}
