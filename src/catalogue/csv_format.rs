//! The CSV catalogue format: a header row with units in the column names,
//! then one star per line, rows in catalogue order.
//!
//! The writer formats straight into a byte buffer (no per-field
//! allocation). Missing values are empty fields. Names that hold a comma
//! or a quote are quoted as RFC 4180 says; the reader has a fast path for
//! unquoted files (parallel, hand-split fields) and uses the `csv` crate
//! when a file has quotes.

use super::designations::push_designation;
use super::number_format::{push_fixed, push_sig, push_u64};
use super::table::{Origin, RowView};

/// The columns starloom writes, in order.
pub const COLUMNS: [&str; 24] = [
    "id",
    "system",
    "designation",
    "name",
    "x_ly",
    "y_ly",
    "z_ly",
    "kind",
    "class",
    "mass_msun",
    "initial_mass_msun",
    "radius_rsun",
    "luminosity_lsun",
    "teff_k",
    "age_gyr",
    "lifetime_gyr",
    "hz_inner_au",
    "hz_outer_au",
    "colour_hex",
    "abs_mag_v",
    "separation_au",
    "period_days",
    "habitable_host",
    "origin",
];

/// Appends the header line.
pub fn push_header(buf: &mut Vec<u8>) {
    buf.extend_from_slice(COLUMNS.join(",").as_bytes());
    buf.push(b'\n');
}

/// Appends a text field, quoting it when it holds `,`, `"` or a line break.
pub fn push_text_field(buf: &mut Vec<u8>, text: &str) {
    if text
        .bytes()
        .any(|b| matches!(b, b',' | b'"' | b'\n' | b'\r'))
    {
        buf.push(b'"');
        for b in text.bytes() {
            if b == b'"' {
                buf.push(b'"');
            }
            buf.push(b);
        }
        buf.push(b'"');
    } else {
        buf.extend_from_slice(text.as_bytes());
    }
}

/// Appends `#rrggbb`.
pub fn push_hex_colour(buf: &mut Vec<u8>, rgb: [u8; 3]) {
    const HEX: &[u8; 16] = b"0123456789abcdef";
    buf.push(b'#');
    for c in rgb {
        buf.push(HEX[(c >> 4) as usize]);
        buf.push(HEX[(c & 15) as usize]);
    }
}

/// Appends one row as a CSV line.
///
/// # Allocations
/// None beyond growing `buf`.
pub fn push_row(buf: &mut Vec<u8>, row: &RowView<'_>) {
    let p = row.profile;
    push_u64(buf, row.id);
    buf.push(b',');
    push_u64(buf, row.system);
    buf.push(b',');
    if row.origin == Origin::Generated {
        push_designation(buf, row.id);
    }
    buf.push(b',');
    push_text_field(buf, row.name);
    for v in row.position_ly {
        buf.push(b',');
        push_fixed(buf, v, 3);
    }
    buf.push(b',');
    buf.extend_from_slice(p.kind.as_str().as_bytes());
    buf.push(b',');
    push_text_field(buf, p.class.as_str());
    for v in [
        p.mass_msun,
        p.initial_mass_msun,
        p.radius_rsun,
        p.luminosity_lsun,
    ] {
        buf.push(b',');
        push_sig(buf, v, 5);
    }
    buf.push(b',');
    push_fixed(buf, p.teff_k, 0);
    for v in [p.age_gyr, p.lifetime_gyr, p.hz.inner_au, p.hz.outer_au] {
        buf.push(b',');
        push_sig(buf, v, 5);
    }
    buf.push(b',');
    push_hex_colour(buf, p.color_rgb);
    buf.push(b',');
    push_fixed(buf, p.abs_mag_v, 3);
    buf.push(b',');
    push_sig(buf, row.separation_au, 5);
    buf.push(b',');
    push_sig(buf, row.period_days, 5);
    buf.push(b',');
    buf.extend_from_slice(if p.habitable_host { b"true" } else { b"false" });
    buf.push(b',');
    buf.extend_from_slice(row.origin.as_str().as_bytes());
    buf.push(b'\n');
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn quoting_follows_rfc_4180() {
        let mut b = Vec::new();
        push_text_field(&mut b, "plain name");
        b.push(b'|');
        push_text_field(&mut b, "a, \"b\"");
        assert_eq!(String::from_utf8(b).unwrap(), "plain name|\"a, \"\"b\"\"\"");
        let mut c = Vec::new();
        push_hex_colour(&mut c, [255, 16, 0]);
        assert_eq!(c, b"#ff1000");
    }
}
