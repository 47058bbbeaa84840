//! The real ground (issue 13): the round Earth and its horizon, relief under a survey, wind on
//! the flight lines and the edges of the block, against published figures, hand calculations
//! and independent formulas (libm), with property tests for the invariants.

use proptest::prelude::*;
use sharpfield::core::physics::earth::{Earth, LookInputs, Sight, SightInputs, EARTH_RADIUS_M};
use sharpfield::core::physics::geometry::Geometry;
use sharpfield::core::planning::ground::{
    block_edges, plan_over_relief, wind_on_lines, EdgeInputs, EdgeUnusable, Leg, OverlapNeed, ReliefInputs, ReliefNote,
    ReliefUnusable, WindInputs, WindLimit, WORKED_EXAMPLE_EXTRA_PHOTOS_PER_END,
};
use sharpfield::core::planning::ground::{MAPPING_FRONT_PCT, MAPPING_SIDE_PCT, MINIMUM_FRONT_PCT, MINIMUM_SIDE_PCT};
use sharpfield::core::planning::survey::{
    flies_forward, overlap_guidance, plan_survey, OverlapClass, OverlapSide, SurveyInputs, SurveySettings,
};

/// |actual − expected| ≤ tolerance·max(1, |expected|).
#[track_caller]
fn close(actual: f64, expected: f64, tolerance: f64) {
    assert!(
        (actual - expected).abs() <= tolerance * expected.abs().max(1.0),
        "{actual} is not within {tolerance} (relative) of {expected}"
    );
}

fn sight(earth: Earth, camera_height_m: f64, ground_distance_m: f64, target_height_m: f64) -> Sight {
    earth
        .sight(&SightInputs {
            camera_height_m,
            ground_distance_m,
            target_height_m,
        })
        .expect("finite inputs give a sight")
}

// ---------------------------------------------------------------------------------------------
// The horizon

#[test]
fn horizon_from_8_m_is_about_11_7_km_with_standard_refraction() {
    // Source: resolution-model §10 ("From 8 m: about 11.7 km with k = 4/3"), after Doerry,
    // Sandia report SAND2012-10690: d = √(2kR_E·h), R_E = 6371 km, k = 4/3.
    let d = Earth::STANDARD.horizon_distance_m(8.0).unwrap();
    assert!((d - 11_700.0).abs() < 50.0, "{d}");
    // The exact arc and tangent agree with the small-height form to far better than that.
    close(Earth::STANDARD.horizon_arc_m(8.0).unwrap(), d, 1e-6);
    close(Earth::STANDARD.horizon_tangent_m(8.0).unwrap(), d, 1e-6);
}

#[test]
fn horizon_against_the_rules_of_thumb() {
    // Common practice (from memory): the radar horizon over a 4/3 Earth is 1.23·√(h in feet)
    // nautical miles, and the bare geometric horizon is 3.57·√(h in metres) km. The constants
    // are rounded to three figures, so the check allows half a percent.
    let ft = 0.3048;
    let nmi = 1852.0;
    for feet in [10.0, 1000.0, 30_000.0] {
        let d = Earth::STANDARD.horizon_distance_m(feet * ft).unwrap() / nmi;
        close(d, 1.23 * f64::sqrt(feet), 5e-3);
    }
    for metres in [1.5, 100.0, 2000.0] {
        let d = Earth::GEOMETRIC.horizon_distance_m(metres).unwrap() / 1000.0;
        close(d, 3.57 * f64::sqrt(metres), 5e-3);
    }
}

#[test]
fn exact_horizon_against_the_right_triangle() {
    // Independent of the module's forms: the line of sight to the horizon is tangent to the
    // sphere, so centre, camera and tangent point make a right triangle with hypotenuse r + h:
    // tangent² = (r + h)² − r² (Pythagoras) and the arc is r·arccos(r/(r + h)) (libm's acos).
    for earth in [Earth::GEOMETRIC, Earth::STANDARD, Earth::with_refraction(0.8).unwrap()] {
        let r = earth.radius_m();
        for h in [2.0, 400.0, 20_000.0, 400_000.0, 36_000_000.0] {
            let tangent = libm::sqrt((r + h) * (r + h) - r * r);
            close(earth.horizon_tangent_m(h).unwrap(), tangent, 1e-9);
            // acos loses digits near 1, so the reference holds to about 1e−7 at 2 m.
            let arc = r * libm::acos(r / (r + h));
            close(earth.horizon_arc_m(h).unwrap(), arc, 1e-6);
            assert!(earth.horizon_arc_m(h).unwrap() <= earth.horizon_distance_m(h).unwrap());
            assert!(earth.horizon_distance_m(h).unwrap() <= earth.horizon_tangent_m(h).unwrap());
            // The look angle to the horizon: its sine is r/(r + h) in the same triangle.
            close(earth.horizon_look_angle_rad(h).unwrap(), libm::asin(r / (r + h)), 1e-9);
        }
    }
}

