//! Coordinate frames: ICRS (J2000 equatorial) to galactic, and galactic
//! cartesian light years to galactic longitude and latitude.
//!
//! Galactic cartesian axes: +x toward the Galactic centre (l = 0°, b = 0°),
//! +y toward l = 90°, +z toward the north Galactic pole.
//!
//! # Source
//! Rotation matrix A_G: Hipparcos Catalogue Vol. 1, §1.5.3, eq. 1.5.11
//! (ESA SP-1200, 1997), 16-digit form as in the Gaia DR3 documentation
//! (Hobbs et al. 2021, ch. 4): r_gal = A_G · r_icrs.

use nalgebra::{Matrix3, Vector3};

/// The ICRS → galactic rotation, rows as used for r_gal = A · r_icrs.
// The digits are kept as published, beyond f64 precision.
#[allow(clippy::excessive_precision)]
pub const ICRS_TO_GALACTIC: [[f64; 3]; 3] = [
    [
        -0.054_875_560_416_215_4,
        -0.873_437_090_234_885_0,
        -0.483_835_015_548_713_2,
    ],
    [
        0.494_109_427_875_583_7,
        -0.444_829_629_960_011_2,
        0.746_982_244_497_218_9,
    ],
    [
        -0.867_666_149_019_004_7,
        -0.198_076_373_431_201_5,
        0.455_983_776_175_066_9,
    ],
];

fn rotation() -> Matrix3<f64> {
    let a = ICRS_TO_GALACTIC;
    Matrix3::new(
        a[0][0], a[0][1], a[0][2], a[1][0], a[1][1], a[1][2], a[2][0], a[2][1], a[2][2],
    )
}

/// Galactic cartesian position (in the unit of `distance`) of a point at
/// ICRS right ascension and declination (degrees) and a distance.
pub fn icrs_to_galactic_cartesian(ra_deg: f64, dec_deg: f64, distance: f64) -> [f64; 3] {
    let (ra, dec) = (ra_deg.to_radians(), dec_deg.to_radians());
    let r = Vector3::new(dec.cos() * ra.cos(), dec.cos() * ra.sin(), dec.sin());
    let g = rotation() * r * distance;
    [g.x, g.y, g.z]
}

/// ICRS right ascension and declination (degrees) of a galactic
/// longitude and latitude (degrees); the inverse rotation is the transpose.
pub fn galactic_to_icrs(l_deg: f64, b_deg: f64) -> (f64, f64) {
    let (l, b) = (l_deg.to_radians(), b_deg.to_radians());
    let g = Vector3::new(b.cos() * l.cos(), b.cos() * l.sin(), b.sin());
    let r = rotation().transpose() * g;
    let ra = r.y.atan2(r.x).to_degrees().rem_euclid(360.0);
    (ra, r.z.clamp(-1.0, 1.0).asin().to_degrees())
}

/// Galactic longitude and latitude (degrees, l in [0, 360)) of a direction
/// given as a galactic cartesian vector (any length but zero).
pub fn direction_to_lb(v: [f64; 3]) -> (f64, f64) {
    let r = (v[0] * v[0] + v[1] * v[1] + v[2] * v[2]).sqrt();
    let l = v[1].atan2(v[0]).to_degrees().rem_euclid(360.0);
    let b = (v[2] / r).clamp(-1.0, 1.0).asin().to_degrees();
    (l, b)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn lb_of(ra: f64, dec: f64) -> (f64, f64) {
        direction_to_lb(icrs_to_galactic_cartesian(ra, dec, 1.0))
    }

    fn close_deg(a: f64, b: f64, tol: f64) -> bool {
        let d = (a - b).rem_euclid(360.0);
        d.min(360.0 - d) < tol
    }

    #[test]
    fn icrs_to_galactic_check_values() {
        // Check values computed with astropy 8.0.2 (SkyCoord icrs → galactic);
        // tolerance 2e-4 degrees (about 1e-6 rad; the Hipparcos matrix and
        // astropy's Galactic frame differ by ≤ 1e-7 rad, derived).
        let (l, b) = lb_of(266.40499, -28.93617); // Galactic centre.
        assert!(close_deg(l, 0.0, 2e-4) && b.abs() < 2e-4, "{l} {b}");
        let (_, b) = lb_of(192.85948, 27.12825); // North Galactic pole.
        assert!((b - 90.0).abs() < 2e-4);
        let (l, b) = lb_of(0.0, 90.0); // North celestial pole.
        assert!(close_deg(l, 122.9319, 2e-4) && (b - 27.1283).abs() < 2e-4);
        let (l, b) = lb_of(0.0, 0.0);
        assert!(close_deg(l, 96.3373, 2e-4) && (b + 60.1886).abs() < 2e-4);
        let (l, b) = lb_of(180.0, 45.0);
        assert!(close_deg(l, 149.4805, 2e-4) && (b - 69.3841).abs() < 2e-4);
        let (ra, dec) = galactic_to_icrs(90.0, 0.0);
        assert!(close_deg(ra, 318.0044, 2e-4) && (dec - 48.3296).abs() < 2e-4);
    }
}
