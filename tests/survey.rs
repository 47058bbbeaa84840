//! Survey layout (resolution-model §7): a published worked example, the formulas on a small field,
//! the messages for missing or bad inputs, the layout diagram, and "never NaN, never endless"
//! properties over extreme inputs.

mod common;

use common::{close, inputs, plan, words};
use proptest::prelude::*;
use sharpfield::core::contract::report::report_json;
use sharpfield::core::contract::scenario::{Offset, Scenario};
use sharpfield::core::planning::survey::SurveySettings;
use sharpfield::core::planning::survey::{
    layout, overlap_guidance, SurveyPlan, MAX_DRAWN_LINES, MAX_LINES, MAX_PHOTOS,
};
use sharpfield::core::presets::demo::pasture_survey;
use sharpfield::core::words::notes::overlap;
use sharpfield::core::words::units::Units;

/// Whether the plan's notes, in metric words, say `text`.
fn has_note(plan: &SurveyPlan, text: &str) -> bool {
    words(plan, Units::Metric).survey_notes.iter().any(|n| n.contains(text))
}

// NPTEL course 105104100 (Photogrammetry), lecture "Flight planning", Example 1: "An area 45 km
// long and 36 km wide is to be photographed to an average scale of 1:12000, using an aerial
// camera of f = 21 cm. The speed of the aircraft is 200 km/h. The photographs are 23 cm square,
// with a longitudinal overlap of at least 60% and lateral overlap of 30%." Its stated results:
// air base 1104 m, exposure interval 19.872 s (set to 19 s), 20 flight lines, 44 photos per line
// before extras, 48 with two extra at each end, 960 photos in all.
//
// As a scenario: a 230 mm square "sensor" behind a 210 mm lens at H = 12000 × 0.21 m = 2520 m
// above the ground, so the footprint is 0.23 m × 12000 = 2760 m on a side. The flight lines run
// along the 45 km length, so the 36 km width lies across them.
fn nptel_example_1() -> Scenario {
    Scenario {
        sensor_width_mm: 230.0,
        sensor_height_mm: 230.0,
        focal_mm: 210.0,
        height_m: 12_000.0 * 0.21,
        offset: Offset::GroundDistance(0.0),
        speed_mps: 200.0 / 3.6,
        survey: SurveySettings {
            area_width_m: Some(36_000.0),
            area_length_m: Some(45_000.0),
            front_overlap_pct: 60.0,
            side_overlap_pct: 30.0,
            ..pasture_survey().survey
        },
        ..pasture_survey()
    }
}

#[test]
fn nptel_example_1_base_interval_and_lines() {
    // Source: NPTEL 105104100, "Flight planning", Example 1 (see above).
    let p = plan(&nptel_example_1());
    close(p.footprint_across_m, 2760.0, 1e-9);
    close(p.footprint_along_m, 2760.0, 1e-9);
    // "Ground distance between exposures" = 1104 m.
    close(p.base_m, 1104.0, 1e-9);
    // "Exposure interval" = 19.872 s.
    close(p.trigger_s.expect("speed is given"), 19.872, 1e-9);
    // Lines 1932 m apart (0.7 × 2760), and "Number of flight lines" = 20.
    close(p.line_spacing_m, 1932.0, 1e-9);
    assert_eq!(p.lines, Some(20));
}

#[test]
fn nptel_example_1_width_is_across_the_lines() {
    // Source: NPTEL 105104100, Example 1. Only the 36 km side across the lines gives the stated
    // 20 lines: with the 45 km side across, ceil(45000/1932) + 1 would be 25.
    let swapped = Scenario {
        survey: SurveySettings {
            area_width_m: Some(45_000.0),
            area_length_m: Some(36_000.0),
            ..nptel_example_1().survey
        },
        ..nptel_example_1()
    };
    assert_eq!(plan(&swapped).lines, Some(25));
}