#[test]
fn the_vehicle_20_km_from_an_8_m_mast_is_not_in_view() {
    // Source: issue 13 and resolution-model §10. A vehicle 2 m tall (our figure) is in view up to
    // √(2kR_E·8) + √(2kR_E·2) ≈ 11.66 + 5.83 = 17.5 km, so not at 20 km.
    let earth = Earth::STANDARD;
    let limit = earth.max_visible_distance_m(8.0, 2.0).unwrap();
    let by_hand = f64::sqrt(2.0 * 4.0 / 3.0 * EARTH_RADIUS_M * 8.0) + f64::sqrt(2.0 * 4.0 / 3.0 * EARTH_RADIUS_M * 2.0);
    close(limit, by_hand, 1e-12);
    assert!((limit - 17_490.0).abs() < 10.0, "{limit}");
    assert!(!sight(earth, 8.0, 20_000.0, 2.0).visible);
    assert!(sight(earth, 8.0, 17_000.0, 2.0).visible);
    // A target on the ground is in view to the camera's own horizon only.
    assert!(sight(earth, 8.0, 11_600.0, 0.0).visible);
    assert!(!sight(earth, 8.0, 11_700.0, 0.0).visible);
    // Less refraction brings the horizon closer.
    assert!(!sight(Earth::GEOMETRIC, 8.0, 17_000.0, 2.0).visible);
}

#[test]
fn refraction_factor_is_checked() {
    assert_eq!(Earth::with_refraction(4.0 / 3.0), Some(Earth::STANDARD));
    assert_eq!(Earth::default(), Earth::STANDARD);
    for k in [0.0, -1.0, f64::NAN, f64::INFINITY, 1e13] {
        assert_eq!(Earth::with_refraction(k), None, "k = {k}");
    }
    close(Earth::STANDARD.radius_m(), 6_371_000.0 * 4.0 / 3.0, 1e-15);
}

// ---------------------------------------------------------------------------------------------
// The line of sight

#[test]
fn slant_range_and_angles_by_the_law_of_cosines() {
    // By hand (law of cosines and sines, not the module's half-angle forms): k = 1, a camera
    // 100 km up, a target on the ground 0.1 rad of arc away (637.1 km). a = 6471 km, b = 6371 km:
    // L² = a² + b² − 2ab·cos 0.1 → L ≈ 649.557 km; the look angle from straight down satisfies
    // sin θ / b = sin φ / L → θ ≈ 78.290°; the angle at the target between the centre and the
    // camera, γ, has cos γ = (b² + L² − a²)/(2bL), and the elevation is γ − 90°.
    let (a, b, phi) = (EARTH_RADIUS_M + 100_000.0, EARTH_RADIUS_M, 0.1);
    let s = sight(Earth::GEOMETRIC, 100_000.0, EARTH_RADIUS_M * phi, 0.0);
    let range = libm::sqrt(a * a + b * b - 2.0 * a * b * libm::cos(phi));
    close(s.slant_range_m, range, 1e-12);
    assert!((s.slant_range_m - 649_557.0).abs() < 1.0);
    close(s.look_angle_rad, libm::asin(b * libm::sin(phi) / range), 1e-12);
    assert!((s.look_angle_rad.to_degrees() - 78.290).abs() < 1e-3);
    let gamma = libm::acos((b * b + range * range - a * a) / (2.0 * b * range));
    close(s.elevation_rad, gamma - std::f64::consts::FRAC_PI_2, 1e-9);
    // The three angles of the triangle centre–camera–target add to π.
    close(phi + s.look_angle_rad + gamma, std::f64::consts::PI, 1e-12);
    assert!(s.visible);
    close(
        s.depression_rad(),
        std::f64::consts::FRAC_PI_2 - s.look_angle_rad,
        1e-15,
    );
}

#[test]
fn a_flat_earth_is_the_limit_of_a_large_radius() {
    // With k very large the sphere is flat over a few kilometres: slant range and look angle
    // tend to geometry.rs's plain trigonometry for a target on the ground.
    let flat = Earth::with_refraction(1e9).unwrap();
    for (h, g) in [(80.0, 0.0), (80.0, 300.0), (2000.0, 5000.0)] {
        let s = sight(flat, h, g, 0.0);
        let plain = Geometry {
            height_m: h,
            ground_distance_m: g,
            ..Geometry::default()
        };
        close(s.slant_range_m, plain.slant_range_m(), 1e-7);
        close(s.look_angle_rad, plain.look_angle_rad(), 1e-7);
    }
}

#[test]
fn a_tripod_looking_at_a_head_at_its_own_height_looks_level() {
    // Issue 13: a tripod at 1.5 m looking at a person's head at 1.5 m. On a flat Earth the look
    // angle would be exactly 90° and the elevation 0; the curve tilts both by half the arc
    // (φ/2 = 100 m / 2r, about 5.9 µrad at k = 4/3).
    let s = sight(Earth::STANDARD, 1.5, 100.0, 1.5);
    let half_arc = 0.5 * 100.0 / Earth::STANDARD.radius_m();
    close(s.look_angle_rad, std::f64::consts::FRAC_PI_2 - half_arc, 1e-9);
    close(s.elevation_rad, -half_arc, 1e-6);
    // The chord 1.5 m up is longer than the 100 m of ground below it: 2(r + 1.5)·sin(φ/2).
    let r = Earth::STANDARD.radius_m();
    close(s.slant_range_m, 2.0 * (r + 1.5) * libm::sin(half_arc), 1e-12);
    assert!(s.visible);
}

