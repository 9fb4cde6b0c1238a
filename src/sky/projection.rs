//! All-sky map projections on the unit sphere, forward and inverse.
//!
//! Angles in radians; `lon` is measured from the chart's centre meridian
//! and wrapped to (−π, π]; `x` grows with longitude (the chart flips it so
//! that longitude increases to the left, as seen from inside the sphere).
//!
//! # Sources
//! - Mollweide, stereographic and equirectangular: Snyder, J. P. (1987),
//!   *Map Projections — A Working Manual*, USGS Professional Paper 1395:
//!   Mollweide eqs 31-1…31-7 (forward with the Newton step 31-4, inverse),
//!   stereographic eqs 21-2…21-4 (forward) and 20-18, 21-15, 20-14, 20-15
//!   (inverse), equirectangular eqs 12-1…12-4.
//! - Hammer (often called Hammer–Aitoff): Snyder, J. P. & Voxland, P. M.
//!   (1989), *An Album of Map Projections*, USGS Professional Paper 1453,
//!   p. 231 (forward and inverse formulas).

use std::f64::consts::{FRAC_PI_2, PI, SQRT_2};

/// A map projection of the whole sky.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Projection {
    /// Hammer equal-area projection, the usual all-sky chart: an ellipse
    /// 4√2 wide and 2√2 tall.
    HammerAitoff,
    /// Mollweide equal-area projection: an ellipse 4√2 × 2√2.
    Mollweide,
    /// Stereographic (conformal) projection centred on a direction; the
    /// chart shows the hemisphere around that centre, a disc of radius 2.
    Stereographic {
        /// Latitude of the centre, radians.
        centre_lat_rad: f64,
    },
    /// Equirectangular (plate carrée) projection on the equator: 2π × π.
    Equirectangular,
}

impl Projection {
    /// Names accepted on the command line.
    pub const NAMES: [&'static str; 4] = [
        "hammer-aitoff",
        "mollweide",
        "stereographic",
        "equirectangular",
    ];

    /// The command-line name.
    pub fn name(&self) -> &'static str {
        match self {
            Projection::HammerAitoff => "hammer-aitoff",
            Projection::Mollweide => "mollweide",
            Projection::Stereographic { .. } => "stereographic",
            Projection::Equirectangular => "equirectangular",
        }
    }

    /// A title-case name for chart legends.
    pub fn display_name(&self) -> &'static str {
        match self {
            Projection::HammerAitoff => "Hammer–Aitoff equal-area",
            Projection::Mollweide => "Mollweide equal-area",
            Projection::Stereographic { .. } => "stereographic",
            Projection::Equirectangular => "equirectangular",
        }
    }

    /// Half-width and half-height of the projected sky, projection units.
    pub fn half_extent(&self) -> (f64, f64) {
        match self {
            Projection::HammerAitoff | Projection::Mollweide => (2.0 * SQRT_2, SQRT_2),
            Projection::Stereographic { .. } => (2.0, 2.0),
            Projection::Equirectangular => (PI, FRAC_PI_2),
        }
    }

    /// Projects a point at `lon` from the centre meridian and latitude
    /// `lat` (radians). `None` when the point is outside the chart (the far
    /// hemisphere of a stereographic chart).
    pub fn forward(&self, lon: f64, lat: f64) -> Option<(f64, f64)> {
        let lon = wrap_pi(lon);
        match *self {
            Projection::HammerAitoff => Some(hammer_forward(lon, lat)),
            Projection::Mollweide => Some(mollweide_forward(lon, lat)),
            Projection::Stereographic { centre_lat_rad } => {
                let cos_c =
                    centre_lat_rad.sin() * lat.sin() + centre_lat_rad.cos() * lat.cos() * lon.cos();
                if cos_c < -1e-12 {
                    None
                } else {
                    Some(stereographic_forward(lon, lat, centre_lat_rad))
                }
            }
            Projection::Equirectangular => Some(equirectangular_forward(lon, lat)),
        }
    }

    /// The inverse: longitude from the centre meridian and latitude
    /// (radians) of a chart point; `None` outside the projected sky.
    pub fn inverse(&self, x: f64, y: f64) -> Option<(f64, f64)> {
        match *self {
            Projection::HammerAitoff => hammer_inverse(x, y),
            Projection::Mollweide => mollweide_inverse(x, y),
            Projection::Stereographic { centre_lat_rad } => {
                if x.hypot(y) > 2.0 + 1e-12 {
                    None
                } else {
                    Some(stereographic_inverse(x, y, centre_lat_rad))
                }
            }
            Projection::Equirectangular => equirectangular_inverse(x, y),
        }
    }
}

