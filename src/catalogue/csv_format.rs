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
use super::text_buffer::TextSink;

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
#[inline]
pub fn push_text_field<S: TextSink + ?Sized>(buf: &mut S, text: &str) {
    if text
        .bytes()
        .any(|b| matches!(b, b',' | b'"' | b'\n' | b'\r'))
    {
        buf.push_byte(b'"');
        for b in text.bytes() {
            if b == b'"' {
                buf.push_byte(b'"');
            }
            buf.push_byte(b);
        }
        buf.push_byte(b'"');
    } else {
        buf.push_bytes(text.as_bytes());
    }
}

/// Appends `#rrggbb`.
#[inline]
pub fn push_hex_colour<S: TextSink + ?Sized>(buf: &mut S, rgb: [u8; 3]) {
    const HEX: &[u8; 16] = b"0123456789abcdef";
    let f = buf.field();
    f[0] = b'#';
    for (i, c) in rgb.into_iter().enumerate() {
        f[1 + 2 * i] = HEX[(c >> 4) as usize];
        f[2 + 2 * i] = HEX[(c & 15) as usize];
    }
    buf.commit(7);
}

/// Appends one row as a CSV line.
///
/// # Allocations
/// None beyond growing `buf`.
pub fn push_row<S: TextSink + ?Sized>(buf: &mut S, row: &RowView<'_>) {
    let p = row.profile;
    let id_at = buf.text_len();
    push_u64(buf, row.id);
    let id_len = buf.text_len() - id_at;
    buf.push_byte(b',');
    if row.system == row.id {
        // A primary: the system id is its own id, already formatted.
        buf.push_copy(id_at, id_len);
    } else {
        push_u64(buf, row.system);
    }
    buf.push_byte(b',');
    if row.origin == Origin::Generated {
        push_designation(buf, row.id);
    }
    buf.push_byte(b',');
    push_text_field(buf, row.name);
    for v in row.position_ly {
        buf.push_byte(b',');
        push_fixed(buf, v, 3);
    }
    buf.push_byte(b',');
    buf.push_bytes(p.kind.as_str().as_bytes());
    buf.push_byte(b',');
    push_text_field(buf, p.class.as_str());
    buf.push_byte(b',');
    let mass_at = buf.text_len();
    push_sig(buf, p.mass_msun, 5);
    let mass_len = buf.text_len() - mass_at;
    buf.push_byte(b',');
    if p.initial_mass_msun.to_bits() == p.mass_msun.to_bits() {
        // Most stars have lost no mass: the same value, already formatted.
        buf.push_copy(mass_at, mass_len);
    } else {
        push_sig(buf, p.initial_mass_msun, 5);
    }
    for v in [p.radius_rsun, p.luminosity_lsun] {
        buf.push_byte(b',');
        push_sig(buf, v, 5);
    }
    buf.push_byte(b',');
    push_fixed(buf, p.teff_k, 0);
    for v in [p.age_gyr, p.lifetime_gyr, p.hz.inner_au, p.hz.outer_au] {
        buf.push_byte(b',');
        push_sig(buf, v, 5);
    }
    buf.push_byte(b',');
    push_hex_colour(buf, p.color_rgb);
    buf.push_byte(b',');
    push_fixed(buf, p.abs_mag_v, 3);
    buf.push_byte(b',');
    push_sig(buf, row.separation_au, 5);
    buf.push_byte(b',');
    push_sig(buf, row.period_days, 5);
    buf.push_byte(b',');
    buf.push_bytes(if p.habitable_host { b"true" } else { b"false" });
    buf.push_byte(b',');
    buf.push_bytes(row.origin.as_str().as_bytes());
    buf.push_byte(b'\n');
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