#[test]
fn twenty_km_up_at_85_degrees() {
    // Issue 13: "at 20 km height and 85° tilt the flat-Earth slant range is 229 km where a
    // sphere gives 322 km". Flat: 20 km / cos 85° = 229.47 km (geometry.rs). On a sphere the ray
    // meets the ground at the nearer root of t² − 2a·cos θ·t + a² − r² = 0 (a = r + 20 km),
    // solved here with libm: 322.44 km for k = 1 and 283.27 km for k = 4/3. So the issue's
    // 322 km is the bare sphere, without refraction; with standard refraction it is 283 km.
    let flat = Geometry::tilted(20_000.0, 85f64.to_radians());
    assert!((flat.slant_range_m() - 229_474.0).abs() < 1.0);
    for (earth, expected_km) in [(Earth::GEOMETRIC, 322.44), (Earth::STANDARD, 283.27)] {
        let r = earth.radius_m();
        let a = r + 20_000.0;
        let theta = 85f64.to_radians();
        let t = a * libm::cos(theta) - libm::sqrt(r * r - a * a * libm::sin(theta).powi(2));
        let s = earth
            .sight_at_look_angle(&LookInputs {
                camera_height_m: 20_000.0,
                look_angle_rad: theta,
                target_height_m: 0.0,
            })
            .expect("85° is below the horizon from 20 km");
        close(s.slant_range_m, t, 1e-9);
        assert!(
            (s.slant_range_m / 1000.0 - expected_km).abs() < 0.01,
            "{}",
            s.slant_range_m
        );
        close(s.look_angle_rad, theta, 1e-9);
        assert!(s.visible);
    }
}

#[test]
fn a_look_above_the_horizon_meets_no_ground() {
    let earth = Earth::STANDARD;
    let grazing = earth.horizon_look_angle_rad(20_000.0).unwrap();
    let look = |look_angle_rad: f64| {
        earth.sight_at_look_angle(&LookInputs {
            camera_height_m: 20_000.0,
            look_angle_rad,
            target_height_m: 0.0,
        })
    };
    assert_eq!(look(grazing + 1e-6), None);
    assert_eq!(look(std::f64::consts::FRAC_PI_2), None);
    // Just below the grazing angle the ground is met near the horizon, and is in view.
    let s = look(grazing - 1e-9).unwrap();
    assert!(s.visible);
    close(s.ground_distance_m, earth.horizon_arc_m(20_000.0).unwrap(), 1e-3);
}

#[test]
fn heights_along_the_line_of_sight() {
    // Ends: the target's height at s = 0 and the camera's at s = 1 (the turbulence integral's
    // direction, turbulence::integrate_unit_path).
    let s = sight(Earth::STANDARD, 500.0, 3000.0, 2.0);
    close(s.height_along_path_m(0.0), 2.0, 1e-9);
    close(s.height_along_path_m(1.0), 500.0, 1e-9);
    // A short path is nearly the straight ramp of the flat Earth.
    close(s.height_along_path_m(0.5), 251.0, 1e-3);
    // Two 10 m masts at twice the horizon arc apart: the line between them grazes the ground at
    // its middle. Generally, by hand: the chord's middle is (r + h)·cos(φ/2) from the centre.
    let earth = Earth::STANDARD;
    let r = earth.radius_m();
    let g = 2.0 * earth.horizon_arc_m(10.0).unwrap();
    let masts = sight(earth, 10.0, g, 10.0);
    assert!(
        masts.height_along_path_m(0.5).abs() < 1e-6,
        "{}",
        masts.height_along_path_m(0.5)
    );
    for g in [5_000.0, 20_000.0] {
        let phi = g / r;
        let by_hand = (r + 10.0) * libm::cos(phi / 2.0) - r;
        let m = sight(earth, 10.0, g, 10.0);
        close(m.height_along_path_m(0.5), by_hand.max(0.0), 1e-6);
    }
    // Beyond that the line passes under the ground, which reads 0 there.
    assert_eq!(sight(earth, 10.0, 2.0 * g, 10.0).height_along_path_m(0.5), 0.0);
    // Fractions outside [0, 1] are clamped; NaN reads as the target's end.
    assert_eq!(s.height_along_path_m(-3.0), s.height_along_path_m(0.0));
    assert_eq!(s.height_along_path_m(7.0), s.height_along_path_m(1.0));
    assert_eq!(s.height_along_path_m(f64::NAN), s.height_along_path_m(0.0));
}

#[test]
fn inputs_that_are_not_numbers_give_none() {
    let e = Earth::STANDARD;
    assert_eq!(e.horizon_distance_m(f64::NAN), None);
    assert_eq!(e.horizon_arc_m(f64::INFINITY), None);
    assert_eq!(e.max_visible_distance_m(8.0, f64::NEG_INFINITY), None);
    assert_eq!(e.horizon_distance_m(-5.0), Some(0.0));
    let nan_distance = SightInputs {
        camera_height_m: 8.0,
        ground_distance_m: f64::NAN,
        target_height_m: 0.0,
    };
    assert_eq!(e.sight(&nan_distance), None);
}

// ---------------------------------------------------------------------------------------------
// Relief

/// The demo field worked by hand in tests/survey.rs: 13.2 × 8.8 mm sensor, 8.8 mm lens, 80 m →
/// footprint 120 m across and 80 m along; 75 % / 65 % → base 20 m, spacing 42 m.
fn demo_field() -> SurveyInputs {
    SurveyInputs {
        sensor_width_mm: 13.2,
        sensor_height_mm: 8.8,
        focal_mm: 8.8,
        height_m: 80.0,
        looks_down: true,
        gsd_m: 0.025,
        speed_mps: 8.0,
        shutter_s: 1.0 / 1000.0,
        settings: SurveySettings {
            front_overlap_pct: 75.0,
            side_overlap_pct: 65.0,
            area_width_m: Some(400.0),
            area_length_m: Some(600.0),
            ..SurveySettings::default()
        },
    }
}