/// Wraps an angle to (−π, π].
pub fn wrap_pi(a: f64) -> f64 {
    let w = (a + PI).rem_euclid(2.0 * PI) - PI;
    if w <= -PI { w + 2.0 * PI } else { w }
}

/// Hammer forward (Snyder & Voxland 1989, p. 231):
/// x = 2√2 cos φ sin(λ/2) / D, y = √2 sin φ / D, D = √(1 + cos φ cos(λ/2)).
pub fn hammer_forward(lon: f64, lat: f64) -> (f64, f64) {
    let d = (1.0 + lat.cos() * (lon / 2.0).cos()).sqrt();
    (
        2.0 * SQRT_2 * lat.cos() * (lon / 2.0).sin() / d,
        SQRT_2 * lat.sin() / d,
    )
}

/// Hammer inverse (Snyder & Voxland 1989, p. 231):
/// z = √(1 − (x/4)² − (y/2)²), λ = 2 atan2(z x, 2(2z² − 1)), φ = asin(z y).
/// `None` outside the bounding ellipse (x/2√2)² + (y/√2)² ≤ 1.
pub fn hammer_inverse(x: f64, y: f64) -> Option<(f64, f64)> {
    if (x / (2.0 * SQRT_2)).powi(2) + (y / SQRT_2).powi(2) > 1.0 + 1e-12 {
        return None;
    }
    let z = (1.0 - (x / 4.0).powi(2) - (y / 2.0).powi(2))
        .max(0.0)
        .sqrt();
    let lon = 2.0 * (z * x).atan2(2.0 * (2.0 * z * z - 1.0));
    let lat = (z * y).clamp(-1.0, 1.0).asin();
    Some((lon, lat))
}

/// The auxiliary angle θ of the Mollweide projection, 2θ + sin 2θ = π sin φ,
/// by Newton's method on θ' = 2θ (Snyder 1987, eq. 31-4).
pub fn mollweide_theta(lat: f64) -> f64 {
    if (FRAC_PI_2 - lat.abs()) < 1e-12 {
        return lat.signum() * FRAC_PI_2;
    }
    let target = PI * lat.sin();
    let mut t = 2.0 * lat; // θ' = 2θ, starting from θ = φ
    for _ in 0..50 {
        let step = -(t + t.sin() - target) / (1.0 + t.cos());
        t += step;
        if step.abs() < 1e-14 {
            break;
        }
    }
    t / 2.0
}

/// Mollweide forward (Snyder 1987, eqs 31-1…31-3):
/// x = (2√2/π) λ cos θ, y = √2 sin θ.
pub fn mollweide_forward(lon: f64, lat: f64) -> (f64, f64) {
    let theta = mollweide_theta(lat);
    (2.0 * SQRT_2 / PI * lon * theta.cos(), SQRT_2 * theta.sin())
}

/// Mollweide inverse (Snyder 1987, eqs 31-5…31-7): θ = asin(y/√2),
/// φ = asin((2θ + sin 2θ)/π), λ = πx / (2√2 cos θ).
pub fn mollweide_inverse(x: f64, y: f64) -> Option<(f64, f64)> {
    if (x / (2.0 * SQRT_2)).powi(2) + (y / SQRT_2).powi(2) > 1.0 + 1e-12 {
        return None;
    }
    let theta = (y / SQRT_2).clamp(-1.0, 1.0).asin();
    let lat = ((2.0 * theta + (2.0 * theta).sin()) / PI)
        .clamp(-1.0, 1.0)
        .asin();
    let lon = if theta.cos() < 1e-15 {
        0.0
    } else {
        (PI * x / (2.0 * SQRT_2 * theta.cos())).clamp(-PI, PI)
    };
    Some((lon, lat))
}

/// Stereographic forward, R = k₀ = 1 (Snyder 1987, eqs 21-2…21-4):
/// k = 2 / (1 + sin φ₁ sin φ + cos φ₁ cos φ cos λ), x = k cos φ sin λ,
/// y = k (cos φ₁ sin φ − sin φ₁ cos φ cos λ). The antipode of the centre
/// has no image; it is returned far away (k capped).
pub fn stereographic_forward(lon: f64, lat: f64, centre_lat: f64) -> (f64, f64) {
    let (s1, c1) = centre_lat.sin_cos();
    let denom = (1.0 + s1 * lat.sin() + c1 * lat.cos() * lon.cos()).max(1e-12);
    let k = 2.0 / denom;
    (
        k * lat.cos() * lon.sin(),
        k * (c1 * lat.sin() - s1 * lat.cos() * lon.cos()),
    )
}

