//! Census checks of the real neighbourhood (real part and fill).

use super::convert::v_from_hp;
use super::*;
use crate::spec::Shape;

fn sphere(radius_ly: f64, seed: u64) -> SectorSpec {
    SectorSpec::new(seed, Shape::Sphere { radius_ly }, [0.0; 3])
}

fn count(cat: &Catalogue, r_ly: f64, stars_only: bool, origin: Option<Origin>) -> usize {
    (0..cat.len())
        .filter(|&i| {
            (!stars_only || cat.kind[i].is_star())
                && distance_from_sun_ly(cat, i) <= r_ly
                && origin.is_none_or(|o| cat.origin[i] == o)
        })
        .count()
}

#[test]
fn census_within_10_and_20_pc() {
    let cat = real_neighbourhood_sector(&sphere(2.0 * TEN_PC_LY, 11)).unwrap();
    let stars_10 = count(&cat, TEN_PC_LY, true, None);
    let objects_20 = count(&cat, 2.0 * TEN_PC_LY, false, None);
    eprintln!(
        "10 pc: {} real + {} generated = {stars_10} stars ({} objects); 20 pc: {} real + {} generated stars, {objects_20} objects",
        count(&cat, TEN_PC_LY, true, Some(Origin::Hipparcos)),
        count(&cat, TEN_PC_LY, true, Some(Origin::Generated)),
        count(&cat, TEN_PC_LY, false, None),
        count(&cat, 2.0 * TEN_PC_LY, true, Some(Origin::Hipparcos)),
        count(&cat, 2.0 * TEN_PC_LY, true, Some(Origin::Generated)),
    );
    // RECONS 10 pc census, 2015-01-01: 366 stars, the Sun and white dwarfs
    // included, brown dwarfs not (Henry et al., AAS 227 abstract; shared
    // science notes §5). σ: Poisson on the fill (≈ 200 stars → 14) and the
    // model density's spread (0.0024–0.0026 ly⁻³, ±4 % → 15): ≈ 20; 3σ.
    assert!(
        (stars_10 as f64 - 366.0).abs() <= 60.0,
        "{stars_10} stars within 10 pc"
    );
    // 20 pc census: ~3600 objects, stars, white dwarfs and brown dwarfs
    // (Kirkpatrick et al. 2024, ApJS 271, 55, abstract). σ: Poisson 60, model
    // density ±4 % (145) and the star : brown-dwarf ratio (4 : 1 ± 10 %,
    // ≈ 70): ≈ 170; 3σ.
    assert!(
        (objects_20 as f64 - 3600.0).abs() <= 510.0,
        "{objects_20} objects within 20 pc"
    );
}

#[test]
fn real_part_matches_the_extract() {
    let cat = real_catalogue(&sphere(TEN_PC_LY, 1));
    let in_extract = extract::extract()
        .iter()
        .filter(|s| s.distance_pc() <= 10.0)
        .count();
    let real = (0..cat.len()).filter(|&i| cat.id[i] != 0).count();
    // 165 stars of the extract within 10 pc (counted from the file with
    // python); every one is in the catalogue, and no other.
    assert_eq!(in_extract, 165);
    assert_eq!(real, in_extract);
    assert_eq!(&cat.name[0], "Sun");
    assert!(cat.origin.iter().all(|&o| o == Origin::Hipparcos));
    // Members share their primary's position and system id.
    for r in cat.system_ranges() {
        for i in r.clone() {
            assert_eq!(cat.system[i], cat.id[r.start]);
            assert_eq!(cat.position_ly(i), cat.position_ly(r.start));
        }
    }
}

#[test]
fn naked_eye_sky_is_the_extracts_and_the_fill_stays_faint() {
    let cat = real_neighbourhood_sector(&sphere(EXTRACT_REACH_LY, 3)).unwrap();
    let mut naked = 0usize;
    for i in 0..cat.len() {
        let d = distance_from_sun_ly(&cat, i);
        if cat.id[i] == 0 || !cat.kind[i].is_star() {
            continue;
        }
        let d_pc = d / LY_PER_PC;
        // Distance modulus, written out here (no extinction).
        let v = cat.abs_mag_v[i] + 5.0 * d_pc.log10() - 5.0;
        if v < 6.5 {
            naked += 1;
            assert_eq!(cat.origin[i], Origin::Hipparcos, "{}", &cat.name[i]);
        }
        if cat.origin[i] == Origin::Generated && d <= EXTRACT_REACH_LY {
            // The lower of the two Hipparcos completeness limits,
            // 7.3 + 1.1 |sin b| (ESA 1997, SP-1200 Vol. 1; from memory).
            let sin_b = (cat.z_ly[i] / d).abs();
            assert!(v > 7.3 + 1.1 * sin_b, "{} at V {v}", &cat.name[i]);
        }
    }
    let extract_naked = extract::extract()
        .iter()
        .filter(|s| v_from_hp(s.hp_mag, s.b_v_mag, s.v_i_mag) < 6.5)
        .count();
    eprintln!("naked-eye stars from the origin: {naked}; in the extract: {extract_naked}");
    // Companions are placed at their primary's distance, which may move a
    // star at the 6.5 boundary by a few hundredths of a magnitude.
    assert!(
        naked.abs_diff(extract_naked) <= 2,
        "{naked} vs {extract_naked}"
    );
    // Context only: the whole sky holds about 9100 stars brighter than 6.5
    // (Bright Star Catalogue, Hoffleit 1991); 100 ly hold a small part.
    assert!(naked < 9100 / 4);
}

#[test]
fn same_spec_same_catalogue() {
    let a = real_neighbourhood_sector(&sphere(20.0, 9)).unwrap();
    let b = real_neighbourhood_sector(&sphere(20.0, 9)).unwrap();
    assert_eq!(a.id, b.id);
    assert_eq!(a.x_ly, b.x_ly);
    assert!(a.origin.contains(&Origin::Generated));
    assert!(a.id.contains(&71683));
}

#[test]
fn completeness_limit_check_values() {
    // ESA 1997 (SP-1200 Vol. 1; from memory): 7.9 + 1.1 |sin b| earlier than
    // G5, 7.3 + 1.1 |sin b| for G5 and later.
    assert!((completeness_limit_v(0.0, 9000.0) - 7.9).abs() < 1e-12);
    assert!((completeness_limit_v(-90.0, 9000.0) - 9.0).abs() < 1e-12);
    assert!((completeness_limit_v(30.0, 3000.0) - 7.85).abs() < 1e-12);
    assert!((completeness_limit_v(90.0, 5000.0) - 8.4).abs() < 1e-12);
}