fn demo_relief(lowest_ground_m: f64, highest_ground_m: f64) -> ReliefInputs {
    let inputs = demo_field();
    let plan = plan_survey(&inputs);
    ReliefInputs::from_plan(&plan, 80.0, inputs.gsd_m, lowest_ground_m, highest_ground_m)
}

#[test]
fn a_20_m_hill_under_an_80_m_survey() {
    // Issue 13: "A 20 m hill under an 80 m survey turns 75 / 65 % overlap into about 67 / 53 %".
    // By hand: 60 m above the hill the footprint is 60/80 of the planned one, so the front
    // overlap is 1 − 20/(80·0.75) = 66.7 % and the side 1 − 42/(120·0.75) = 53.3 %.
    let p = plan_over_relief(&demo_relief(-5.0, 20.0)).unwrap();
    close(p.front_planned_pct, 75.0, 1e-12);
    close(p.side_planned_pct, 65.0, 1e-12);
    close(p.front_min_pct, 100.0 * (1.0 - 20.0 / 60.0), 1e-12);
    close(p.side_min_pct, 100.0 * (1.0 - 42.0 / 90.0), 1e-12);
    // GSD: finest over the hill (60/80), coarsest 5 m below take-off (85/80).
    close(p.gsd_min_m, 0.025 * 0.75, 1e-12);
    close(p.gsd_max_m, 0.025 * 85.0 / 80.0, 1e-12);
    // The greatest overlaps are over the lowest ground: 1 − 20/85 and 1 − 42/127.5.
    close(p.front_max_pct, 100.0 * (1.0 - 20.0 / 85.0), 1e-12);
    close(p.side_max_pct, 100.0 * (1.0 - 42.0 / 127.5), 1e-12);
    // Both sides fall below what mapping needs (75 / 60 %), not below the least of any survey.
    let short: Vec<_> = p
        .notes
        .iter()
        .filter_map(|n| match n {
            ReliefNote::OverlapShort { side, need, .. } => Some((*side, *need)),
            _ => None,
        })
        .collect();
    assert_eq!(
        short,
        vec![
            (OverlapSide::Front, OverlapNeed::Mapping),
            (OverlapSide::Side, OverlapNeed::Mapping)
        ]
    );
    // What restores them: fly at 100 m with the same base and spacing, or keep 80 m and shorten
    // both to 60/80 (15 m and 31.5 m).
    assert_eq!(p.restoring_height_m, Some(100.0));
    close(p.restoring_base_m.unwrap(), 15.0, 1e-12);
    close(p.restoring_line_spacing_m.unwrap(), 31.5, 1e-12);
}

#[test]
fn the_restoring_figures_restore_the_planned_overlaps() {
    let original = demo_relief(0.0, 20.0);
    let p = plan_over_relief(&original).unwrap();
    // Higher: the footprint at take-off level grows with the height (100/80), base and spacing
    // stay; the survey code gives the footprint at 100 m.
    let higher_height = p.restoring_height_m.unwrap();
    let higher = plan_survey(&SurveyInputs {
        height_m: higher_height,
        ..demo_field()
    });
    let raised = plan_over_relief(&ReliefInputs {
        height_m: higher_height,
        footprint_across_m: higher.footprint_across_m,
        footprint_along_m: higher.footprint_along_m,
        ..original
    })
    .unwrap();
    close(raised.front_min_pct, 75.0, 1e-9);
    close(raised.side_min_pct, 65.0, 1e-9);
    // Closer: the same height, the shorter base and spacing.
    let closer = plan_over_relief(&ReliefInputs {
        base_m: p.restoring_base_m.unwrap(),
        line_spacing_m: p.restoring_line_spacing_m.unwrap(),
        ..original
    })
    .unwrap();
    close(closer.front_min_pct, 75.0, 1e-9);
    close(closer.side_min_pct, 65.0, 1e-9);
    assert!(raised.notes.is_empty() && closer.notes.is_empty());
}

#[test]
fn a_higher_hill_takes_the_front_overlap_below_any_survey() {
    // By hand: 45 m above a 35 m hill the footprint is 45/80; front 1 − 20/45 = 55.6 % (below
    // the 60 % of film surveys), side 1 − 42/67.5 = 37.8 % (above 30 %, below 60 %).
    let p = plan_over_relief(&demo_relief(0.0, 35.0)).unwrap();
    close(p.front_min_pct, 100.0 * (1.0 - 20.0 / 45.0), 1e-12);
    assert!(p.notes.contains(&ReliefNote::OverlapShort {
        side: OverlapSide::Front,
        least_pct: p.front_min_pct,
        planned_pct: p.front_planned_pct,
        need: OverlapNeed::Minimum,
    }));
    assert!(p.notes.contains(&ReliefNote::OverlapShort {
        side: OverlapSide::Side,
        least_pct: p.side_min_pct,
        planned_pct: p.side_planned_pct,
        need: OverlapNeed::Mapping,
    }));
}

#[test]
fn ground_below_take_off_only_adds_overlap() {
    let p = plan_over_relief(&demo_relief(-30.0, -10.0)).unwrap();
    assert!(p.front_min_pct > 75.0 && p.side_min_pct > 65.0);
    assert!(p.notes.is_empty());
    assert_eq!(p.restoring_height_m, None);
    assert_eq!(p.restoring_base_m, None);
}

