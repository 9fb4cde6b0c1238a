//! Map scales: parsing `5ly/cm`, `2pc/in`, `1ly/in` into millimetres of
//! paper per light year, and picking round numbers for fitted scales,
//! grid steps and scale bars.

use crate::error::{Error, Result};
use crate::units::LY_PER_PC;

const SCALE_HELP: &str = "it must be a positive distance per length of paper, such as 5ly/cm, 2pc/in, 1ly/in or 10ly/25mm (distances ly, pc, kly, kpc; paper mm, cm, m, in)";

/// Millimetres per unit of paper length, or `None` for an unknown unit.
fn paper_unit_mm(unit: &str) -> Option<f64> {
    match unit {
        "mm" => Some(1.0),
        "cm" => Some(10.0),
        "m" => Some(1000.0),
        // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959).
        "in" | "inch" => Some(25.4),
        _ => None,
    }
}

/// Light years per unit of distance, or `None` for an unknown unit.
fn distance_unit_ly(unit: &str) -> Option<f64> {
    match unit {
        "ly" => Some(1.0),
        "kly" => Some(1000.0),
        "pc" => Some(LY_PER_PC),
        "kpc" => Some(1000.0 * LY_PER_PC),
        _ => None,
    }
}

/// Splits `12.5ly` into (12.5, "ly"); an empty number counts as 1.
fn number_and_unit(text: &str) -> Option<(f64, String)> {
    let t = text.trim();
    let end = t
        .find(|c: char| !(c.is_ascii_digit() || matches!(c, '.' | '-' | '+' | 'e' | 'E')))
        .unwrap_or(t.len());
    // An exponent letter followed by a unit letter belongs to the unit.
    let (mut num, mut unit) = t.split_at(end);
    while num.ends_with(['e', 'E']) {
        let cut = num.len() - 1;
        unit = &t[cut..];
        num = &t[..cut];
    }
    let value = if num.is_empty() {
        1.0
    } else {
        num.parse::<f64>().ok()?
    };
    Some((value, unit.trim().to_ascii_lowercase()))
}

/// Parses a scale such as `5ly/cm` (5 light years to the centimetre),
/// `2pc/in` or `10ly/25mm` into millimetres of paper per light year.
///
/// # Errors
/// [`Error::InvalidOption`] naming `--scale` for anything that is not a
/// positive, finite distance over a positive, finite paper length.
pub fn parse_scale_mm_per_ly(text: &str) -> Result<f64> {
    let bad = || Error::invalid("--scale", text, SCALE_HELP);
    let (distance, paper) = text.split_once('/').ok_or_else(bad)?;
    let (d_value, d_unit) = number_and_unit(distance).ok_or_else(bad)?;
    let (p_value, p_unit) = number_and_unit(paper).ok_or_else(bad)?;
    let ly = d_value * distance_unit_ly(&d_unit).ok_or_else(bad)?;
    let mm = p_value * paper_unit_mm(&p_unit).ok_or_else(bad)?;
    let mm_per_ly = mm / ly;
    if !(ly.is_finite() && mm.is_finite() && ly > 0.0 && mm > 0.0 && mm_per_ly.is_finite()) {
        return Err(bad());
    }
    if !(1.0e-9..=1.0e6).contains(&mm_per_ly) {
        return Err(Error::invalid(
            "--scale",
            text,
            "it must lie between 1 ly per km of paper and 1 kpc per nanometre; choose a map scale a sheet can show",
        ));
    }
    Ok(mm_per_ly)
}

/// The smallest "round" number (1, 2, 2.5 or 5 times a power of ten) that
/// is at least `x` (common practice for map scales, no source).
pub fn nice_ceil(x: f64) -> f64 {
    if !(x.is_finite() && x > 0.0) {
        return 1.0;
    }
    let power = 10f64.powf(x.log10().floor());
    for m in [1.0, 2.0, 2.5, 5.0, 10.0] {
        if m * power >= x * (1.0 - 1e-9) {
            return m * power;
        }
    }
    10.0 * power
}

