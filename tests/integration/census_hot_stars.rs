//! Shares of A and B main-sequence stars in a large generated sector
//! against the local census.
//!
//! Census shares (stars, brown dwarfs excluded): E. Mamajek's number
//! densities of stars by type in the solar vicinity ("memo_star_dens" and
//! figshare 3206527), as summarised in shared/science stars.md §5: A
//! 4.9e-4 pc^-3, B 3.2e-5 pc^-3 out of 0.0857 stars pc^-3 in all, that is
//! A 0.57 % and B 0.037 %. Tolerance: the model's stated accuracy, a
//! factor 1.5 either way (stars.md §10), widened by three Poisson standard
//! deviations of the count expected at each end of that band.

use starloom::physics::StarKind;
use starloom::sampler::generate;
use starloom::spec::{DEFAULT_DENSITY_PER_LY3, SectorSpec, Shape};

/// Share of stars that are main-sequence stars of class `letter`, and the
/// number of stars, in a box of about `stars` stars.
fn main_sequence_share(letter: char, stars: f64, seed: u64) -> (f64, f64) {
    let edge_ly = (stars / DEFAULT_DENSITY_PER_LY3).cbrt();
    let spec = SectorSpec::new(
        seed,
        Shape::Box {
            size_ly: [edge_ly; 3],
        },
        [0.0; 3],
    );
    let cat = generate(&spec, &|_, _| {}).expect("a sector");
    let n_stars = cat.kind.iter().filter(|k| k.is_star()).count() as f64;
    let n_class = (0..cat.len())
        .filter(|&i| cat.kind[i] == StarKind::MainSequence && cat.class[i].letter() == letter)
        .count() as f64;
    (n_class / n_stars, n_stars)
}

/// True when `share` lies within a factor 1.5 of `census`, allowing three
/// Poisson standard deviations of the count expected at either bound.
fn within_census_band(share: f64, census: f64, n_stars: f64) -> bool {
    let (lo, hi) = (census / 1.5, census * 1.5);
    let sigma = |p: f64| (p * n_stars).sqrt() / n_stars;
    share >= lo - 3.0 * sigma(lo) && share <= hi + 3.0 * sigma(hi)
}

#[test]
fn a_star_share_matches_the_local_census() {
    // Mamajek: A 4.9e-4 of 0.0857 stars pc^-3 (stars.md §5) = 0.57 %.
    let census = 4.9e-4 / 0.0857;
    let (share, n) = main_sequence_share('A', 2.0e5, 11);
    assert!(
        within_census_band(share, census, n),
        "A share {share:.5} against census {census:.5} ({n} stars)"
    );
}

/// Known gap, kept visible: the model makes about five times the B stars
/// of the census (0.18 % against 0.037 % for 10^6 stars). See the module
/// `starloom::population::star_ages` for the reasons; run with
/// `cargo test -- --ignored` to see the figure.
#[test]
#[ignore = "known gap: B stars come out about 5x the local census (see star_ages docs)"]
fn b_star_share_matches_the_local_census() {
    // Mamajek: B 3.2e-5 of 0.0857 stars pc^-3 (stars.md §5) = 0.037 %.
    let census = 3.2e-5 / 0.0857;
    let (share, n) = main_sequence_share('B', 4.0e5, 12);
    assert!(
        within_census_band(share, census, n),
        "B share {share:.6} against census {census:.6} ({n} stars)"
    );
}