#[test]
fn level_ground_warns_of_nothing_even_below_mapping() {
    // A plan below the mapping overlaps on level ground is the survey's overlap advice to give,
    // not the relief's.
    let p = plan_over_relief(&ReliefInputs {
        base_m: 40.0,
        ..demo_relief(0.0, 0.0)
    })
    .unwrap();
    close(p.front_min_pct, 50.0, 1e-12);
    assert!(p.notes.is_empty());
}

#[test]
fn relief_that_cannot_be_flown_or_read() {
    assert_eq!(
        plan_over_relief(&demo_relief(0.0, 80.0)),
        Err(ReliefUnusable::GroundReachesFlight {
            highest_ground_m: 80.0,
            height_m: 80.0
        })
    );
    assert_eq!(
        plan_over_relief(&demo_relief(f64::NAN, 10.0)),
        Err(ReliefUnusable::Ground)
    );
    let no_overlap = ReliefInputs {
        base_m: 80.0,
        ..demo_relief(0.0, 10.0)
    };
    assert_eq!(plan_over_relief(&no_overlap), Err(ReliefUnusable::NoOverlapPlanned));
    let swapped = plan_over_relief(&demo_relief(20.0, -5.0)).unwrap();
    assert!(swapped.notes.contains(&ReliefNote::GroundSwapped));
    assert_eq!(
        swapped.gsd_min_m,
        plan_over_relief(&demo_relief(-5.0, 20.0)).unwrap().gsd_min_m
    );
}

#[test]
fn the_needs_are_the_bounds_of_the_survey_advice() {
    // The mapping need is the lower edge of survey::overlap_guidance's mapping class and the
    // minimum its "low" edge (common practice, as that function states).
    assert_eq!(
        overlap_guidance(MAPPING_FRONT_PCT, MAPPING_SIDE_PCT).class,
        OverlapClass::Mapping
    );
    assert_ne!(
        overlap_guidance(MAPPING_FRONT_PCT - 0.1, MAPPING_SIDE_PCT).class,
        OverlapClass::Mapping
    );
    assert_ne!(
        overlap_guidance(MAPPING_FRONT_PCT, MAPPING_SIDE_PCT - 0.1).class,
        OverlapClass::Mapping
    );
    assert_ne!(
        overlap_guidance(MINIMUM_FRONT_PCT, MINIMUM_SIDE_PCT).class,
        OverlapClass::Low
    );
    assert_eq!(
        overlap_guidance(MINIMUM_FRONT_PCT - 0.1, MINIMUM_SIDE_PCT).class,
        OverlapClass::Low
    );
    assert_eq!(
        overlap_guidance(MINIMUM_FRONT_PCT, MINIMUM_SIDE_PCT - 0.1).class,
        OverlapClass::Low
    );
}

// ---------------------------------------------------------------------------------------------
// Wind

fn wind(
    airspeed_mps: f64,
    wind_mps: f64,
    wind_from_deg: f64,
    heading_deg: f64,
) -> Result<sharpfield::core::planning::ground::WindOnLines, WindLimit> {
    wind_on_lines(&WindInputs {
        airspeed_mps,
        wind_mps,
        wind_from_deg,
        heading_deg,
    })
}

#[test]
fn wind_across_the_line_by_hand() {
    // By hand (the wind triangle): 10 m/s through the air, 4 m/s straight across the line. The
    // nose turns into the wind by asin(4/10) = 23.58°, and what is left along the line is
    // √(10² − 4²) = √84 = 9.165 m/s on both legs.
    for (from, heading) in [(90.0, 0.0), (270.0, 0.0), (0.0, 90.0), (135.0, 45.0)] {
        let w = wind(10.0, 4.0, from, heading).unwrap();
        close(w.out.ground_speed_mps, f64::sqrt(84.0), 1e-12);
        close(w.back.ground_speed_mps, f64::sqrt(84.0), 1e-12);
        close(w.out.crab_rad.abs(), libm::asin(0.4), 1e-12);
        close(w.back.crab_rad, -w.out.crab_rad, 1e-12);
        assert_eq!(w.fastest(), None);
        close(w.pair_ground_speed_mps(), f64::sqrt(84.0), 1e-12);
    }
    // A wind from the west on a line flown north pushes east, to the right: the nose turns left
    // (negative) on the way out and right on the way back.
    let w = wind(10.0, 4.0, 270.0, 0.0).unwrap();
    assert!(w.out.crab_rad < 0.0 && w.back.crab_rad > 0.0);
    close(w.across_mps, 4.0, 1e-12);
}

#[test]
fn wind_along_the_line_by_hand() {
    // By hand: 10 m/s into a 4 m/s headwind on the way out (wind from the north, line flown
    // north) gives 6 m/s, and 14 m/s back with it behind; no crab. Over a pair of equal lines
    // the mean ground speed is 2·6·14/20 = 8.4 m/s, not 10.
    let w = wind(10.0, 4.0, 0.0, 0.0).unwrap();
    close(w.out.ground_speed_mps, 6.0, 1e-12);
    close(w.back.ground_speed_mps, 14.0, 1e-12);
    assert!(w.out.crab_rad.abs() < 1e-12);
    assert_eq!(w.fastest(), Some(Leg::Back));
    close(w.fastest_ground_speed_mps(), 14.0, 1e-12);
    close(w.pair_ground_speed_mps(), 8.4, 1e-12);
    close(w.along_mps, -4.0, 1e-12);
    // At 60° off the nose: along −4·cos 60° = −2, across 4·sin 60° = 3.464;
    // ground speed out √(100 − 12) − 2 = 7.381 m/s, back 11.381 m/s.
    let w = wind(10.0, 4.0, 60.0, 0.0).unwrap();
    close(w.out.ground_speed_mps, f64::sqrt(88.0) - 2.0, 1e-12);
    close(w.back.ground_speed_mps, f64::sqrt(88.0) + 2.0, 1e-12);
    assert_eq!(w.leg(Leg::of_line(2)), w.back);
}