/// Stereographic inverse, R = k₀ = 1 (Snyder 1987, eqs 20-18, 21-15,
/// 20-14, 20-15): ρ = √(x² + y²), c = 2 atan(ρ/2),
/// φ = asin(cos c sin φ₁ + y sin c cos φ₁ / ρ),
/// λ = atan2(x sin c, ρ cos φ₁ cos c − y sin φ₁ sin c).
pub fn stereographic_inverse(x: f64, y: f64, centre_lat: f64) -> (f64, f64) {
    let rho = x.hypot(y);
    if rho < 1e-15 {
        return (0.0, centre_lat);
    }
    let (s1, c1) = centre_lat.sin_cos();
    let c = 2.0 * (rho / 2.0).atan();
    let (sc, cc) = c.sin_cos();
    let lat = (cc * s1 + y * sc * c1 / rho).clamp(-1.0, 1.0).asin();
    let lon = (x * sc).atan2(rho * c1 * cc - y * s1 * sc);
    (lon, lat)
}

/// Equirectangular forward on the equator (Snyder 1987, eqs 12-1, 12-2
/// with φ₁ = 0): x = λ, y = φ.
pub fn equirectangular_forward(lon: f64, lat: f64) -> (f64, f64) {
    (lon, lat)
}

/// Equirectangular inverse (Snyder 1987, eqs 12-3, 12-4 with φ₁ = 0).
pub fn equirectangular_inverse(x: f64, y: f64) -> Option<(f64, f64)> {
    if x.abs() > PI + 1e-12 || y.abs() > FRAC_PI_2 + 1e-12 {
        None
    } else {
        Some((x, y))
    }
}

#[cfg(test)]
// Check values are kept with the digits the reference library printed.
#[allow(clippy::approx_constant)]
mod tests {
    use super::*;

    fn d(a: f64) -> f64 {
        a.to_radians()
    }

    fn close(a: (f64, f64), b: (f64, f64), tol: f64) -> bool {
        (a.0 - b.0).abs() < tol && (a.1 - b.1).abs() < tol
    }

    #[test]
    fn hammer_check_values() {
        // Computed with pyproj 3.7.2 (PROJ 9.5.1), "+proj=hammer +R=1".
        let cases = [
            ((90.0, 0.0), (1.530733729, 0.0)),
            ((180.0, 0.0), (2.828427125, 0.0)),
            ((-120.0, -30.0), (-1.772071484, -0.590690495)),
            ((90.0, 45.0), (1.154700538, 0.816496581)),
            ((30.0, -60.0), (0.300570313, -1.005727868)),
            ((150.0, 75.0), (0.684550319, 1.322449666)),
        ];
        for ((lon, lat), xy) in cases {
            let got = hammer_forward(d(lon), d(lat));
            assert!(close(got, xy, 1e-8), "{lon},{lat}: {got:?}");
        }
        // The pole maps to (0, √2) (Snyder & Voxland 1989: the poles are
        // points at the ends of the ellipse's minor axis).
        assert!(close(hammer_forward(0.0, d(90.0)), (0.0, SQRT_2), 1e-12));
    }

    #[test]
    fn mollweide_check_values() {
        // Computed with pyproj 3.7.2 (PROJ 9.5.1), "+proj=moll +R=1".
        let cases = [
            ((90.0, 0.0), (1.414213562, 0.0)),
            ((180.0, 0.0), (2.828427125, 0.0)),
            ((-120.0, -30.0), (-1.724908773, -0.571303747)),
            ((90.0, 45.0), (1.139725025, 0.837273472)),
            ((30.0, -60.0), (0.305056444, -1.078176746)),
            ((150.0, 75.0), (0.997395723, 1.281355781)),
        ];
        for ((lon, lat), xy) in cases {
            let got = mollweide_forward(d(lon), d(lat));
            assert!(close(got, xy, 1e-8), "{lon},{lat}: {got:?}");
        }
        // Centre meridian 90° W, point (150° E, 35° S): λ − λ₀ = 240° wraps
        // to −120°; pyproj 3.7.2 "+proj=moll +R=1 +lon_0=-90" gives
        // (−1.6661706, −0.6621405).
        let got = Projection::Mollweide
            .forward(d(150.0 + 90.0), d(-35.0))
            .unwrap();
        assert!(close(got, (-1.6661706, -0.6621405), 1e-7), "{got:?}");
    }