#[test]
fn nptel_example_1_photos_as_the_example_counts_them() {
    // Source: NPTEL 105104100, Example 1. The example does not count photos at the 1104 m base:
    // it rounds the interval down to whole seconds (19 s, so that the overlap stays at least
    // 60 %), takes the base flown in 19 s at 55.55 m/s (1055.45 m), counts photos per line from
    // that, and then adds two extra photos at each end of every line. The formulas on its page
    // are images we could not read; its numbers (44 per line, 48 with extras, 960 in all) agree
    // with ceil(length/B) + 1 at the adjusted base, which is the planner's formula, so this test
    // follows the example's steps with the planner and adds the extras as the example does.
    let first = plan(&nptel_example_1());
    let interval_s = first.trigger_s.expect("speed is given").floor();
    assert_eq!(interval_s, 19.0);
    let speed_as_rounded_in_the_example = 55.55;
    let adjusted_base = speed_as_rounded_in_the_example * interval_s;
    close(adjusted_base, 1055.45, 1e-9);
    // The front overlap that gives that base with a 2760 m footprint.
    let front_overlap_pct = 100.0 * (1.0 - adjusted_base / first.footprint_along_m);
    let adjusted = plan(&Scenario {
        survey: SurveySettings {
            front_overlap_pct,
            ..nptel_example_1().survey
        },
        ..nptel_example_1()
    });
    close(adjusted.base_m, 1055.45, 1e-9);
    // 44 photos between the ends and 2 beyond each: the planner's extras are ceil(half a
    // footprint / base) = ceil(1380/1055.45) = 2, the example's.
    assert_eq!(adjusted.extra_photos_per_end, Some(2));
    assert_eq!(adjusted.photos_per_line, Some(44 + 2 + 2));
    assert_eq!(adjusted.lines, Some(20));
    assert_eq!(adjusted.photos, Some(960));
}

// The demo field worked by hand from the formulas in resolution-model §7 and the brief:
// 13.2 × 8.8 mm sensor, 8.8 mm lens, 80 m → footprint 120 m across, 80 m along; 75 % / 65 %
// overlap → B = 20 m, S = 42 m; 400 m × 600 m → ceil(400/42) + 1 = 11 lines of
// 600/20 + 1 = 31 photos, and ceil(40/20) = 2 more beyond each end (half a footprint, 40 m).
#[test]
fn demo_field_by_hand() {
    let s = pasture_survey();
    let p = plan(&s);
    close(p.footprint_across_m, 120.0, 1e-9);
    close(p.footprint_along_m, 80.0, 1e-9);
    close(p.base_m, 20.0, 1e-9);
    close(p.line_spacing_m, 42.0, 1e-9);
    assert_eq!(p.lines, Some(11));
    assert_eq!(p.extra_photos_per_end, Some(2));
    assert_eq!(p.photos_per_line, Some(31 + 4));
    assert_eq!(p.photos, Some(385));
    close(p.margin_along_m, 40.0, 1e-9);
    close(p.margin_across_m, 60.0, 1e-9);
    // Path: 11 lines of 600 m + 2 × 40 m to the extra photos, and 10 hops of 42 m.
    close(p.path_length_m.unwrap(), 11.0 * 680.0 + 10.0 * 42.0, 1e-6);
    // Time: 7900 m at 8 m/s and 10 turns of 10 s.
    close(p.flight_time_s.unwrap(), 7900.0 / 8.0 + 100.0, 1e-6);
    // 1087.5 s in 25-minute batteries.
    assert_eq!(p.batteries, Some(1));
    close(p.storage_mb.unwrap(), 3850.0, 1e-6);
    close(p.trigger_s.unwrap(), 2.5, 1e-12);
    // The trigger limit: 20 m every 2 s.
    close(p.max_speed_trigger_mps.unwrap(), 10.0, 1e-12);
    // The blur limit: 0.5 px of GSD p·h/f (GIQE 5.0 §2.3) in 1 ms.
    let gsd = 13.2e-3 / 5472.0 * 80.0 / 8.8e-3;
    close(p.max_speed_blur_mps.unwrap(), 0.5 * gsd / 0.001, 1e-9);
    assert!(p.speed_flags.is_empty(), "{:?}", p.speed_flags);
    assert_eq!(p.overlap.class.code(), "mapping");
}