#[test]
fn winds_that_stop_the_survey() {
    // Across as fast as the airspeed: no heading holds the line.
    assert!(matches!(
        wind(10.0, 10.0, 90.0, 0.0),
        Err(WindLimit::CannotHoldLine { .. })
    ));
    assert!(matches!(
        wind(10.0, 25.0, 80.0, 0.0),
        Err(WindLimit::CannotHoldLine { .. })
    ));
    // A headwind faster than the airspeed: the line holds but the out leg goes nowhere.
    assert_eq!(
        wind(10.0, 12.0, 0.0, 0.0),
        Err(WindLimit::NoHeadway {
            leg: Leg::Out,
            wind_mps: 12.0,
            airspeed_mps: 10.0
        })
    );
    assert_eq!(wind(0.0, 1.0, 0.0, 0.0), Err(WindLimit::NoAirspeed));
    assert_eq!(wind(10.0, -1.0, 0.0, 0.0), Err(WindLimit::WindUnusable));
    assert_eq!(wind(10.0, 1.0, f64::NAN, 0.0), Err(WindLimit::WindUnusable));
}

#[test]
fn legs_follow_the_serpentine() {
    for n in 1..=6 {
        assert_eq!(Leg::of_line(n) == Leg::Out, flies_forward(n));
    }
}

// ---------------------------------------------------------------------------------------------
// The edges of the block

// NPTEL course 105104100 (Photogrammetry), lecture "Flight planning", Example 1 (as in
// tests/survey.rs): 45 km × 36 km at 1:12000 with f = 21 cm and 23 cm photos, 60 % / 30 %,
// 200 km/h → air base 1104 m, interval 19.872 s (set to 19 s), 20 lines, 44 + 2 + 2 = 48 photos
// per line, 960 photos. As survey inputs: a 230 mm square "sensor" behind a 210 mm lens at
// 12000 × 0.21 m = 2520 m, the lines along the 45 km side.
fn nptel_example_1(front_overlap_pct: f64) -> SurveyInputs {
    SurveyInputs {
        sensor_width_mm: 230.0,
        sensor_height_mm: 230.0,
        focal_mm: 210.0,
        height_m: 12_000.0 * 0.21,
        looks_down: true,
        gsd_m: 0.1,
        speed_mps: 200.0 / 3.6,
        shutter_s: 1.0 / 500.0,
        settings: SurveySettings {
            front_overlap_pct,
            side_overlap_pct: 30.0,
            area_width_m: Some(36_000.0),
            area_length_m: Some(45_000.0),
            ..SurveySettings::default()
        },
    }
}

#[test]
fn nptel_example_1_with_the_extra_photos_at_each_end() {
    // Source: NPTEL 105104100, "Flight planning", Example 1.
    let first = plan_survey(&nptel_example_1(60.0));
    close(first.base_m, 1104.0, 1e-9);
    close(first.trigger_s.unwrap(), 19.872, 1e-9);
    assert_eq!(first.lines, Some(20));
    // The example rounds the interval down to 19 s and flies 55.55 m/s: a 1055.45 m base.
    let base = 55.55 * first.trigger_s.unwrap().floor();
    let adjusted = plan_survey(&nptel_example_1(100.0 * (1.0 - base / first.footprint_along_m)));
    // The plan counts the extras itself: ceil(half a footprint / base) = 2 at each end.
    assert_eq!(adjusted.extra_photos_per_end, Some(2));
    assert_eq!(adjusted.photos_per_line, Some(48));
    assert_eq!(adjusted.photos, Some(960));
    assert_eq!(EdgeInputs::from_plan(&adjusted, 0).unwrap().photos_per_line, 44);
    let edges = block_edges(&EdgeInputs::from_plan(&adjusted, WORKED_EXAMPLE_EXTRA_PHOTOS_PER_END).unwrap()).unwrap();
    assert_eq!(edges.photos_per_line, 48);
    assert_eq!(edges.photos, 960);
    close(edges.extension_m, 2.0 * 1055.45, 1e-9);
    // Our margin for full overlap at the area's ends, half a footprint (1380 m), takes
    // ceil(1380/1055.45) = 2 photos at each end, the example's two; at the 1104 m base too.
    close(edges.full_overlap_margin_along_m, 1380.0, 1e-12);
    assert_eq!(edges.photos_for_margin, 2);
    let at_1104 = block_edges(&EdgeInputs::from_plan(&first, 0).unwrap()).unwrap();
    assert_eq!(at_1104.photos_for_margin, 2);
    assert_eq!(at_1104.photos, 20 * (first.photos_per_line.unwrap() - 4));
    // Across: half of 2760 m over a 1932 m spacing is one line beyond each side, which the
    // example does not add (its 20 lines are ceil(36000/1932) + 1).
    assert_eq!(edges.lines_for_margin, 1);
}

