//! Integration tests, compiled as one binary: one module per area.

mod cli_sky;
mod cli_star;
mod tidy;
mod util;
