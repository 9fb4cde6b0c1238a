//! The JSON Lines catalogue format: one JSON object per star, with the
//! same keys as the CSV columns; missing values are `null`. Ids (`id`,
//! `system`) are 64-bit and mostly above 2^53, where JSON readers that
//! hold numbers as doubles (JavaScript, jq) would round them and merge
//! distinct stars, so they are written as strings of digits; the reader
//! takes them as strings or numbers.

use super::csv_format::COLUMNS;
use super::designations::push_designation;
use super::number_format::{push_fixed, push_sig, push_u64};
use super::table::{Origin, RowView};
use super::text_buffer::TextSink;

fn push_key<S: TextSink>(buf: &mut S, column: usize) {
    if column > 0 {
        buf.push_byte(b',');
    }
    buf.push_byte(b'"');
    buf.push_bytes(COLUMNS[column].as_bytes());
    buf.push_bytes(b"\":");
}

/// Appends a JSON string literal.
pub fn push_json_string<S: TextSink>(buf: &mut S, text: &str) {
    if text
        .bytes()
        .all(|b| b >= 0x20 && b != b'"' && b != b'\\' && b < 0x7f)
    {
        buf.push_byte(b'"');
        buf.push_bytes(text.as_bytes());
        buf.push_byte(b'"');
    } else {
        let quoted = serde_json::to_string(text).unwrap_or_else(|_| "\"\"".into());
        buf.push_bytes(quoted.as_bytes());
    }
}

fn push_number<S: TextSink>(buf: &mut S, x: f64, sig: usize) {
    if x.is_finite() {
        push_sig(buf, x, sig);
    } else {
        buf.push_bytes(b"null");
    }
}

fn push_fixed_or_null<S: TextSink>(buf: &mut S, x: f64, decimals: usize) {
    if x.is_finite() {
        push_fixed(buf, x, decimals);
    } else {
        buf.push_bytes(b"null");
    }
}

/// Appends one row as a JSON object and a newline.
pub fn push_row<S: TextSink>(buf: &mut S, row: &RowView<'_>) {
    let p = row.profile;
    buf.push_byte(b'{');
    push_key(buf, 0);
    buf.push_byte(b'"');
    push_u64(buf, row.id);
    buf.push_byte(b'"');
    push_key(buf, 1);
    buf.push_byte(b'"');
    push_u64(buf, row.system);
    buf.push_byte(b'"');
    push_key(buf, 2);
    if row.origin == Origin::Generated {
        buf.push_byte(b'"');
        push_designation(buf, row.id);
        buf.push_byte(b'"');
    } else {
        buf.push_bytes(b"null");
    }
    push_key(buf, 3);
    push_json_string(buf, row.name);
    for (i, v) in row.position_ly.iter().enumerate() {
        push_key(buf, 4 + i);
        push_fixed_or_null(buf, *v, 3);
    }
    push_key(buf, 7);
    push_json_string(buf, p.kind.as_str());
    push_key(buf, 8);
    push_json_string(buf, p.class.as_str());
    let sig5 = [
        (9, p.mass_msun),
        (10, p.initial_mass_msun),
        (11, p.radius_rsun),
        (12, p.luminosity_lsun),
    ];
    for (c, v) in sig5 {
        push_key(buf, c);
        push_number(buf, v, 5);
    }
    push_key(buf, 13);
    push_fixed_or_null(buf, p.teff_k, 0);
    for (c, v) in [
        (14, p.age_gyr),
        (15, p.lifetime_gyr),
        (16, p.hz.inner_au),
        (17, p.hz.outer_au),
    ] {
        push_key(buf, c);
        push_number(buf, v, 5);
    }
    push_key(buf, 18);
    buf.push_byte(b'"');
    super::csv_format::push_hex_colour(buf, p.color_rgb);
    buf.push_byte(b'"');
    push_key(buf, 19);
    push_fixed_or_null(buf, p.abs_mag_v, 3);
    push_key(buf, 20);
    push_number(buf, row.separation_au, 5);
    push_key(buf, 21);
    push_number(buf, row.period_days, 5);
    push_key(buf, 22);
    buf.push_bytes(if p.habitable_host { b"true" } else { b"false" });
    push_key(buf, 23);
    push_json_string(buf, row.origin.as_str());
    buf.push_bytes(b"}\n");
}