#[test]
fn batteries_round_up() {
    // ceil(flight time / endurance): 1087.5 s with 5-minute (300 s) batteries needs 4.
    let p = plan(&Scenario {
        survey: SurveySettings {
            endurance_min: 5.0,
            ..pasture_survey().survey
        },
        ..pasture_survey()
    });
    assert_eq!(p.batteries, Some(4));
}

#[test]
fn an_exact_multiple_does_not_gain_a_station_from_rounding() {
    // With 90 % front overlap, 1 − 0.9 is 0.09999999999999998 in floating point, so B comes out a
    // hair under 8 m and 80/B a hair over 10. The count must still be 80/8 + 1 = 11.
    let p = plan(&Scenario {
        survey: SurveySettings {
            front_overlap_pct: 90.0,
            area_length_m: Some(80.0),
            ..pasture_survey().survey
        },
        ..pasture_survey()
    });
    assert!(80.0 / p.base_m > 10.0, "the rounding this test is about did not occur");
    // The extras: half the 80 m footprint over the same base, 40/8 = 5 at each end, not 6.
    assert!(40.0 / p.base_m > 5.0);
    assert_eq!(p.extra_photos_per_end, Some(5));
    assert_eq!(p.photos_per_line, Some(11 + 10));
}

#[test]
fn speed_flags_name_the_limit_and_the_change() {
    let p = plan(&Scenario {
        speed_mps: 20.0,
        ..pasture_survey()
    });
    let codes: Vec<&str> = p.speed_flags.iter().map(|f| f.code()).collect();
    assert_eq!(codes, ["blur", "trigger"]);
    let w = words(&p, Units::Metric);
    let blur = &w.speed_flags[0];
    close(blur.limit_mps, p.max_speed_blur_mps.unwrap(), 0.0);
    assert!(blur.change.contains("Slow to") && blur.change.contains("shorten the exposure"));
    let trigger = &w.speed_flags[1];
    close(trigger.limit_mps, 10.0, 1e-12);
    assert!(trigger.change.contains("lower the front overlap"));
    assert!(trigger.change.contains("shorter interval"));
}

#[test]
fn a_camera_without_a_minimum_interval_sets_no_trigger_limit() {
    let p = plan(&Scenario {
        speed_mps: 20.0,
        survey: SurveySettings {
            trigger_s: 0.0,
            ..pasture_survey().survey
        },
        ..pasture_survey()
    });
    assert_eq!(p.max_speed_trigger_mps, None);
    assert!(p.speed_flags.iter().all(|f| f.code() != "trigger"));
}

#[test]
fn speed_zero_leaves_time_out_with_a_note() {
    let p = plan(&Scenario {
        speed_mps: 0.0,
        ..pasture_survey()
    });
    assert_eq!(p.trigger_s, None);
    assert_eq!(p.flight_time_s, None);
    assert_eq!(p.batteries, None);
    assert!(p.lines.is_some() && p.photos.is_some(), "counts do not need a speed");
    assert!(has_note(&p, "ground speed is 0"));
    assert!(p.speed_flags.is_empty());
}

#[test]
fn missing_area_gives_no_counts_and_says_so() {
    let p = plan(&Scenario {
        survey: SurveySettings {
            area_width_m: None,
            area_length_m: None,
            ..pasture_survey().survey
        },
        ..pasture_survey()
    });
    assert_eq!((p.lines, p.photos_per_line, p.photos), (None, None, None));
    assert_eq!(
        (p.path_length_m, p.flight_time_s, p.batteries, p.storage_mb),
        (None, None, None, None)
    );
    assert!(has_note(&p, "No survey area given"));
    // The per-photo figures need no area.
    close(p.base_m, 20.0, 1e-9);

    let p = plan(&Scenario {
        survey: SurveySettings {
            area_length_m: None,
            ..pasture_survey().survey
        },
        ..pasture_survey()
    });
    assert_eq!(p.lines, Some(11));
    assert_eq!(p.photos, None);
    assert!(has_note(&p, "length along the lines (al) is missing"));
}

