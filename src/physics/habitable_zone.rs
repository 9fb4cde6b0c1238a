//! TEMPORARY placeholder for the habitable zone (owned by the "light"
//! engineer, replaced at merge): flux rules only, no Kopparapu fits.

use super::kinds::HabitableZone;

/// Placeholder: the flux rules for every edge.
pub fn habitable_zone(teff_k: f64, luminosity_lsun: f64) -> HabitableZone {
    let mut hz = habitable_zone_rules(luminosity_lsun);
    hz.teff_in_range = (2600.0..=7200.0).contains(&teff_k);
    hz
}

/// The textbook flux rules, sqrt(L/1.1) and sqrt(L/0.53) au.
pub fn habitable_zone_rules(luminosity_lsun: f64) -> HabitableZone {
    let l = luminosity_lsun.max(0.0);
    HabitableZone {
        inner_au: (l / 1.1).sqrt(),
        outer_au: (l / 0.53).sqrt(),
        optimistic_inner_au: (l / 1.776).sqrt(),
        optimistic_outer_au: (l / 0.32).sqrt(),
        teff_in_range: true,
    }
}
