//! Views: how a point in light years (galactic axes) lands on the map
//! plane, a flat 2D frame in light years with `u` to the right and `v` up
//! the sheet, centred on the map centre.
//!
//! * **top**: orthographic, looking down −z: `u = x − cx`, `v = y − cy`.
//! * **oblique**: orthographic, the line of sight tipped from straight down
//!   by the tilt toward the −y side (0° is the top view, 90° looks
//!   along +y): `u = x − cx`, `v = (y − cy) cos t + (z − cz) sin t`.
//! * **perspective**: a pin-hole camera at the eye looking at the look
//!   point with +z up; the image is scaled so that lengths at the look
//!   point's distance keep their size in light years.
//!
//! The reference plane is `z = cz`, the map centre's height.

/// Which view to draw, as asked for.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum ViewSpec {
    /// Looking straight down −z.
    Top,
    /// Tilted orthographic view.
    Oblique {
        /// Angle between the line of sight and straight down, degrees (0–89).
        tilt_deg: f64,
    },
    /// Pin-hole camera.
    Perspective {
        /// Camera position, ly; `None` for the default (from −y, raised 30°,
        /// far enough to fit the stars).
        eye_ly: Option<[f64; 3]>,
        /// Point looked at, ly; `None` for the map centre.
        look_ly: Option<[f64; 3]>,
    },
}

impl ViewSpec {
    /// The view's command-line name.
    pub fn name(&self) -> &'static str {
        match self {
            ViewSpec::Top => "top",
            ViewSpec::Oblique { .. } => "oblique",
            ViewSpec::Perspective { .. } => "perspective",
        }
    }
}

/// Default oblique tilt, degrees.
pub const DEFAULT_TILT_DEG: f64 = 35.0;
/// Elevation of the default perspective eye above the reference plane, degrees.
pub const DEFAULT_EYE_ELEVATION_DEG: f64 = 30.0;
/// Half of the field of view the default eye distance allows for, degrees.
const DEFAULT_HALF_FOV_DEG: f64 = 22.0;

/// A resolved view: projects points onto the map plane.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Projector {
    /// Map centre, ly; its height is the reference plane.
    pub centre_ly: [f64; 3],
    kind: Kind,
}

#[derive(Debug, Clone, Copy, PartialEq)]
enum Kind {
    Top,
    Oblique {
        cos_t: f64,
        sin_t: f64,
    },
    Perspective {
        eye: [f64; 3],
        right: [f64; 3],
        up: [f64; 3],
        forward: [f64; 3],
        look_distance: f64,
    },
}

fn sub(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}
fn dot(a: [f64; 3], b: [f64; 3]) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}
fn cross(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [
        a[1] * b[2] - a[2] * b[1],
        a[2] * b[0] - a[0] * b[2],
        a[0] * b[1] - a[1] * b[0],
    ]
}
fn normalised(a: [f64; 3]) -> [f64; 3] {
    let n = dot(a, a).sqrt();
    [a[0] / n, a[1] / n, a[2] / n]
}

/// The default perspective eye: from the −y side, raised
/// [`DEFAULT_EYE_ELEVATION_DEG`] above the reference plane, far enough that
/// a sphere of `radius_ly` about `look` fits a 44° field of view.
pub fn default_eye(look_ly: [f64; 3], radius_ly: f64) -> [f64; 3] {
    let distance = radius_ly.max(1.0) / DEFAULT_HALF_FOV_DEG.to_radians().sin();
    let e = DEFAULT_EYE_ELEVATION_DEG.to_radians();
    [
        look_ly[0],
        look_ly[1] - distance * e.cos(),
        look_ly[2] + distance * e.sin(),
    ]
}

impl Projector {
    /// Resolves a view about `centre_ly`. `radius_ly` (the stars' extent
    /// about the centre) sets the default perspective eye distance. Returns
    /// `None` when the eye and look point coincide.
    pub fn new(spec: ViewSpec, centre_ly: [f64; 3], radius_ly: f64) -> Option<Projector> {
        let kind = match spec {
            ViewSpec::Top => Kind::Top,
            ViewSpec::Oblique { tilt_deg } => {
                let t = tilt_deg.to_radians();
                Kind::Oblique {
                    cos_t: t.cos(),
                    sin_t: t.sin(),
                }
            }
            ViewSpec::Perspective { eye_ly, look_ly } => {
                let look = look_ly.unwrap_or(centre_ly);
                let eye = eye_ly.unwrap_or_else(|| default_eye(look, radius_ly));
                let d = sub(look, eye);
                let look_distance = dot(d, d).sqrt();
                if !(look_distance > 1e-9 && look_distance.is_finite()) {
                    return None;
                }
                let forward = normalised(d);
                // Right = forward × z; looking straight up or down, use +x.
                let mut right = cross(forward, [0.0, 0.0, 1.0]);
                if dot(right, right) < 1e-18 {
                    right = [1.0, 0.0, 0.0];
                }
                let right = normalised(right);
                let up = cross(right, forward);
                Kind::Perspective {
                    eye,
                    right,
                    up,
                    forward,
                    look_distance,
                }
            }
        };
        Some(Projector { centre_ly, kind })
    }