#[test]
fn a_tilted_camera_is_noted() {
    for offset in [Offset::Tilt(30.0), Offset::GroundDistance(50.0)] {
        let p = plan(&Scenario {
            offset,
            ..pasture_survey()
        });
        assert!(has_note(&p, "looking straight down"), "{offset:?}");
        // The footprint stays the nadir one.
        close(p.footprint_across_m, 120.0, 1e-9);
    }
    assert!(!has_note(&plan(&pasture_survey()), "looking straight down"));
}

#[test]
fn overlap_guidance_follows_common_practice() {
    // Common practice (resolution-model §7 and the brief): about 75–80 / 60–70 for orthomosaics,
    // 80–90 / 70–80 for 3D models, 60 / 30 for classic film surveys.
    let cases = [
        ((75.0, 65.0), "mapping"),
        ((80.0, 70.0), "3d"),
        ((90.0, 80.0), "3d"),
        ((60.0, 30.0), "light"),
        ((70.0, 60.0), "light"),
        ((50.0, 30.0), "low"),
        ((75.0, 20.0), "low"),
        ((95.0, 60.0), "heavy"),
        ((80.0, 85.0), "heavy"),
        ((f64::NAN, 60.0), "low"),
    ];
    for ((front, side), code) in cases {
        let g = overlap_guidance(front, side);
        let text = overlap(&g);
        assert_eq!(g.class.code(), code, "{front}/{side}: {text}");
        assert!(text.starts_with("Overlap of"));
    }
}

#[test]
fn absurd_counts_are_withheld_with_a_note() {
    // 100 km square at 0.1 m height with a long lens: a 0.12 mm footprint.
    let s = Scenario {
        sensor_width_mm: 6.17,
        sensor_height_mm: 4.55,
        focal_mm: 5000.0,
        height_m: 0.1,
        survey: SurveySettings {
            area_width_m: Some(100_000.0),
            area_length_m: Some(100_000.0),
            front_overlap_pct: 95.0,
            side_overlap_pct: 95.0,
            ..pasture_survey().survey
        },
        ..pasture_survey()
    };
    let p = plan(&s);
    assert_eq!((p.lines, p.photos_per_line, p.photos), (None, None, None));
    assert!(has_note(&p, &format!("More than {MAX_LINES} flight lines")));
    assert!(has_note(&p, &format!("More than {MAX_PHOTOS} photos on each line")));
    assert!(layout(&p, &inputs(&s)).is_none());

    // Lines and photos per line within their caps, the total above.
    let s = Scenario {
        height_m: 10.0,
        survey: SurveySettings {
            area_width_m: Some(100_000.0),
            area_length_m: Some(100_000.0),
            ..pasture_survey().survey
        },
        ..pasture_survey()
    };
    let p = plan(&s);
    assert!(p.lines.is_some() && p.photos_per_line.is_some());
    assert_eq!(p.photos, None);
    assert_eq!(p.storage_mb, None);
    assert!(has_note(&p, "photos in all"));
}

#[test]
fn the_report_carries_the_survey_fields() {
    // The report flattens the plan into its own object (url-and-report.md, "Report").
    let json = report_json(&pasture_survey().to_query());
    let v: serde_json::Value = serde_json::from_str(&json).expect("the report is JSON");
    for key in [
        "footprint_across_m",
        "footprint_along_m",
        "base_m",
        "line_spacing_m",
        "trigger_s",
        "lines",
        "photos",
        "path_length_m",
        "flight_time_s",
        "batteries",
        "storage_mb",
        "max_speed_blur_mps",
        "max_speed_trigger_mps",
        "speed_flags",
        "overlap_guidance",
        "survey_notes",
    ] {
        assert!(v.get(key).is_some(), "the report lacks {key}");
    }
    assert_eq!(v["lines"], 11);
    assert_eq!(v["photos"], 385);
    assert_eq!(v["extra_photos_per_end"], 2);
}

