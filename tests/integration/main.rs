//! Integration tests, compiled as one binary: one module per area.

mod cli_star;
mod populate_real;
mod tidy;
mod util;
