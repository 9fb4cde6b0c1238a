//! Writing scenes to files: the format follows the extension (`.png`
//! with its DPI in the pHYs chunk, `.svg` with its page size in mm,
//! `.pdf` with one page per scene).

use crate::error::{Error, Result};
use crate::render::scene::Scene;
use std::path::Path;

/// Writes `scenes` to `path` in the format its extension names. PNG and
/// SVG take exactly one scene; PDF writes one page per scene. Raster
/// output uses `dpi` dots per inch.
pub fn write_scenes(scenes: &[Scene], path: &Path, dpi: f32, force: bool) -> Result<()> {
    let _ = (scenes, dpi, force);
    Err(Error::Write {
        path: path.to_path_buf(),
        message: "drawing is not available in this build".into(),
    })
}