#[test]
fn layout_of_the_demo_field() {
    let s = pasture_survey();
    let p = plan(&s);
    let l = layout(&p, &inputs(&s)).expect("the demo has an area");
    assert_eq!((l.lines_total, l.lines_omitted, l.lines.len()), (11, 0, 11));
    // Serpentine: line 1 along the heading from the first corner, line 2 back; every line runs
    // two bases (40 m) beyond each end of the area to its extra photos.
    assert!(l.lines[0].forward && !l.lines[1].forward);
    assert_eq!(
        (l.lines[0].start.x, l.lines[0].start.y, l.lines[0].end.y),
        (0.0, -40.0, 640.0)
    );
    assert_eq!((l.lines[1].start.y, l.lines[1].end.y), (640.0, -40.0));
    // The margin that full overlap needs: half a footprint beyond each end and side.
    for (got, want) in [
        (l.margin.x, -60.0),
        (l.margin.y, -40.0),
        (l.margin.width, 520.0),
        (l.margin.height, 680.0),
    ] {
        close(got, want, 1e-9);
    }
    close(l.lines[1].start.x, 42.0, 1e-9);
    // The last line lies on or beyond the far edge, by less than one spacing.
    let last_x = l.lines[10].start.x;
    assert!((400.0..400.0 + 42.0).contains(&last_x));

    // Three photos of line 1 and the one of line 2 beside line 1's first (its last, flying back).
    let f = &l.footprints;
    assert_eq!(f.len(), 4);
    assert_eq!((f[3].line, f[3].photo), (2, 35));
    // Front overlap: neighbouring photos of line 1 share 75 % of the 80 m footprint length.
    let shared_along = (f[0].rect.y + f[0].rect.height) - f[1].rect.y;
    close(shared_along, 0.75 * 80.0, 1e-9);
    // Side overlap: line 1's and line 2's photos share 65 % of the 120 m footprint width.
    let shared_across = (f[0].rect.x + f[0].rect.width) - f[3].rect.x;
    close(shared_across, 0.65 * 120.0, 1e-9);

    // The bounds hold everything drawn.
    let b = l.bounds;
    for r in [l.area, l.margin].into_iter().chain(f.iter().map(|f| f.rect)) {
        assert!(r.x >= b.x && r.y >= b.y && r.x + r.width <= b.x + b.width && r.y + r.height <= b.y + b.height);
    }
}

#[test]
fn layout_draws_at_most_sixty_lines() {
    let s = Scenario {
        survey: SurveySettings {
            area_width_m: Some(10_000.0),
            ..pasture_survey().survey
        },
        ..pasture_survey()
    };
    let p = plan(&s);
    let l = layout(&p, &inputs(&s)).unwrap();
    // ceil(10000/42) + 1 = 240 lines.
    assert_eq!(l.lines_total, 240);
    assert_eq!(l.lines.len() as u64, MAX_DRAWN_LINES);
    assert_eq!(l.lines_omitted, 240 - MAX_DRAWN_LINES);
}

#[test]
fn small_areas_keep_the_plus_one_convention() {
    let s = Scenario {
        survey: SurveySettings {
            area_width_m: Some(1.0),
            area_length_m: Some(1.0),
            ..pasture_survey().survey
        },
        ..pasture_survey()
    };
    let p = plan(&s);
    // Two stations and the two extras beyond each end.
    assert_eq!((p.lines, p.photos_per_line), (Some(2), Some(2 + 4)));
    let s = Scenario {
        survey: SurveySettings {
            area_width_m: Some(0.0),
            area_length_m: Some(0.0),
            ..pasture_survey().survey
        },
        ..pasture_survey()
    };
    let p = plan(&s);
    assert_eq!((p.lines, p.photos_per_line), (Some(1), Some(1 + 4)));
    let l = layout(&p, &inputs(&s)).unwrap();
    // One line: three of its five photos outlined, no second line.
    assert_eq!(l.footprints.len(), 3);
}

