//! Map sheets: a catalogue drawn as printable pages ([`Scene`]s in page
//! millimetres) at a chosen scale, view and paper size, tiled into a
//! poster with an index sheet when it does not fit one sheet.
//!
//! [`build_sheets`] is the entry point; [`sheet_path`] names each sheet's
//! file beside the requested output; the back end
//! ([`crate::render::output::write_scenes`]) writes them.
//!
//! ```
//! use starloom::catalogue::Catalogue;
//! use starloom::map::{build_sheets, MapOptions};
//! use starloom::render::overlay::Overlay;
//! let cat = Catalogue::default();
//! let sheets = build_sheets(&cat, &MapOptions::default(), &Overlay::default()).unwrap();
//! assert_eq!(sheets.sheets.len(), 1);
//! ```

pub mod labels;
pub mod layout;
pub mod options;
mod panel;
pub mod scale;
mod sheet;
pub mod style;
pub mod view;

pub use layout::Frame;
pub use options::{LabelMode, Layers, MapFilter, MapOptions};
pub use sheet::{MAX_TILES, MapSheet, MapSheets, SheetRole, build_sheets};

use crate::catalogue::reader::Columns;

/// The catalogue columns a map sheet draws from (besides ids, systems and
/// positions), for [`crate::catalogue::reader::read_catalogue_columns`].
pub const CATALOGUE_COLUMNS: Columns = Columns::NAME
    .with(Columns::KIND)
    .with(Columns::CLASS)
    .with(Columns::COLOUR)
    .with(Columns::LUMINOSITY)
    .with(Columns::HABITABLE_HOST)
    .with(Columns::ORIGIN);

use crate::render::scene::Scene;
use std::path::{Path, PathBuf};

/// The file of one sheet: `PATH` itself for a single sheet, else
/// `STEM.r2c3.EXT` for tiles and `STEM.index.EXT` for the index, beside
/// `PATH`.
pub fn sheet_path(out: &Path, sheet: &MapSheet) -> PathBuf {
    let tag = match sheet.role {
        SheetRole::Single => return out.to_path_buf(),
        SheetRole::Index => "index".to_string(),
        SheetRole::Tile { row, col } => format!("r{row}c{col}"),
    };
    let stem = out
        .file_stem()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_else(|| "map".into());
    let name = match out.extension() {
        Some(ext) => format!("{stem}.{tag}.{}", ext.to_string_lossy()),
        None => format!("{stem}.{tag}"),
    };
    out.with_file_name(name)
}

/// All scenes in file order (for a multi-page PDF).
pub fn scenes(sheets: &MapSheets) -> Vec<&Scene> {
    sheets.sheets.iter().map(|s| &s.scene).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tile_files_sit_beside_the_output() {
        let scene = Scene {
            width_mm: 1.0,
            height_mm: 1.0,
            background: crate::render::scene::Rgba::rgb(0, 0, 0),
            items: vec![],
        };
        let mk = |role| MapSheet {
            role,
            scene: scene.clone(),
        };
        let out = Path::new("/tmp/x/sheet.png");
        assert_eq!(sheet_path(out, &mk(SheetRole::Single)), out);
        assert_eq!(
            sheet_path(out, &mk(SheetRole::Tile { row: 1, col: 2 })),
            Path::new("/tmp/x/sheet.r1c2.png")
        );
        assert_eq!(
            sheet_path(out, &mk(SheetRole::Index)),
            Path::new("/tmp/x/sheet.index.png")
        );
    }
}