    /// True for the top view.
    pub fn is_top(&self) -> bool {
        matches!(self.kind, Kind::Top)
    }

    /// True for the perspective view.
    pub fn is_perspective(&self) -> bool {
        matches!(self.kind, Kind::Perspective { .. })
    }

    /// The camera position of a perspective view.
    pub fn eye_ly(&self) -> Option<[f64; 3]> {
        match self.kind {
            Kind::Perspective { eye, .. } => Some(eye),
            _ => None,
        }
    }

    /// Map-plane position (u right, v up, ly) of a point, or `None` when
    /// it lies behind (or almost at) a perspective camera.
    #[inline]
    pub fn project(&self, p: [f64; 3]) -> Option<[f64; 2]> {
        let c = self.centre_ly;
        match self.kind {
            Kind::Top => Some([p[0] - c[0], p[1] - c[1]]),
            Kind::Oblique { cos_t, sin_t } => {
                Some([p[0] - c[0], (p[1] - c[1]) * cos_t + (p[2] - c[2]) * sin_t])
            }
            Kind::Perspective {
                eye,
                right,
                up,
                forward,
                look_distance,
            } => {
                let d = sub(p, eye);
                let depth = dot(d, forward);
                if depth < 1e-3 * look_distance {
                    return None;
                }
                let k = look_distance / depth;
                Some([dot(d, right) * k, dot(d, up) * k])
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn top_view_has_x_right_and_y_up() {
        let p = Projector::new(ViewSpec::Top, [10.0, 20.0, 5.0], 50.0).unwrap();
        assert_eq!(p.project([13.0, 20.0, 99.0]), Some([3.0, 0.0]));
        assert_eq!(p.project([10.0, 24.0, -99.0]), Some([0.0, 4.0]));
    }

    #[test]
    fn oblique_view_lifts_height() {
        // Worked by hand: tilt 30°, (y, z) = (2, 4) → v = 2 cos 30° + 4 sin 30°.
        let p = Projector::new(ViewSpec::Oblique { tilt_deg: 30.0 }, [0.0; 3], 1.0).unwrap();
        let q = p.project([1.0, 2.0, 4.0]).unwrap();
        assert_relative_eq!(q[0], 1.0);
        assert_relative_eq!(q[1], 2.0 * 3f64.sqrt() / 2.0 + 2.0, epsilon = 1e-12);
    }

    #[test]
    fn perspective_projects_known_points() {
        // Eye 10 ly down −y looking at the origin: a point 1 ly right of the
        // look point stays 1 ly; the same offset 10 ly nearer (depth 5 ly
        // from an eye at depth 10) doubles (pin-hole: size ∝ 1/depth).
        let spec = ViewSpec::Perspective {
            eye_ly: Some([0.0, -10.0, 0.0]),
            look_ly: Some([0.0, 0.0, 0.0]),
        };
        let p = Projector::new(spec, [0.0; 3], 1.0).unwrap();
        let a = p.project([1.0, 0.0, 0.0]).unwrap();
        assert_relative_eq!(a[0], 1.0, epsilon = 1e-12);
        assert_relative_eq!(a[1], 0.0, epsilon = 1e-12);
        let b = p.project([1.0, -5.0, 2.0]).unwrap();
        assert_relative_eq!(b[0], 2.0, epsilon = 1e-12);
        assert_relative_eq!(b[1], 4.0, epsilon = 1e-12);
        assert_eq!(p.project([0.0, -20.0, 0.0]), None, "behind the camera");
        // The look point is the image centre.
        assert_eq!(p.project([0.0, 0.0, 0.0]), Some([0.0, 0.0]));
    }

    #[test]
    fn default_eye_is_raised_30_degrees_on_the_minus_y_side() {
        let spec = ViewSpec::Perspective {
            eye_ly: None,
            look_ly: None,
        };
        let p = Projector::new(spec, [5.0, 5.0, 5.0], 100.0).unwrap();
        let e = p.eye_ly().unwrap();
        let d = [e[0] - 5.0, e[1] - 5.0, e[2] - 5.0];
        let r = (d[0] * d[0] + d[1] * d[1] + d[2] * d[2]).sqrt();
        assert_relative_eq!(d[0], 0.0);
        assert!(d[1] < 0.0);
        assert_relative_eq!((d[2] / r).asin().to_degrees(), 30.0, epsilon = 1e-9);
        // Far enough: a sphere of 100 ly fits 22° each side of the axis.
        assert_relative_eq!((100.0 / r).asin().to_degrees(), 22.0, epsilon = 1e-9);
    }

    #[test]
    fn eye_at_the_look_point_is_refused() {
        let spec = ViewSpec::Perspective {
            eye_ly: Some([1.0, 1.0, 1.0]),
            look_ly: Some([1.0, 1.0, 1.0]),
        };
        assert!(Projector::new(spec, [0.0; 3], 1.0).is_none());
    }
}