/// Every number in the plan is finite, counts keep within their caps, and the plan writes as JSON.
fn check_sane(s: &Scenario) {
    let p = plan(s);
    let mut numbers = vec![p.footprint_across_m, p.footprint_along_m, p.base_m, p.line_spacing_m];
    numbers.extend(
        [
            p.trigger_s,
            p.path_length_m,
            p.flight_time_s,
            p.storage_mb,
            p.max_speed_blur_mps,
            p.max_speed_trigger_mps,
        ]
        .into_iter()
        .flatten(),
    );
    numbers.extend(p.speed_flags.iter().map(|f| f.limit_mps()));
    assert!(numbers.iter().all(|v| v.is_finite()), "{p:?}");
    assert!(p.lines.is_none_or(|n| (1..=MAX_LINES).contains(&n)));
    assert!(p.photos_per_line.is_none_or(|n| (1..=MAX_PHOTOS).contains(&n)));
    assert!(p.photos.is_none_or(|n| n <= MAX_PHOTOS));
    if let (Some(n), Some(k), Some(t)) = (p.lines, p.photos_per_line, p.photos) {
        assert_eq!(n * k, t);
    }
    assert!(serde_json::to_string(&p).is_ok());
    if let Some(l) = layout(&p, &inputs(s)) {
        assert!(l.lines.len() as u64 <= MAX_DRAWN_LINES);
        assert_eq!(l.lines.len() as u64 + l.lines_omitted, l.lines_total);
        let b = l.bounds;
        assert!([b.x, b.y, b.width, b.height].iter().all(|v| v.is_finite()));
    }
}

#[test]
fn extreme_inputs_stay_finite() {
    let base = pasture_survey();
    let odd = [0.0, -1.0, 1e-300, 1e300, f64::NAN, f64::INFINITY, f64::NEG_INFINITY];
    for v in odd {
        check_sane(&Scenario {
            height_m: v,
            ..base.clone()
        });
        check_sane(&Scenario {
            focal_mm: v,
            ..base.clone()
        });
        check_sane(&Scenario {
            sensor_width_mm: v,
            ..base.clone()
        });
        check_sane(&Scenario {
            speed_mps: v,
            ..base.clone()
        });
        check_sane(&Scenario {
            shutter_s: v,
            ..base.clone()
        });
        check_sane(&Scenario {
            survey: SurveySettings {
                trigger_s: v,
                ..base.clone().survey
            },
            ..base.clone()
        });
        check_sane(&Scenario {
            survey: SurveySettings {
                endurance_min: v,
                ..base.clone().survey
            },
            ..base.clone()
        });
        check_sane(&Scenario {
            survey: SurveySettings {
                turn_s: v,
                ..base.clone().survey
            },
            ..base.clone()
        });
        check_sane(&Scenario {
            survey: SurveySettings {
                photo_mb: v,
                ..base.clone().survey
            },
            ..base.clone()
        });
        check_sane(&Scenario {
            survey: SurveySettings {
                blur_budget_px: v,
                ..base.clone().survey
            },
            ..base.clone()
        });
        check_sane(&Scenario {
            survey: SurveySettings {
                front_overlap_pct: v,
                ..base.clone().survey
            },
            ..base.clone()
        });
        check_sane(&Scenario {
            survey: SurveySettings {
                side_overlap_pct: v,
                ..base.clone().survey
            },
            ..base.clone()
        });
        check_sane(&Scenario {
            survey: SurveySettings {
                area_width_m: Some(v),
                ..base.clone().survey
            },
            ..base.clone()
        });
        check_sane(&Scenario {
            survey: SurveySettings {
                area_length_m: Some(v),
                ..base.clone().survey
            },
            ..base.clone()
        });
    }
    for pct in [95.0, 99.999, 100.0, 150.0] {
        check_sane(&Scenario {
            survey: SurveySettings {
                front_overlap_pct: pct,
                side_overlap_pct: pct,
                ..base.clone().survey
            },
            ..base.clone()
        });
    }
    let p = plan(&Scenario {
        survey: SurveySettings {
            front_overlap_pct: 100.0,
            ..base.clone().survey
        },
        ..base.clone()
    });
    assert_eq!(p.photos_per_line, None);
    assert!(has_note(&p, "front overlap must be"));
}

