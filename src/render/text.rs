//! Text measurement for layout (a stand-in until the font back end lands).

/// Width of `text` set at `size_pt` points, millimetres.
///
/// An estimate: 0.55 em per character (0.60 em in bold), a typical mean
/// advance of a sans-serif face (common practice, no source). The font
/// back end replaces this with the shipped font's real advances.
pub fn text_width_mm(text: &str, size_pt: f32, bold: bool) -> f32 {
    let em_mm = size_pt * 25.4 / 72.0;
    let per_char = if bold { 0.60 } else { 0.55 };
    text.chars().count() as f32 * per_char * em_mm
}
