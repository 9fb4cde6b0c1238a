//! TEMPORARY placeholder for the true-colour lookup table (owned by the
//! "light" engineer, replaced at merge): a crude ramp, not a colour model.

/// Placeholder colour: red for cool, white near 6500 K, blue for hot.
pub fn color_rgb(teff_k: f64) -> [u8; 3] {
    if teff_k.is_nan() || teff_k <= 0.0 {
        return [0, 0, 0];
    }
    let t = (teff_k / 6500.0).clamp(0.3, 3.0);
    if t < 1.0 {
        [255, (255.0 * t) as u8, (255.0 * t * t) as u8]
    } else {
        [(255.0 / t) as u8, (255.0 / t.sqrt()) as u8, 255]
    }
}