proptest! {
    // Inputs across the contract's accepted ranges (the table of inputs, contract/inputs.rs), including the
    // corners the brief names: 95 % overlap, a 1 m area, 100 km at 0.1 m with a long lens.
    #[test]
    fn never_nan_never_endless(
        sw in 0.1f64..200.0,
        sh in 0.1f64..200.0,
        focal in prop_oneof![Just(0.5), Just(5000.0), 0.5f64..5000.0],
        h in prop_oneof![Just(0.1), Just(20_000.0), 0.1f64..20_000.0],
        speed in prop_oneof![Just(0.0), 0.0f64..150.0],
        shutter in 1e-6f64..10.0,
        aw in prop_oneof![Just(1.0), Just(100_000.0), 1.0f64..100_000.0],
        al in prop_oneof![Just(1.0), Just(100_000.0), 1.0f64..100_000.0],
        fo in prop_oneof![Just(0.0), Just(95.0), 0.0f64..=95.0],
        so in prop_oneof![Just(0.0), Just(95.0), 0.0f64..=95.0],
        trig in 0.0f64..600.0,
        endur in 1.0f64..600.0,
        turn in 0.0f64..600.0,
        mb in 0.0f64..2000.0,
        blur in 0.05f64..10.0,
    ) {
        check_sane(&Scenario {
            sensor_width_mm: sw,
            sensor_height_mm: sh,
            focal_mm: focal,
            height_m: h,
            speed_mps: speed,
            shutter_s: shutter,
            survey: SurveySettings {
                area_width_m: Some(aw),
                area_length_m: Some(al),
                front_overlap_pct: fo,
                side_overlap_pct: so,
                trigger_s: trig,
                endurance_min: endur,
                turn_s: turn,
                photo_mb: mb,
                blur_budget_px: blur,
                ..pasture_survey().survey
            },
            ..pasture_survey()
        });
    }
}

/// The report of `query` as JSON.
fn report_of(query: &str) -> serde_json::Value {
    serde_json::from_str(&report_json(query)).expect("the report is JSON")
}

/// The demo survey's link with the keys of `extra` (`k=v&…`) given instead of the demo's.
fn demo_with(extra: &str) -> String {
    let keys: Vec<&str> = extra.split('&').filter_map(|kv| kv.split('=').next()).collect();
    let demo = pasture_survey().to_query();
    let kept = demo
        .split('&')
        .filter(|kv| !keys.contains(&kv.split('=').next().unwrap_or_default()));
    kept.chain(std::iter::once(extra)).collect::<Vec<_>>().join("&")
}

/// The number in report field `key`.
fn field(v: &serde_json::Value, key: &str) -> f64 {
    v[key]
        .as_f64()
        .unwrap_or_else(|| panic!("{key} is not a number: {}", v[key]))
}

#[test]
fn a_hill_under_the_survey_through_the_link() {
    // Issue 13's case, by hand: a 20 m hill under the 80 m demo survey leaves 60 m to the ground,
    // so the footprint shrinks to 60/80 of 80 m × 120 m = 60 m × 90 m while the base (20 m) and
    // the spacing (42 m) stay: front 1 − 20/60 = 66.7 %, side 1 − 42/90 = 53.3 % (planned 75 /
    // 65 %). Fine GSD 60/80 of the take-off GSD; the coarsest, over ground at take-off, the same.
    let query = demo_with("relief=0,20");
    let v = report_of(&query);
    assert_eq!(v["errors"], serde_json::json!([]));
    close(field(&v, "front_min_pct"), 100.0 * (1.0 - 20.0 / 60.0), 1e-9);
    close(field(&v, "side_min_pct"), 100.0 * (1.0 - 42.0 / 90.0), 1e-9);
    let gsd = field(&v, "gsd_m");
    close(field(&v, "gsd_min_m"), 0.75 * gsd, 1e-9);
    close(field(&v, "gsd_max_m"), gsd, 1e-9);
    // Flying at 80 + 20 m restores the planned overlaps over the hill.
    close(field(&v, "relief_height_m"), 100.0, 1e-12);
    let notes: Vec<&str> = v["survey_notes"]
        .as_array()
        .unwrap()
        .iter()
        .filter_map(|n| n.as_str())
        .collect();
    let warned = |side: &str| {
        notes
            .iter()
            .any(|n| n.contains(&format!("the {side} overlap falls")) && n.contains("100 m above take-off"))
    };
    assert!(warned("front") && warned("side"), "{notes:?}");
    // The link keeps the relief, lowest first.
    let (scenario, _) = Scenario::from_query("relief=20,-5");
    let (again, errors) = Scenario::from_query(&scenario.to_query());
    assert!(errors.iter().all(|e| e.key != "relief"));
    assert_eq!(again.survey.relief_m, Some((-5.0, 20.0)));
}

