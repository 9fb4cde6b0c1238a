//! Integration tests, compiled as one binary: one module per area.

mod census_hot_stars;
mod cli_demo;
mod cli_interrupt;
mod cli_map;
mod cli_routes;
mod cli_sky;
mod cli_star;
mod map_sheets;
mod populate_real;
mod render_hr;
mod render_output;
mod render_raster;
mod routes;
mod sector_census;
mod sector_cli;
mod sector_determinism;
mod sector_orbits;
mod sector_pins;
mod sector_reader;
mod sector_spec;
mod sector_tiling;
mod summary_edges;
mod tidy;
mod util;
