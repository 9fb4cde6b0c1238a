//! Writing a catalogue held in memory, format chosen by extension.

use super::table::{Catalogue, RowView};
use super::text_buffer::{TextBuffer, TextSink};
use crate::atomic_file::write_in_pieces;
use crate::error::{Error, Result};
use std::io::Write;
use std::path::Path;

/// A catalogue file format.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Format {
    /// Comma-separated values with a header row.
    Csv,
    /// JSON Lines, one object per star.
    Jsonl,
}

impl Format {
    /// The format for a path's extension (`.csv` or `.jsonl`).
    pub fn from_path(path: &Path, option: &str) -> Result<Format> {
        match path
            .extension()
            .and_then(|e| e.to_str())
            .map(|e| e.to_ascii_lowercase())
            .as_deref()
        {
            Some("csv") => Ok(Format::Csv),
            Some("jsonl") | Some("ndjson") => Ok(Format::Jsonl),
            _ => Err(Error::invalid(
                option,
                path.display(),
                "it must end in .csv or .jsonl",
            )),
        }
    }

    /// Appends the header (CSV only).
    pub fn push_header(self, buf: &mut Vec<u8>) {
        if self == Format::Csv {
            super::csv_format::push_header(buf);
        }
    }

    /// Typical bytes per catalogue row, for estimating a file's size
    /// before writing it.
    ///
    /// Measured on populates of 0.1–12.9 million rows (spheres of
    /// 200–985 ly, all three IMFs, uniform and disk density): CSV
    /// 208.7–212.4 bytes per row, JSON Lines 500.6–503.8 (before ids were
    /// quoted, which adds 4). Rows far from the origin are slightly longer
    /// (more digits), so the values here are the top of the range, rounded
    /// up.
    pub fn typical_row_bytes(self) -> f64 {
        match self {
            Format::Csv => 213.0,
            Format::Jsonl => 509.0,
        }
    }

    /// Appends one row.
    #[inline]
    pub fn push_row<S: TextSink>(self, buf: &mut S, row: &RowView<'_>) {
        match self {
            Format::Csv => super::csv_format::push_row(buf, row),
            Format::Jsonl => super::jsonl::push_row(buf, row),
        }
    }
}

/// Writes `cat` to `path` (`.csv` or `.jsonl`), atomically; an existing
/// file is kept unless `force`.
pub fn write_catalogue(cat: &Catalogue, path: &Path, force: bool) -> Result<()> {
    let format = Format::from_path(path, "--out")?;
    crate::atomic_file::write_atomic(path, force, |w| {
        let mut head = Vec::new();
        format.push_header(&mut head);
        w.write_all(&head)?;
        let mut buf = TextBuffer::with_capacity(1 << 20);
        for i in 0..cat.len() {
            let profile = cat.profile(i);
            let row = RowView {
                id: cat.id[i],
                system: cat.system[i],
                name: &cat.name[i],
                position_ly: cat.position_ly(i),
                profile: &profile,
                separation_au: cat.separation_au[i],
                period_days: cat.period_days[i],
                origin: cat.origin[i],
            };
            format.push_row(&mut buf, &row);
            if buf.len() > (1 << 20) - 4096 {
                write_in_pieces(w, buf.as_bytes())?;
                buf.clear();
            }
        }
        write_in_pieces(w, buf.as_bytes())
    })
}