#[test]
fn a_bad_relief_is_named_and_the_ground_taken_as_level() {
    for bad in ["20", "a,b", "1,2,3", "0,20000"] {
        let v = report_of(&demo_with(&format!("relief={bad}")));
        let error = &v["errors"][0];
        let message = error["message"].as_str().unwrap_or_default();
        assert_eq!(error["key"], "relief", "{bad}");
        assert!(
            message.contains("Ground height under the block") && message.contains("-10000 to 10000"),
            "{message}"
        );
        assert!(v["gsd_min_m"].is_null());
    }
}

#[test]
fn a_headwind_and_a_tailwind_on_the_legs_by_hand() {
    // 8 m/s through the air on lines heading north, a 3 m/s wind from the north: the out leg
    // (north) makes 8 − 3 = 5 m/s over the ground, the back leg 8 + 3 = 11 m/s, no crab (the wind
    // triangle; common practice). The trigger interval and the smear follow the fast leg; the
    // time the mean over a pair, 2·5·11/16 = 6.875 m/s.
    let calm = report_of(&demo_with("speed=8"));
    let v = report_of(&demo_with("speed=8&wind=3&wdir=0"));
    close(field(&v, "ground_speed_out_mps"), 5.0, 1e-12);
    close(field(&v, "ground_speed_back_mps"), 11.0, 1e-12);
    close(field(&v, "crab_deg"), 0.0, 1e-9);
    close(field(&v, "trigger_s"), 20.0 / 11.0, 1e-12);
    close(field(&v, "motion_m"), 11.0 * field(&v, "exposure_s"), 1e-12);
    close(field(&calm, "motion_m"), 8.0 * field(&calm, "exposure_s"), 1e-12);
    let path = field(&v, "path_length_m");
    close(field(&v, "flight_time_s"), path / 6.875 + 10.0 * 10.0, 1e-9);
    assert!(field(&v, "flight_time_s") > field(&calm, "flight_time_s"));
}

#[test]
fn a_crosswind_by_hand() {
    // 8 m/s through the air heading north, 4 m/s from the east: the crab is asin(4/8) = 30°, the
    // nose to the right (east, into the wind) on the out leg, and both legs make
    // √(8² − 4²) = 6.93 m/s over the ground.
    let v = report_of(&demo_with("speed=8&wind=4&wdir=90"));
    close(field(&v, "crab_deg"), 30.0, 1e-9);
    close(field(&v, "ground_speed_out_mps"), 48f64.sqrt(), 1e-12);
    close(field(&v, "ground_speed_back_mps"), 48f64.sqrt(), 1e-12);
    // A crosswind as fast as the aircraft: no heading holds the line, and the plan says so.
    let v = report_of(&demo_with("speed=8&wind=9&wdir=90"));
    assert!(v["flight_time_s"].is_null() && v["trigger_s"].is_null());
    let notes = v["survey_notes"].to_string();
    assert!(notes.contains("no heading holds the line"), "{notes}");
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]

    /// Raising the highest ground never raises the least overlaps or the finest GSD.
    #[test]
    fn overlaps_never_rise_as_the_relief_grows(low in -50.0f64..0.0, high in 0.0f64..70.0, more in 0.0f64..9.0) {
        let a = report_of(&demo_with(&format!("relief={low},{high}")));
        let b = report_of(&demo_with(&format!("relief={low},{}", high + more)));
        for key in ["front_min_pct", "side_min_pct", "gsd_min_m"] {
            prop_assert!(field(&b, key) <= field(&a, key) + 1e-12, "{key}: {} then {}", a[key], b[key]);
        }
    }
}
