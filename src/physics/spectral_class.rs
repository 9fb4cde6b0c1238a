//! TEMPORARY placeholder for the spectral classifier (owned by the "light"
//! engineer, replaced at merge): coarse letter from Teff, no subclass.

use super::kinds::{ClassCode, StarKind};

/// Morgan–Keenan luminosity class.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LuminosityClass {
    /// V.
    Dwarf,
    /// IV.
    Subgiant,
    /// III.
    Giant,
    /// II.
    BrightGiant,
    /// I.
    Supergiant,
}

/// Placeholder classification: class letter from Teff only.
pub fn classify(kind: StarKind, teff_k: f64, _luminosity_lsun: f64, _mass_msun: f64) -> ClassCode {
    let code = match kind {
        StarKind::WhiteDwarf => "DA",
        StarKind::NeutronStar => "NS",
        StarKind::BlackHole => "BH",
        _ if teff_k >= 30_000.0 => "O",
        _ if teff_k >= 10_000.0 => "B",
        _ if teff_k >= 7_300.0 => "A",
        _ if teff_k >= 6_000.0 => "F",
        _ if teff_k >= 5_300.0 => "G",
        _ if teff_k >= 3_900.0 => "K",
        _ if teff_k >= 2_300.0 => "M",
        _ if teff_k >= 1_300.0 => "L",
        _ if teff_k >= 500.0 => "T",
        _ => "Y",
    };
    ClassCode::from_str_lossy(code)
}
