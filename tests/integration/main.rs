//! Integration tests, compiled as one binary: one module per area.

mod census_hot_stars;
mod cli_star;
mod tidy;
mod util;