#[test]
fn margins_for_drone_overlaps_by_hand() {
    // By hand: the demo field (80 m along, base 20 m; 120 m across, spacing 42 m): margins of
    // 40 m and 60 m, two photos (40/20, exactly) and two lines (60/42 → 2) beyond each edge.
    let plan = plan_survey(&demo_field());
    let edges = block_edges(&EdgeInputs::from_plan(&plan, 3).unwrap()).unwrap();
    close(edges.full_overlap_margin_along_m, 40.0, 1e-12);
    close(edges.full_overlap_margin_across_m, 60.0, 1e-12);
    assert_eq!(edges.photos_for_margin, 2);
    assert_eq!(edges.lines_for_margin, 2);
    assert_eq!(edges.photos_per_line, 31 + 6);
    assert_eq!(edges.photos, 11 * 37);
}

#[test]
fn edges_that_cannot_be_counted() {
    let plan = plan_survey(&demo_field());
    let inputs = EdgeInputs::from_plan(&plan, 2).unwrap();
    assert_eq!(
        block_edges(&EdgeInputs { base_m: 0.0, ..inputs }),
        Err(EdgeUnusable::Layout)
    );
    assert_eq!(
        block_edges(&EdgeInputs {
            extra_photos_per_end: u64::MAX,
            ..inputs
        }),
        Err(EdgeUnusable::TooManyPhotos)
    );
    assert_eq!(
        block_edges(&EdgeInputs {
            lines: u64::MAX,
            ..inputs
        }),
        Err(EdgeUnusable::TooManyPhotos)
    );
}

// ---------------------------------------------------------------------------------------------
// Properties

/// Any f64 at all: NaN, infinities, subnormals, signs.
fn any_f64() -> impl Strategy<Value = f64> {
    prop_oneof![
        proptest::num::f64::ANY,
        -1e7f64..1e7,
        Just(0.0),
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(f64::MAX),
    ]
}

fn no_nan_in_sight(s: &Sight) {
    for x in [
        s.camera_height_m,
        s.target_height_m,
        s.ground_distance_m,
        s.central_angle_rad,
        s.slant_range_m,
        s.look_angle_rad,
        s.elevation_rad,
        s.radius_m,
        s.depression_rad(),
    ] {
        assert!(x.is_finite(), "{s:?}");
    }
}

