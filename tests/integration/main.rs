//! Integration tests, compiled as one binary: one module per area.

mod cli_map;
mod cli_star;
mod map_sheets;
mod render_hr;
mod render_output;
mod render_raster;
mod tidy;
mod util;
