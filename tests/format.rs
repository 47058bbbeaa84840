//! Numbers for people: display units and typing in imperial units. Conversion factors are the
//! international foot (0.3048 m) and inch (0.0254 m) of 1959, and the statute mile of 1609.344 m.

use sharpfield::core::contract::inputs::{entry_unit, input};
use sharpfield::core::contract::scenario::Scenario;
use sharpfield::core::words::format::{length, significant};
use sharpfield::core::words::units::{entry_matches, entry_range, from_entry_text, to_entry_text, Units};

fn check_length(metres: f64, units: Units, expected: &str) {
    assert_eq!(length(metres, units), expected, "{metres} m in {units:?}");
}

#[test]
fn lengths_pick_a_sensible_unit() {
    check_length(0.0042, Units::Metric, "4.2 mm");
    check_length(0.0219, Units::Metric, "2.19 cm");
    check_length(80.0, Units::Metric, "80 m");
    check_length(1500.0, Units::Metric, "1.5 km");
    check_length(0.0254, Units::Imperial, "1 in");
    check_length(121.92, Units::Imperial, "400 ft");
    check_length(1609.344 * 2.5, Units::Imperial, "2.5 mi");
    assert_eq!(significant(0.000123456), "0.000123");
    assert_eq!(significant(123456.0), "123456");
}

#[test]
fn imperial_entry_converts_exactly_and_back() {
    let feet = entry_unit("h", Units::Imperial).expect("height is typed in feet");
    // 400 ft is 121.92 m exactly (international foot).
    assert_eq!(from_entry_text("400", feet), "121.92");
    assert_eq!(to_entry_text("121.92", feet), "400");
    let inches = entry_unit("need", Units::Imperial).expect("need is typed in inches");
    assert_eq!(from_entry_text("1", inches), "0.0254");
    let mph = entry_unit("speed", Units::Imperial).expect("speed is typed in mph");
    // 60 mph = 26.8224 m/s exactly.
    assert_eq!(from_entry_text("60", mph), "26.8224");
    // Every whole number of feet from 1 to 5000 survives the trip to metres and back.
    for ft in 1..=5000 {
        let si = from_entry_text(&ft.to_string(), feet);
        assert_eq!(to_entry_text(&si, feet), ft.to_string(), "{ft} ft via {si} m");
    }
}

#[test]
fn a_field_keeps_its_text_while_it_means_the_same_value() {
    let feet = entry_unit("h", Units::Imperial).expect("feet");
    // 80 m shows as 262.467 ft (six figures), which still stands for 80 m.
    assert_eq!(to_entry_text("80", feet), "262.467");
    assert!(entry_matches("262.467", "80", feet));
    // Text being typed ("1.") stands for the value it parses to.
    assert!(entry_matches("1.", &from_entry_text("1.", feet), feet));
    // A value changed elsewhere (a demo, a link) no longer matches.
    assert!(!entry_matches("262.467", "120", feet));
    // Invalid text matches only itself.
    assert!(entry_matches("abc", "abc", feet));
    assert!(!entry_matches("abc", "80", feet));
}

#[test]
fn metric_entry_and_non_length_keys_are_not_converted() {
    assert_eq!(entry_unit("h", Units::Metric), None);
    assert_eq!(entry_unit("focal", Units::Imperial), None);
    assert_eq!(entry_unit("fo", Units::Imperial), None);
}

#[test]
fn text_that_is_no_number_is_passed_on_as_typed_and_rejected_with_the_range() {
    let feet = entry_unit("h", Units::Imperial).expect("feet");
    for typed in ["", "abc", "1..2", "NaN", "inf"] {
        assert_eq!(from_entry_text(typed, feet), typed);
        let (_, errors) = Scenario::from_query(&format!("h={}", typed.replace(' ', "+")));
        assert!(errors.iter().any(|e| e.key == "h"), "{typed:?} must be rejected");
    }
    let (min, max) = input("h").and_then(|i| i.range()).expect("h has a range");
    assert_eq!(entry_range(min, max, feet), "from 0.328 to 65617 ft");
}