    #[test]
    fn stereographic_check_values() {
        // Snyder (1987), Appendix A, numerical example for the
        // stereographic projection of the sphere: R = k₀ = 1, φ₁ = 40° N,
        // λ₀ = 100° W, point (30° N, 75° W) → x = 0.3807224, y = −0.1263802
        // (also reproduced with pyproj 3.7.2).
        let got = stereographic_forward(d(25.0), d(30.0), d(40.0));
        assert!(close(got, (0.3807224, -0.1263802), 1e-7), "{got:?}");
        // pyproj 3.7.2 "+proj=stere +lat_0=0 +lon_0=0 +k_0=1 +R=1".
        assert!(close(
            stereographic_forward(d(45.0), d(45.0), 0.0),
            (0.666666667, 0.942809042),
            1e-8
        ));
        assert!(close(
            stereographic_forward(d(90.0), 0.0, 0.0),
            (2.0, 0.0),
            1e-12
        ));
        assert!(close(
            stereographic_forward(0.0, d(45.0), 0.0),
            (0.0, 0.828427125),
            1e-8
        ));
        // pyproj 3.7.2 "+proj=stere +lat_0=-30 +lon_0=120 +k_0=1 +R=1".
        assert!(close(
            stereographic_forward(d(30.0), d(-10.0), d(-30.0)),
            (0.539493602, 0.302449886),
            1e-8
        ));
        assert!(close(
            stereographic_forward(d(-20.0), d(-60.0), d(-30.0)),
            (-0.185889449, -0.559893052),
            1e-8
        ));
        // pyproj 3.7.2 polar case "+lat_0=90": (0, 60° N) → (0, −0.5358984).
        assert!(close(
            stereographic_forward(0.0, d(60.0), d(90.0)),
            (0.0, -0.5358984),
            1e-7
        ));
    }

    #[test]
    fn equirectangular_check_values() {
        // Snyder (1987) eqs 12-1, 12-2 with φ₁ = 0: x = λ, y = φ (radians);
        // pyproj 3.7.2 "+proj=eqc +R=1" gives (−2.094395102, −0.523598776)
        // for (−120°, −30°).
        let got = equirectangular_forward(d(-120.0), d(-30.0));
        assert!(close(got, (-2.094395102, -0.523598776), 1e-8));
    }

    #[test]
    fn inverses_return_the_input() {
        // Round trips must return the input within 1e-9 rad (the inverse
        // equations cited in the module docs).
        let projections = [
            Projection::HammerAitoff,
            Projection::Mollweide,
            Projection::Equirectangular,
            Projection::Stereographic {
                centre_lat_rad: d(-30.0),
            },
            Projection::Stereographic {
                centre_lat_rad: d(40.0),
            },
        ];
        for p in projections {
            for lon_deg in (-170..=170).step_by(20) {
                for lat_deg in (-80..=80).step_by(20) {
                    let (lon, lat) = (d(f64::from(lon_deg)), d(f64::from(lat_deg)));
                    let Some((x, y)) = p.forward(lon, lat) else {
                        continue;
                    };
                    let (lon2, lat2) = p.inverse(x, y).expect("inside the chart");
                    assert!(
                        (wrap_pi(lon2 - lon)).abs() < 1e-9 && (lat2 - lat).abs() < 1e-9,
                        "{p:?} {lon_deg},{lat_deg} → {lon2},{lat2}"
                    );
                }
            }
        }
    }

    #[test]
    fn stereographic_hides_the_far_hemisphere() {
        let p = Projection::Stereographic {
            centre_lat_rad: 0.0,
        };
        assert!(p.forward(d(180.0), 0.0).is_none());
        assert!(p.forward(d(89.0), 0.0).is_some());
    }

    #[test]
    fn hammer_is_equal_area() {
        // An equal-area map of the unit sphere has area 4π (Snyder 1987,
        // ch. 3 on equal-area maps); integrate the Jacobian of the Hammer
        // forward map numerically over a grid of latitude bands.
        let n = 400;
        let mut area = 0.0;
        for i in 0..n {
            for j in 0..n {
                let lon = -PI + (f64::from(i) + 0.5) * 2.0 * PI / f64::from(n);
                let lat = -FRAC_PI_2 + (f64::from(j) + 0.5) * PI / f64::from(n);
                let h = 1e-6;
                let (x1, y1) = hammer_forward(lon + h, lat);
                let (x0, y0) = hammer_forward(lon - h, lat);
                let (x3, y3) = hammer_forward(lon, lat + h);
                let (x2, y2) = hammer_forward(lon, lat - h);
                let jac = ((x1 - x0) * (y3 - y2) - (y1 - y0) * (x3 - x2)) / (4.0 * h * h);
                area += jac.abs() * (2.0 * PI / f64::from(n)) * (PI / f64::from(n));
            }
        }
        assert!((area - 4.0 * PI).abs() < 1e-3 * 4.0 * PI, "{area}");
    }
}