proptest! {
    #[test]
    fn a_target_in_view_is_never_beyond_the_horizon(
        h in 0.0f64..50_000.0,
        ht in 0.0f64..500.0,
        g in 0.0f64..2_000_000.0,
        k in 0.5f64..2.0,
    ) {
        let earth = Earth::with_refraction(k).unwrap();
        let s = earth.sight(&SightInputs { camera_height_m: h, ground_distance_m: g, target_height_m: ht }).unwrap();
        let exact = earth.max_visible_ground_m(h, ht).unwrap();
        let small = earth.max_visible_distance_m(h, ht).unwrap();
        if s.visible {
            prop_assert!(g <= exact * (1.0 + 1e-9) + 1e-9, "{g} beyond {exact}");
            prop_assert!(g <= small * (1.0 + 1e-9) + 1e-9, "{g} beyond {small}");
        } else {
            prop_assert!(g >= exact * (1.0 - 1e-9));
        }
        // The line of sight to a target in view never dips below the ground.
        if s.visible && g > 0.0 {
            for i in 0..=8 {
                prop_assert!(s.height_along_path_m(i as f64 / 8.0) >= 0.0);
            }
        }
    }

    #[test]
    fn the_edge_of_view_is_where_the_horizons_meet(
        h in 0.0f64..50_000.0,
        ht in 0.0f64..500.0,
        k in 0.5f64..2.0,
        beyond in 1e-7f64..1e-2,
    ) {
        // Within a hair of the limit on either side: in view just short of the sum of the two
        // horizon arcs, out of view just past it.
        let earth = Earth::with_refraction(k).unwrap();
        let exact = earth.max_visible_ground_m(h, ht).unwrap();
        let at = |g: f64| earth.sight(&SightInputs { camera_height_m: h, ground_distance_m: g, target_height_m: ht }).unwrap();
        prop_assert!(at(exact * (1.0 - beyond)).visible);
        prop_assert!(!at(exact * (1.0 + beyond)).visible || exact == 0.0);
    }

    #[test]
    fn the_look_angle_round_trips(h in 1.0f64..40_000.0, ht in 0.0f64..1.0, u in 0.0f64..0.999) {
        let earth = Earth::STANDARD;
        let grazing = earth.horizon_look_angle_rad(h).unwrap();
        let theta = u * grazing;
        let s = earth.sight_at_look_angle(&LookInputs { camera_height_m: h, look_angle_rad: theta, target_height_m: ht });
        if ht < h {
            let s = s.unwrap();
            prop_assert!((s.look_angle_rad - theta).abs() < 1e-7, "{} against {theta}", s.look_angle_rad);
            prop_assert!((s.height_along_path_m(0.0) - ht).abs() < 1e-6 * h.max(1.0));
        }
    }

    #[test]
    fn overlaps_never_rise_as_the_relief_grows(
        h in 10.0f64..500.0,
        lo in -200.0f64..0.0,
        hi_share in 0.0f64..0.95,
        grow_share in 0.0f64..1.0,
        deepen in 0.0f64..100.0,
        front in 0.0f64..95.0,
        side in 0.0f64..95.0,
    ) {
        let hi = hi_share * h;
        let higher = hi + grow_share * (0.95 * h - hi);
        let inputs = ReliefInputs {
            height_m: h,
            lowest_ground_m: lo,
            highest_ground_m: hi,
            gsd_m: 0.01,
            footprint_across_m: 120.0,
            footprint_along_m: 80.0,
            base_m: 80.0 * (1.0 - front / 100.0),
            line_spacing_m: 120.0 * (1.0 - side / 100.0),
        };
        let before = plan_over_relief(&inputs).unwrap();
        let after = plan_over_relief(&ReliefInputs {
            lowest_ground_m: lo - deepen,
            highest_ground_m: higher,
            ..inputs
        }).unwrap();
        prop_assert!(after.front_min_pct <= before.front_min_pct + 1e-9);
        prop_assert!(after.side_min_pct <= before.side_min_pct + 1e-9);
        prop_assert!(after.gsd_min_m <= before.gsd_min_m + 1e-15);
        prop_assert!(after.gsd_max_m >= before.gsd_max_m - 1e-15);
        prop_assert!(before.front_min_pct <= before.front_max_pct && before.gsd_min_m <= before.gsd_max_m);
    }

    #[test]
    fn the_crab_holds_the_line(v in 0.1f64..40.0, w in 0.0f64..40.0, from in -720.0f64..720.0, heading in -720.0f64..720.0) {
        // Independent of the module's triangle: add the air's velocity (airspeed along the
        // heading turned by the crab) and the wind's, east and north, and look at the sum along
        // and across the line.
        if let Ok(result) = wind(v, w, from, heading) {
            for (leg, track) in [(Leg::Out, heading), (Leg::Back, heading + 180.0)] {
                let l = result.leg(leg);
                let nose = track.to_radians() + l.crab_rad;
                let blows = (from + 180.0).to_radians();
                let east = v * nose.sin() + w * blows.sin();
                let north = v * nose.cos() + w * blows.cos();
                let (ts, tc) = track.to_radians().sin_cos();
                let along = east * ts + north * tc;
                let across = east * tc - north * ts;
                prop_assert!(across.abs() < 1e-9 * (v + w), "drifts {across} off the line");
                prop_assert!((along - l.ground_speed_mps).abs() < 1e-9 * (v + w));
                prop_assert!(l.ground_speed_mps > 0.0);
            }
        } else {
            // Only a wind as fast as the airspeed stops the survey.
            prop_assert!(w >= v * (1.0 - 1e-12));
        }
    }

    #[test]
    fn nothing_panics_or_returns_nan(a in any_f64(), b in any_f64(), c in any_f64(), d in any_f64(), s in any_f64()) {
        let earths = [Some(Earth::STANDARD), Earth::with_refraction(a), Earth::with_refraction(d)];
        for earth in earths.into_iter().flatten() {
            for x in [earth.horizon_distance_m(a), earth.horizon_tangent_m(a), earth.horizon_arc_m(a),
                      earth.horizon_look_angle_rad(b), earth.max_visible_distance_m(a, b),
                      earth.max_visible_ground_m(b, c)].into_iter().flatten() {
                prop_assert!(x.is_finite() && x >= 0.0);
            }
            if let Some(sight) = earth.sight(&SightInputs { camera_height_m: a, ground_distance_m: b, target_height_m: c }) {
                no_nan_in_sight(&sight);
                prop_assert!(sight.height_along_path_m(s).is_finite());
            }
            if let Some(sight) = earth.sight_at_look_angle(&LookInputs { camera_height_m: a, look_angle_rad: b, target_height_m: c }) {
                no_nan_in_sight(&sight);
                prop_assert!(sight.height_along_path_m(s).is_finite());
            }
        }
        if let Ok(p) = plan_over_relief(&ReliefInputs {
            height_m: a, lowest_ground_m: b, highest_ground_m: c, gsd_m: d,
            footprint_across_m: s, footprint_along_m: a, base_m: b, line_spacing_m: c,
        }) {
            for x in [p.gsd_min_m, p.gsd_max_m, p.front_min_pct, p.side_min_pct, p.front_max_pct, p.side_max_pct,
                      p.front_planned_pct, p.side_planned_pct] {
                prop_assert!(x.is_finite());
            }
            for x in [p.restoring_height_m, p.restoring_base_m, p.restoring_line_spacing_m].into_iter().flatten() {
                prop_assert!(x.is_finite());
            }
        }
        if let Ok(w) = wind(a, b, c, d) {
            for x in [w.out.ground_speed_mps, w.back.ground_speed_mps, w.out.crab_rad, w.back.crab_rad,
                      w.along_mps, w.across_mps, w.pair_ground_speed_mps(), w.fastest_ground_speed_mps()] {
                prop_assert!(x.is_finite());
            }
        }
        let count = |x: f64| if x.is_finite() { x.abs().min(u64::MAX as f64) as u64 } else { 0 };
        if let Ok(e) = block_edges(&EdgeInputs {
            footprint_across_m: a, footprint_along_m: b, base_m: c, line_spacing_m: d,
            lines: count(s), photos_per_line: count(a), extra_photos_per_end: count(b),
        }) {
            for x in [e.extension_m, e.full_overlap_margin_along_m, e.full_overlap_margin_across_m] {
                prop_assert!(x.is_finite());
            }
        }
    }
}
