//! Sector summary statistics.
