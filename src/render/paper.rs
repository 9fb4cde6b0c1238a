//! Paper sizes (ISO 216 A-series and US sizes) and orientation.
//!
//! # Source
//! ISO 216 (A-series, whole millimetres); ANSI/ASME Y14.1 US sizes:
//! Letter 8.5 × 11 in, Legal 8.5 × 14 in, Tabloid 11 × 17 in (1 in = 25.4 mm exactly).

/// A named paper size.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Paper {
    /// ISO A4, 210 × 297 mm.
    A4,
    /// ISO A3, 297 × 420 mm.
    A3,
    /// ISO A2, 420 × 594 mm.
    A2,
    /// ISO A1, 594 × 841 mm.
    A1,
    /// ISO A0, 841 × 1189 mm.
    A0,
    /// US Letter, 8.5 × 11 in.
    Letter,
    /// US Legal, 8.5 × 14 in.
    Legal,
    /// US Tabloid, 11 × 17 in.
    Tabloid,
}

impl Paper {
    /// Every size, for help texts and error messages.
    pub const ALL: [Paper; 8] = [
        Paper::A4,
        Paper::A3,
        Paper::A2,
        Paper::A1,
        Paper::A0,
        Paper::Letter,
        Paper::Legal,
        Paper::Tabloid,
    ];

    /// The name used on the command line.
    pub fn as_str(self) -> &'static str {
        match self {
            Paper::A4 => "a4",
            Paper::A3 => "a3",
            Paper::A2 => "a2",
            Paper::A1 => "a1",
            Paper::A0 => "a0",
            Paper::Letter => "letter",
            Paper::Legal => "legal",
            Paper::Tabloid => "tabloid",
        }
    }

    /// Parses a name (case-insensitive).
    pub fn parse(name: &str) -> Option<Paper> {
        let lower = name.to_ascii_lowercase();
        Paper::ALL.into_iter().find(|p| p.as_str() == lower)
    }

    /// Portrait size (short side, long side), millimetres.
    pub fn portrait_mm(self) -> (f32, f32) {
        match self {
            Paper::A4 => (210.0, 297.0),
            Paper::A3 => (297.0, 420.0),
            Paper::A2 => (420.0, 594.0),
            Paper::A1 => (594.0, 841.0),
            Paper::A0 => (841.0, 1189.0),
            Paper::Letter => (215.9, 279.4),
            Paper::Legal => (215.9, 355.6),
            Paper::Tabloid => (279.4, 431.8),
        }
    }

    /// Size (width, height) in millimetres for an orientation.
    pub fn size_mm(self, landscape: bool) -> (f32, f32) {
        let (short, long) = self.portrait_mm();
        if landscape {
            (long, short)
        } else {
            (short, long)
        }
    }
}

/// Pixels for a length in millimetres at a resolution in dots per inch,
/// rounded to the nearest pixel.
pub fn mm_to_px(mm: f32, dpi: f32) -> u32 {
    (f64::from(mm) / 25.4 * f64::from(dpi)).round() as u32
}

/// Colour scheme of a sheet.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Theme {
    /// Light paper, ink-friendly (the default).
    #[default]
    Print,
    /// Dark sky, for screens.
    Screen,
}

impl Theme {
    /// Parses `print` or `screen`.
    pub fn parse(name: &str) -> Option<Theme> {
        match name.to_ascii_lowercase().as_str() {
            "print" => Some(Theme::Print),
            "screen" => Some(Theme::Screen),
            _ => None,
        }
    }
}

/// Parses `--paper` (any case), with the house sentence naming every size.
pub fn parse_paper(text: &str) -> crate::Result<Paper> {
    Paper::parse(text.trim()).ok_or_else(|| {
        let names: Vec<&str> = Paper::ALL.iter().map(|p| p.as_str()).collect();
        crate::Error::invalid(
            "--paper",
            text,
            format!("it must be one of {}", names.join(", ")),
        )
    })
}

/// Parses `--theme`: print or screen.
pub fn parse_theme(text: &str) -> crate::Result<Theme> {
    Theme::parse(text.trim())
        .ok_or_else(|| crate::Error::invalid("--theme", text, "it must be print or screen"))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn pixel_sizes_at_300_dpi() {
        // ISO 216 and US (ANSI) sizes in pixels at 300 dpi: sizes in mm from
        // ISO 216 and ANSI size tables (verified), px computed by hand (derived).
        assert_eq!(
            (mm_to_px(210.0, 300.0), mm_to_px(297.0, 300.0)),
            (2480, 3508)
        );
        assert_eq!(
            (mm_to_px(297.0, 300.0), mm_to_px(420.0, 300.0)),
            (3508, 4961)
        );
        let (w, h) = Paper::Letter.portrait_mm();
        assert_eq!((mm_to_px(w, 300.0), mm_to_px(h, 300.0)), (2550, 3300));
        let (w, h) = Paper::Tabloid.portrait_mm();
        assert_eq!((mm_to_px(w, 300.0), mm_to_px(h, 300.0)), (3300, 5100));
    }
}
