//! Every typed note worded in both unit systems: figures carry the chosen units, and no metric
//! unit leaks into imperial words (issue: "At 20 m/s (72 km/h)…" beside figures in mph). The
//! conversion factors are the international foot and the statute mile (exact by definition).

use sharpfield::core::contract::report::report_for_query;
use sharpfield::core::physics::engine::Limit;
use sharpfield::core::physics::optics::SamplingRegime;
use sharpfield::core::physics::target::{PeopleLevel, Task};
use sharpfield::core::planning::cautions::Caution;
use sharpfield::core::planning::solve::{Axis, Reach};
use sharpfield::core::planning::survey::{
    overlap_guidance, AreaSide, OverlapSide, SpeedFlag, SurveyNote, MAX_LINES, MAX_PHOTOS,
};
use sharpfield::core::words::notes;
use sharpfield::core::words::units::Units;

/// Every survey note, with figures that show their units.
fn every_survey_note() -> Vec<SurveyNote> {
    vec![
        SurveyNote::AssumesStraightDown,
        SurveyNote::NoFootprint,
        SurveyNote::OverlapUnusable {
            side: OverlapSide::Front,
            pct: 100.0,
        },
        SurveyNote::OverlapUnusable {
            side: OverlapSide::Side,
            pct: -5.0,
        },
        SurveyNote::NoArea,
        SurveyNote::AreaSideMissing { side: AreaSide::Width },
        SurveyNote::AreaSideMissing { side: AreaSide::Length },
        SurveyNote::AreaSideUnusable {
            side: AreaSide::Width,
            value: -3.0,
        },
        SurveyNote::TooManyLines {
            width_m: 100_000.0,
            spacing_m: 0.3048,
        },
        SurveyNote::TooManyPhotosPerLine {
            length_m: 100_000.0,
            base_m: 0.3048,
        },
        SurveyNote::TooManyPhotos {
            lines: 20_000,
            photos_per_line: 9_000,
        },
        SurveyNote::NoSpeed,
        SurveyNote::FlightTimeUncountable,
        SurveyNote::NoEndurance,
        SurveyNote::FlightTimeCovers,
    ]
}

/// Whether `text` names a metric unit of length or speed as a word (" m", " km", "m/s", "km/h", " cm", " mm").
fn names_metric(text: &str) -> bool {
    let padded = format!("{text} ");
    [
        "m/s", "km/h", " m ", " m)", " m,", " m.", " km ", " km)", " cm ", " mm ",
    ]
    .iter()
    .any(|u| padded.contains(u))
}

#[test]
fn every_survey_note_is_worded_in_both_unit_systems() {
    for note in every_survey_note() {
        let metric = notes::survey_note(&note, Units::Metric);
        let imperial = notes::survey_note(&note, Units::Imperial);
        assert!(
            metric.ends_with('.') && imperial.ends_with('.'),
            "{metric} / {imperial}"
        );
        assert!(
            !names_metric(&imperial),
            "imperial words name a metric unit: {imperial}"
        );
        match note {
            SurveyNote::TooManyLines { .. } | SurveyNote::TooManyPhotosPerLine { .. } => {
                // 100 km is 62.1 mi; 0.3048 m is exactly 1 ft (international foot).
                assert!(metric.contains("100 km") && metric.contains("30.5 cm"), "{metric}");
                assert!(imperial.contains("62.1 mi") && imperial.contains("1 ft"), "{imperial}");
            }
            _ => assert_eq!(metric, imperial, "a note without lengths reads the same in both"),
        }
    }
    let capped = notes::survey_note(&every_survey_note()[8], Units::Metric);
    assert!(
        capped.contains(&format!("More than {MAX_LINES} flight lines")),
        "{capped}"
    );
    let photos = notes::survey_note(&every_survey_note()[10], Units::Imperial);
    assert!(
        photos.contains(&format!("More than {MAX_PHOTOS} photos in all")),
        "{photos}"
    );
}

#[test]
fn speed_flags_speak_the_chosen_units() {
    // 20 m/s = 72 km/h = 44.7 mph (20 × 3600 / 1609.344 = 44.74), 10 m/s = 22.4 mph.
    let flags = [
        SpeedFlag::Blur {
            speed_mps: 20.0,
            limit_mps: 10.0,
            budget_px: 0.5,
            exposure_s: 0.001,
        },
        SpeedFlag::Trigger {
            speed_mps: 20.0,
            limit_mps: 10.0,
            due_s: Some(1.0),
            camera_interval_s: 2.0,
        },
    ];
    for flag in &flags {
        let reason = notes::speed_flag_reason(flag, Units::Metric);
        let change = notes::speed_flag_change(flag, Units::Metric);
        assert!(reason.contains("20 m/s (72 km/h)") && names_metric(&reason), "{reason}");
        assert!(change.contains("10 m/s (36 km/h)"), "{change}");
        let reason = notes::speed_flag_reason(flag, Units::Imperial);
        let change = notes::speed_flag_change(flag, Units::Imperial);
        assert!(reason.contains("44.7 mph") && !names_metric(&reason), "{reason}");
        assert!(change.contains("22.4 mph") && !names_metric(&change), "{change}");
    }
}

