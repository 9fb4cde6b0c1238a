//! Parsing the sky command's text options into settings, with the house
//! one-sentence errors.

use super::projection::Projection;
use crate::error::{Error, Result};

/// Parses a magnitude such as `6.5` or `-1` (for `--limit`).
pub fn parse_magnitude(option: &str, text: &str) -> Result<f64> {
    match text.trim().parse::<f64>() {
        Ok(v) if v.is_finite() && (-30.0..=40.0).contains(&v) => Ok(v),
        _ => Err(Error::invalid(
            option,
            text,
            "it must be a magnitude between -30 and 40, such as 6.5",
        )),
    }
}

/// Parses an extinction in V magnitudes per 1000 ly (zero or more).
pub fn parse_extinction(option: &str, text: &str) -> Result<f64> {
    match text.trim().parse::<f64>() {
        Ok(v) if v.is_finite() && (0.0..=100.0).contains(&v) => Ok(v),
        _ => Err(Error::invalid(
            option,
            text,
            "it must be magnitudes per 1000 ly, a number from 0 to 100 such as 0.5",
        )),
    }
}

/// Parses `L,B` in degrees (longitude any finite value, wrapped to
/// [0, 360); latitude −90…90). Negative values such as `120,-30` work.
pub fn parse_toward(option: &str, text: &str) -> Result<(f64, f64)> {
    let bad = || {
        Error::invalid(
            option,
            text,
            "it must be a galactic longitude and latitude in degrees, L,B, with B from -90 to 90 (e.g. 120,-30)",
        )
    };
    let parts: Vec<&str> = text.split(',').map(str::trim).collect();
    if parts.len() != 2 {
        return Err(bad());
    }
    let l: f64 = parts[0].parse().map_err(|_| bad())?;
    let b: f64 = parts[1].parse().map_err(|_| bad())?;
    if !l.is_finite() || !b.is_finite() || !(-90.0..=90.0).contains(&b) {
        return Err(bad());
    }
    Ok((l.rem_euclid(360.0), b))
}

/// Parses a projection name (case-insensitive; `hammer` and `aitoff` are
/// taken for `hammer-aitoff`) with the chart centre `(l, b)` in degrees;
/// only the stereographic projection uses the latitude.
pub fn parse_projection(option: &str, text: &str, toward_deg: (f64, f64)) -> Result<Projection> {
    let name = text.trim().to_ascii_lowercase().replace('_', "-");
    match name.as_str() {
        "hammer-aitoff" | "hammer" | "aitoff" | "hammeraitoff" => Ok(Projection::HammerAitoff),
        "mollweide" => Ok(Projection::Mollweide),
        "stereographic" => Ok(Projection::Stereographic {
            centre_lat_rad: toward_deg.1.to_radians(),
        }),
        "equirectangular" | "plate-carree" => Ok(Projection::Equirectangular),
        _ => Err(Error::invalid(
            option,
            text,
            format!("it must be one of {}", Projection::NAMES.join(", ")),
        )),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn toward_takes_negative_latitudes() {
        assert_eq!(parse_toward("--toward", "120,-30").unwrap(), (120.0, -30.0));
        assert_eq!(parse_toward("--toward", "-90, 10").unwrap(), (270.0, 10.0));
        for bad in ["120", "120,-95", "a,b", "1,2,3", ""] {
            assert!(parse_toward("--toward", bad).is_err(), "{bad}");
        }
    }

    #[test]
    fn magnitudes_and_projections() {
        assert_eq!(parse_magnitude("--limit", " 6.5").unwrap(), 6.5);
        assert!(parse_magnitude("--limit", "bright").is_err());
        assert!(parse_magnitude("--limit", "NaN").is_err());
        assert!(parse_extinction("--extinction", "-1").is_err());
        let p = parse_projection("--projection", "Stereographic", (120.0, -30.0)).unwrap();
        assert_eq!(
            p,
            Projection::Stereographic {
                centre_lat_rad: (-30.0f64).to_radians()
            }
        );
        let err = parse_projection("--projection", "conic", (0.0, 0.0)).unwrap_err();
        assert!(err.to_string().contains("mollweide"), "{err}");
    }
}
