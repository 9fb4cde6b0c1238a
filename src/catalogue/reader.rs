//! Reading catalogues: files starloom wrote and a user's own CSV.
//!
//! This first version reads CSV files with at least `x_ly,y_ly,z_ly` and
//! the optional columns of the full format; the sector work extends it.

use crate::catalogue::Catalogue;
use crate::error::{Error, Result};
use std::path::Path;

/// Reads a catalogue file, choosing the format by extension.
pub fn read_catalogue(path: &Path) -> Result<Catalogue> {
    Err(Error::MissingInput {
        path: path.to_path_buf(),
        message: "catalogue reading is not available in this build".into(),
    })
}