/// The largest round number (1, 2, 2.5 or 5 times a power of ten) that is
/// at most `x`.
pub fn nice_floor(x: f64) -> f64 {
    if !(x.is_finite() && x > 0.0) {
        return 1.0;
    }
    let power = 10f64.powf(x.log10().floor());
    for m in [10.0, 5.0, 2.5, 2.0, 1.0] {
        if m * power <= x * (1.0 + 1e-9) {
            return m * power;
        }
    }
    power
}

/// A number for a title block or label: up to three significant digits,
/// no trailing zeros (`5`, `2.5`, `0.125`, `1500`).
pub fn format_number(x: f64) -> String {
    if x == 0.0 || !x.is_finite() {
        return format!("{x}");
    }
    let digits = (2 - x.abs().log10().floor() as i32).clamp(0, 9) as usize;
    let text = format!("{x:.digits$}");
    if text.contains('.') {
        text.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        text
    }
}

/// Describes a scale for people: `5 ly/cm (1.53 pc/cm)`.
pub fn describe_scale(mm_per_ly: f64) -> String {
    let ly_per_cm = 10.0 / mm_per_ly;
    format!(
        "{} ly/cm ({} pc/cm)",
        format_number(ly_per_cm),
        format_number(ly_per_cm / LY_PER_PC)
    )
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn light_years_per_centimetre() {
        // 5 ly to the centimetre: 10 mm / 5 ly = 2 mm per ly (definition).
        assert_relative_eq!(parse_scale_mm_per_ly("5ly/cm").unwrap(), 2.0);
        assert_relative_eq!(parse_scale_mm_per_ly("1ly/in").unwrap(), 25.4);
        assert_relative_eq!(parse_scale_mm_per_ly("10ly/25mm").unwrap(), 2.5);
        assert_relative_eq!(parse_scale_mm_per_ly(" 2 ly / cm ").unwrap(), 5.0);
        assert_relative_eq!(parse_scale_mm_per_ly("1kly/m").unwrap(), 1.0);
    }

    #[test]
    fn parsecs_follow_the_iau_definitions() {
        // 1 pc = 648000/π au (IAU 2015 Resolution B2), 1 au = 149 597 870 700 m
        // (IAU 2012 Resolution B2), 1 ly = c × 365.25 d = 9 460 730 472 580 800 m
        // (IAU Julian year, c from SI); hence 1 pc = 3.261563777 ly.
        let pc_m = 648_000.0 / std::f64::consts::PI * 149_597_870_700.0;
        let ly_m = 299_792_458.0 * 365.25 * 86_400.0;
        assert_relative_eq!(pc_m / ly_m, 3.261_563_777, max_relative = 1e-9);
        // 2 pc to the inch: 25.4 mm / 6.523127554 ly.
        assert_relative_eq!(
            parse_scale_mm_per_ly("2pc/in").unwrap(),
            25.4 / (2.0 * 3.261_563_777),
            max_relative = 1e-9
        );
        assert_relative_eq!(
            parse_scale_mm_per_ly("1kpc/m").unwrap(),
            1000.0 / 3_261.563_777,
            max_relative = 1e-9
        );
    }

    #[test]
    fn bad_scales_are_refused() {
        for text in [
            "-2ly/cm", "0ly/cm", "5ly", "5ly/", "ly/-1cm", "5au/cm", "5ly/ft", "abc", "5ly/0cm",
            "nanly/cm", "infly/cm", "",
        ] {
            let err = parse_scale_mm_per_ly(text).unwrap_err().to_string();
            assert!(err.contains("--scale"), "{text}: {err}");
        }
    }

    #[test]
    fn round_numbers() {
        assert_eq!(nice_ceil(3.2), 5.0);
        assert_eq!(nice_ceil(2.1), 2.5);
        assert_eq!(nice_ceil(0.07), 0.1);
        assert_eq!(nice_ceil(10.0), 10.0);
        assert_eq!(nice_floor(3.2), 2.5);
        assert_eq!(nice_floor(9.9), 5.0);
        assert_eq!(nice_floor(0.3), 0.25);
        assert_eq!(format_number(5.0), "5");
        assert_eq!(format_number(1.533), "1.53");
        assert_eq!(format_number(1500.0), "1500");
        assert_eq!(format_number(0.125), "0.125");
        assert_eq!(describe_scale(2.0), "5 ly/cm (1.53 pc/cm)");
    }
}