#[test]
fn the_report_words_speed_flags_in_mph_with_imperial_display() {
    // The case the issue names: imperial display and a slow camera trigger (a photo every 20 m
    // at 15 m/s is due every 1.33 s; the camera needs 5 s, so 4 m/s = 8.95 mph is the limit).
    let query = "sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80&speed=15&trig=5&aw=400&al=600";
    let metric = report_for_query(query);
    let imperial = report_for_query(&format!("{query}&units=imperial"));
    let flag = |r: &sharpfield::core::contract::report::Report| {
        r.survey_words
            .speed_flags
            .iter()
            .find(|f| f.code == "trigger")
            .cloned()
            .expect("the trigger is flagged")
    };
    let (m, i) = (flag(&metric), flag(&imperial));
    assert_eq!(m.limit_mps, i.limit_mps, "the figures stay SI");
    assert!(
        m.reason.contains("15 m/s (54 km/h)") && m.change.contains("4 m/s (14.4 km/h)"),
        "{m:?}"
    );
    assert!(i.reason.contains("33.6 mph") && i.change.contains("8.95 mph"), "{i:?}");
    assert!(!names_metric(&i.reason) && !names_metric(&i.change), "{i:?}");
}

#[test]
fn words_without_units_are_complete() {
    for limit in Limit::ALL {
        assert!(!notes::limit_title(limit).is_empty());
        assert!(notes::limit_advice(limit).ends_with('.'));
    }
    for task in Task::ALL {
        assert!(!notes::task(task).is_empty());
    }
    for regime in [SamplingRegime::DetectorLimited, SamplingRegime::OpticsLimited] {
        assert!(notes::sampling_regime(regime).contains("-limited"));
    }
    for caution in [
        Caution::General,
        Caution::Height { airborne: true },
        Caution::Height { airborne: false },
        Caution::Scintillation { rytov: 4.2 },
        Caution::Privacy {
            px_per_m: 130.0,
            level: PeopleLevel::Recognition,
        },
        Caution::Privacy {
            px_per_m: 300.0,
            level: PeopleLevel::Identification,
        },
    ] {
        let text = notes::caution(caution, Units::Metric);
        assert!(
            text.contains("local") || text.contains("where you work") || text.contains("indicative"),
            "{text}"
        );
        if let Caution::Privacy { px_per_m, .. } = caution {
            assert!(text.contains(&format!("{px_per_m} pixels per metre")), "{text}");
        }
    }
    let text = notes::overlap(&overlap_guidance(75.0, 65.0));
    assert!(text.starts_with("Overlap of 75 % front and 65 % side"), "{text}");
    // Below the horizon: both distances in the chosen units, and plainly not in view.
    let beyond = Caution::BeyondHorizon {
        distance_m: 20_000.0,
        horizon_m: 11_658.0,
    };
    let text = notes::caution(beyond, Units::Metric);
    assert!(
        text.contains("20 km") && text.contains("11.7 km") && text.contains("not in view"),
        "{text}"
    );
    let text = notes::caution(beyond, Units::Imperial);
    assert!(text.contains("12.4 mi") && text.contains("7.24 mi"), "{text}");
}

#[test]
fn the_reach_sentence_speaks_the_chosen_units() {
    let reach = Reach::UpTo {
        position_m: 121.92,
        bound_by: Limit::Sampling,
    };
    let metric = notes::reach(&reach, Axis::Height, "A detail of 3 cm", Units::Metric);
    let imperial = notes::reach(&reach, Axis::Height, "A detail of 1.18 in", Units::Imperial);
    // 121.92 m is exactly 400 ft.
    assert!(metric.contains("height of 122 m"), "{metric}");
    assert!(
        imperial.contains("height of 400 ft") && !names_metric(&imperial),
        "{imperial}"
    );
}

#[test]
fn the_niirs_note_names_every_reason_and_is_absent_inside_the_range() {
    use sharpfield::core::physics::chain::NiirsCaveats;
    let none = NiirsCaveats::of(550e-9, 1.5, 50.0, 90.0, 6.0);
    assert_eq!(notes::niirs_note(&none, 1.5, 550e-9, 50.0, 90.0), None);
    let all = NiirsCaveats::of(10e-6, 0.4, 3.0, 5.0, 10.5);
    let text = notes::niirs_note(&all, 0.4, 10e-6, 3.0, 5.0).expect("every caveat applies");
    for part in ["10000 nm", "Q = 0.4", "SNR 3", "5°", "0–9"] {
        assert!(text.contains(part), "{part:?} missing from {text:?}");
    }
    // Each level of the scale has its words, and a figure above 9 says it is beyond the scale.
    for (level, words) in notes::NIIRS_SCALE {
        let within = (f64::from(level) + 0.5).min(9.0);
        assert_eq!(notes::niirs_reading(within), words, "level {level}");
    }
    assert!(notes::niirs_reading(9.7).contains("finer than the scale"));
}
