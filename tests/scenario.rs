//! The scenario contract (shared/reference/url-and-report.md, version 1): any query gives a
//! report with finite numbers and named errors, never a panic; a valid scenario survives the trip
//! through its URL unchanged; bad values name their key and the accepted range.

use proptest::prelude::*;
use proptest::test_runner::FileFailurePersistence;
use serde_json::Value;
use sharpfield::core::contract::inputs::{input, Input, INPUTS, NAME_MAX_CHARS};
use sharpfield::core::contract::report::{report_for_query, report_json};
use sharpfield::core::contract::scenario::{AirModel, Offset, RawScenario, Scenario};
use sharpfield::core::physics::light::daylight::Sky;
use sharpfield::core::physics::light::sun::CivilTime;
use sharpfield::core::physics::target::CdModel;
use sharpfield::core::planning::solve::TargetPlane;
use sharpfield::core::planning::survey::SurveySettings;
use sharpfield::core::words::units::Units;

/// Every key of the contract, in the table's order.
fn keys() -> Vec<&'static str> {
    INPUTS.iter().map(|i| i.key).collect()
}

/// The table's entry for `key`.
fn spec(key: &str) -> &'static Input {
    input(key).unwrap_or_else(|| panic!("no entry for {key}"))
}

/// A valid query with every required key, to which a test adds the key under test.
const BASE: &str = "sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80";

/// Report fields that are always numbers (never null, so never a non-finite value in the JSON).
const NUMBER_FIELDS: &[&str] = &[
    "pitch_m",
    "aperture_m",
    "slant_range_m",
    "look_angle_deg",
    "gsd_m",
    "gsd_ground_m",
    "gsd_geomean_m",
    "gsd_weighted_m",
    "rayleigh_rad",
    "diffraction_m",
    "seeing_rad",
    "turbulence_m",
    "motion_m",
    "motion_px",
    "limit_m",
    "governing_margin",
    "q",
];

/// Report fields that are a number or null.
const OPTIONAL_NUMBER_FIELDS: &[&str] = &[
    "r0_m",
    "need_m",
    "reach_m",
    "focal_needed_m",
    "target_m",
    "target_cycles",
];

/// Numbers inside nested report objects, by the key they sit under.
const NESTED_NUMBER_KEYS: &[&str] = &[
    "position_m",
    "up_to_m",
    "best_m",
    "focal_m",
    "cycles_needed",
    "probability",
];

/// Keys whose value may be null: the optional figures above, the optional solve results, and the
/// survey figures that need an input the scenario may lack (src/core/survey.rs, owned by the survey
/// work, gives `None` beside a note for those).
const NULLABLE_KEYS: &[&str] = &[
    "r0_m",
    "need_gsd_m",
    "people_level",
    "p50_m",
    "p80_m",
    "need_m",
    "reach",
    "reach_m",
    "focal_needed",
    "focal_needed_m",
    "target_m",
    "target_cycles",
    "trigger_s",
    "lines",
    "photos_per_line",
    "photos",
    "path_length_m",
    "flight_time_s",
    "batteries",
    "storage_mb",
    "max_speed_blur_mps",
    "max_speed_trigger_mps",
    // The edges need counts; the wind figures need a wind, the relief figures a relief.
    "extra_photos_per_end",
    "ground_speed_out_mps",
    "ground_speed_back_mps",
    "crab_deg",
    "gsd_min_m",
    "gsd_max_m",
    "front_min_pct",
    "side_min_pct",
    "relief_height_m",
    // The boundary's figures: null when it cannot be read or planned (field_problem says why).
    "area_m2",
    "field_lines",
    "field_stretches",
    "field_photos",
    "field_path_length_m",
    "field_turns",
    "field_flight_time_s",
    "field_batteries",
    "field_storage_mb",
    "heading_fewest_lines",
    "heading_shortest_path",
    "field_problem",
    // Null when the inputs lie inside GIQE 5's range (url-and-report.md).
    "niirs_note",
    // The light: no sun without a time and place, no light or signal without either.
    "sun_elevation_deg",
    "sun_azimuth_deg",
    "illuminance_lx",
    "ev100",
    "target_e",
    "background_e",
    "noise_e",
    "day",
    "best",
    "sunrise",
    "sunset",
    "max_speed_mps",
];

/// serde_json writes a non-finite f64 as null, so a null anywhere else is a NaN or an infinity.
fn no_unexpected_null(value: &Value, path: &str) -> Result<(), String> {
    match value {
        Value::Object(map) => map.iter().try_for_each(|(k, v)| {
            if v.is_null() && !NULLABLE_KEYS.contains(&k.as_str()) {
                Err(format!("{path}.{k} is null"))
            } else {
                no_unexpected_null(v, &format!("{path}.{k}"))
            }
        }),
        Value::Array(items) => items.iter().enumerate().try_for_each(|(i, v)| {
            if v.is_null() {
                Err(format!("{path}[{i}] is null"))
            } else {
                no_unexpected_null(v, &format!("{path}[{i}]"))
            }
        }),
        _ => Ok(()),
    }
}

fn is_finite_number(value: &Value) -> bool {
    value.as_f64().is_some_and(f64::is_finite)
}

/// Every nested value under one of `NESTED_NUMBER_KEYS` is a finite number.
fn nested_numbers_are_finite(value: &Value, path: &str) -> Result<(), String> {
    match value {
        Value::Object(map) => {
            for (k, v) in map {
                if NESTED_NUMBER_KEYS.contains(&k.as_str()) && !is_finite_number(v) {
                    return Err(format!("{path}.{k} is {v}"));
                }
                nested_numbers_are_finite(v, &format!("{path}.{k}"))?;
            }
            Ok(())
        }
        Value::Array(items) => items
            .iter()
            .enumerate()
            .try_for_each(|(i, v)| nested_numbers_are_finite(v, &format!("{path}[{i}]"))),
        _ => Ok(()),
    }
}

/// The checks every report must pass, whatever the query: JSON that parses, finite numbers where
/// the contract has numbers, errors that name a key the query gave (or a required one).
fn check_report(query: &str) -> Result<(), String> {
    let json = report_json(query);
    let report: Value = serde_json::from_str(&json).map_err(|e| format!("not JSON ({e}): {json}"))?;
    for field in NUMBER_FIELDS {
        if !is_finite_number(&report[field]) {
            return Err(format!("{field} is {} for {query:?}", report[field]));
        }
    }
    for field in OPTIONAL_NUMBER_FIELDS {
        let v = &report[field];
        if !(v.is_null() || is_finite_number(v)) {
            return Err(format!("{field} is {v} for {query:?}"));
        }
    }
    nested_numbers_are_finite(&report, "report").map_err(|e| format!("{e} for {query:?}"))?;
    no_unexpected_null(&report, "report").map_err(|e| format!("{e} for {query:?}"))?;
    let (scenario, _) = Scenario::from_query(query);
    if report["r0_m"].is_null() != (scenario.air == AirModel::None) {
        return Err(format!(
            "r0_m is {} with air {:?} for {query:?}",
            report["r0_m"], scenario.air
        ));
    }
    if scenario.survey.area_width_m.is_some() && scenario.survey.area_length_m.is_some() {
        for field in ["footprint_across_m", "footprint_along_m"] {
            if !is_finite_number(&report[field]) {
                return Err(format!("{field} is {} for {query:?}", report[field]));
            }
        }
    }
    let given: Vec<String> = RawScenario::from_query(query)
        .pairs
        .into_iter()
        .map(|(k, _)| k)
        .collect();
    let errors = report["errors"].as_array().ok_or("errors is not a list")?;
    for error in errors {
        let key = error["key"].as_str().ok_or("error without a key")?;
        let message = error["message"].as_str().ok_or("error without a message")?;
        if message.is_empty() || !(given.iter().any(|k| k == key) || spec(key).required) {
            return Err(format!("error {error} names no given key for {query:?}"));
        }
    }
    Ok(())
}

// ---------------------------------------------------------------------------------------------
// Any query: never a panic, finite numbers, named errors
// ---------------------------------------------------------------------------------------------

/// Awkward values: non-numbers, non-finite, huge, negative, empty, percent signs, separators,
/// fractions, unicode, and the contract's own words.
const AWKWARD: &[&str] = &[
    "NaN",
    "nan",
    "-NaN",
    "inf",
    "-inf",
    "+Infinity",
    "infinity",
    "1e308",
    "1e999",
    "-1e999",
    "5e-324",
    "2.2250738585072014e-308",
    "1.7976931348623157e308",
    "-0",
    "0",
    "-5",
    "-1e-300",
    "",
    " ",
    "%",
    "%%",
    "%zz",
    "%FF%FE",
    "%00",
    "&&",
    "==",
    "=",
    "&",
    "+",
    "1/1000",
    "1/0",
    "0/0",
    "-1/1000",
    "1/1e-300",
    "1e308/1e-308",
    "inf/inf",
    "1/2/3",
    "ü",
    "１２",
    "٣",
    "𝟙",
    "0x10",
    "1_000",
    " 80 ",
    "80m",
    "1,5",
    "hv57",
    "slc-day",
    "slc-night",
    "power",
    "none",
    "metric",
    "imperial",
    "1",
    "2",
    "85",
    "85.0000001",
    "20000",
    "100000",
    "1e-18",
    "1e-11",
    "\u{0}",
    "\n",
    "<script>",
    "\"",
    "'",
];

fn awkward_value() -> impl Strategy<Value = String> {
    prop_oneof![
        prop::sample::select(AWKWARD).prop_map(String::from),
        any::<f64>().prop_map(|x| x.to_string()),
        any::<f64>().prop_map(|x| format!("{x:e}")),
        (-1e5f64..1e5).prop_map(|x| x.to_string()),
        (0.0f64..1.0).prop_map(|x| x.to_string()),
        "[0-9eE.+/-]{0,12}",
        any::<String>(),
    ]
}

fn any_key() -> impl Strategy<Value = String> {
    prop_oneof![
        4 => prop::sample::select(keys()).prop_map(String::from),
        1 => "[a-z]{1,5}",
        1 => any::<String>(),
        1 => prop::sample::select(&["", " ", "%", "&", "=", " h", "H", "h ", "?h", "sw%00"][..]).prop_map(String::from),
    ]
}

/// A query built from (key, value) pairs, written raw (so that `%`, `&` and `=` in a value break
/// it up in odd ways) or properly encoded, sometimes with a leading `?` or doubled `&&`.
fn any_query() -> impl Strategy<Value = String> {
    let pairs = || prop::collection::vec((any_key(), awkward_value()), 0..24);
    prop_oneof![
        (pairs(), any::<bool>(), any::<bool>()).prop_map(|(pairs, question, doubled)| {
            let joined: Vec<String> = pairs.iter().map(|(k, v)| format!("{k}={v}")).collect();
            let separator = if doubled { "&&" } else { "&" };
            format!("{}{}", if question { "?" } else { "" }, joined.join(separator))
        }),
        pairs().prop_map(|pairs| RawScenario { pairs }.to_query()),
        // A valid base with awkward values for some keys.
        prop::collection::vec((prop::sample::select(keys()), awkward_value()), 0..8).prop_map(|pairs| {
            let mut raw = RawScenario::from_query(BASE);
            for (k, v) in pairs {
                raw.set(k, &v);
            }
            raw.to_query()
        }),
        any::<String>(),
    ]
}

fn config(cases: u32) -> ProptestConfig {
    ProptestConfig {
        cases,
        failure_persistence: Some(Box::new(FileFailurePersistence::Direct(
            "proptest-regressions/scenario.txt",
        ))),
        ..ProptestConfig::default()
    }
}

proptest! {
    #![proptest_config(config(2048))]

    #[test]
    fn any_query_gives_a_report_with_finite_numbers(query in any_query()) {
        if let Err(problem) = check_report(&query) {
            prop_assert!(false, "{}", problem);
        }
    }
}

// ---------------------------------------------------------------------------------------------
// Valid scenarios: scenario → query → scenario is the identity
// ---------------------------------------------------------------------------------------------

/// Any value in a key's accepted range: the ends, log-uniform and uniform values (which carry all
/// 17 significant digits), and whole numbers for the pixel counts.
fn in_range(key: &'static str) -> BoxedStrategy<f64> {
    let spec = spec(key);
    let (min, max) = spec.range().unwrap_or_else(|| panic!("{key} takes no number"));
    if spec.is_whole() {
        return (min as u32..=max as u32).prop_map(f64::from).boxed();
    }
    let uniform = (0.0f64..=1.0).prop_map(move |u| (min + (max - min) * u).clamp(min, max));
    if min > 0.0 {
        let log = (0.0f64..=1.0).prop_map(move |u| (min * (max / min).powf(u)).clamp(min, max));
        prop_oneof![1 => Just(min), 1 => Just(max), 4 => uniform, 4 => log].boxed()
    } else {
        prop_oneof![1 => Just(min), 1 => Just(max), 8 => uniform].boxed()
    }
}

fn maybe(key: &'static str) -> BoxedStrategy<Option<f64>> {
    prop::option::of(in_range(key)).boxed()
}

/// A local date and time with an offset in quarter hours, as a `when` link can carry it.
fn civil_time() -> impl Strategy<Value = CivilTime> {
    (
        1900i32..=2200,
        1u32..=12,
        1u32..=28,
        0u32..24,
        0u32..60,
        0u32..60,
        -48i32..=56,
    )
        .prop_map(|(year, month, day, hour, minute, second, quarters)| CivilTime {
            year,
            month,
            day,
            hour,
            minute,
            second: f64::from(second),
            offset_minutes: quarters * 15,
        })
}

fn extra_keys() -> impl Strategy<Value = Vec<(String, String)>> {
    prop::collection::vec(("[a-zA-Z_ü][a-zA-Z0-9_.ü-]{0,10}", any::<String>()), 0..4).prop_map(|pairs| {
        let mut seen: Vec<String> = Vec::new();
        pairs
            .into_iter()
            .filter(|(k, _)| {
                let fresh = !keys().contains(&k.as_str()) && !seen.contains(k);
                seen.push(k.clone());
                fresh
            })
            .collect()
    })
}

fn valid_scenario() -> impl Strategy<Value = Scenario> {
    let optics = (
        in_range("sw"),
        in_range("sh"),
        in_range("cols"),
        in_range("rows"),
        in_range("focal"),
        in_range("fnum"),
        in_range("wl"),
        in_range("h"),
        prop_oneof![
            in_range("gd").prop_map(Offset::GroundDistance),
            in_range("tilt").prop_map(Offset::Tilt)
        ],
    );
    let air = (
        prop::sample::select(&AirModel::ALL[..]),
        in_range("cn2"),
        in_range("cexp"),
        in_range("speed"),
        in_range("shutter"),
        in_range("rate"),
        in_range("tspeed"),
    );
    let survey = (
        maybe("aw"),
        maybe("al"),
        in_range("fo"),
        in_range("so"),
        maybe("need"),
        maybe("tdim"),
        in_range("trig"),
        in_range("endur"),
        in_range("turn"),
        in_range("mb"),
        in_range("blur"),
    );
    let place = (
        maybe("lat"),
        maybe("lon"),
        in_range("hdg"),
        prop::sample::select(&[Units::Metric, Units::Imperial][..]),
        prop::collection::vec(any::<char>(), 0..=NAME_MAX_CHARS).prop_map(|c| c.into_iter().collect::<String>()),
        extra_keys(),
    );
    let needs = (
        maybe("needgsd"),
        prop::option::of(prop::sample::select(&[TargetPlane::Ground, TargetPlane::Upright][..])),
        prop::sample::select(&[CdModel::OneD, CdModel::TwoD][..]),
    );
    let chain = (
        in_range("obsc"),
        in_range("wfe"),
        in_range("fill"),
        in_range("jitter"),
        maybe("snr"),
    );
    let light = (
        prop::option::of(civil_time()),
        prop::sample::select(&[Sky::Clear, Sky::PartlyCloudy, Sky::Overcast][..]),
        maybe("lux"),
        in_range("refl"),
        any::<bool>(),
        in_range("iso"),
        (maybe("baseiso"), maybe("fw"), maybe("rn"), maybe("fmin")),
        (maybe("tht"), maybe("refk")),
        (
            prop::option::of((in_range("relief"), in_range("relief")).prop_map(|(a, b)| (a.min(b), a.max(b)))),
            in_range("wind"),
            in_range("wdir"),
        ),
    );
    (optics, air, survey, place, (needs, chain, light)).prop_map(
        |(
            (sw, sh, cols, rows, focal, fnum, wl, h, offset),
            (air, cn2, cexp, speed, shutter, rate, tspeed),
            (aw, al, fo, so, need, tdim, trig, endur, turn, mb, blur),
            (lat, lon, hdg, units, name, extra),
            (
                (need_gsd, plane, cdm),
                (obsc, wfe, fill, jitter, snr),
                (when, sky, lux, refl, auto_exposure, iso, (base_iso, fw, rn, fmin), (tht, refk), (relief, wind, wdir)),
            ),
        )| Scenario {
            field: String::new(),
            target_height_m: tht,
            earth_k: refk,
            when,
            sky,
            lux,
            reflectance: refl,
            auto_exposure,
            iso,
            base_iso,
            full_well_e: fw,
            read_noise_e: rn,
            widest_f_number: fmin,
            name,
            sensor_width_mm: sw,
            sensor_height_mm: sh,
            cols: cols as u32,
            rows: rows as u32,
            focal_mm: focal,
            f_number: fnum,
            wavelength_nm: wl,
            height_m: h,
            offset,
            air,
            cn2_at_1m: cn2,
            cn2_exponent: cexp,
            speed_mps: speed,
            shutter_s: shutter,
            turn_rate_deg_s: rate,
            target_speed_mps: tspeed,
            obscuration: obsc,
            wfe_waves: wfe,
            fill,
            jitter_urad: jitter,
            snr,
            need_m: need,
            need_gsd_m: need_gsd,
            target_plane: plane,
            target_m: tdim,
            cd_model: cdm,
            survey: SurveySettings {
                area_width_m: aw,
                area_length_m: al,
                front_overlap_pct: fo,
                side_overlap_pct: so,
                trigger_s: trig,
                endurance_min: endur,
                turn_s: turn,
                photo_mb: mb,
                blur_budget_px: blur,
                latitude_deg: lat,
                longitude_deg: lon,
                heading_deg: hdg,
                relief_m: relief,
                wind_mps: wind,
                wind_from_deg: wdir,
            },
            units,
            extra,
        },
    )
}

proptest! {
    #![proptest_config(config(2048))]

    #[test]
    fn scenario_to_query_and_back_is_the_identity(scenario in valid_scenario()) {
        let query = scenario.to_query();
        let (back, errors) = Scenario::from_query(&query);
        prop_assert!(errors.is_empty(), "errors {:?} for {}", errors, query);
        prop_assert_eq!(&back, &scenario, "query {}", query);
        prop_assert_eq!(back.to_query(), query);
    }
}

proptest! {
    #![proptest_config(config(512))]

    #[test]
    fn every_valid_scenario_reports_finite_numbers(scenario in valid_scenario()) {
        let query = scenario.to_query();
        if let Err(problem) = check_report(&query) {
            prop_assert!(false, "{}", problem);
        }
        let report = report_for_query(&query);
        prop_assert!(report.errors.is_empty());
        prop_assert!(report.limit_m > 0.0);
    }
}

// ---------------------------------------------------------------------------------------------
// Named cases
// ---------------------------------------------------------------------------------------------

#[test]
fn extreme_valid_inputs_give_finite_reports() {
    // The corners the brief names (tilt 85°, h = 0.1 m, 20 km) and their neighbours, under each air.
    let geometries = [
        "h=0.1&tilt=85",
        "h=20000&tilt=85",
        "h=0.1&gd=100000",
        "h=20000&gd=100000",
        "h=0.1&gd=0",
        "h=20000&gd=0",
        "h=8&gd=20000",
    ];
    let airs = [
        "air=none",
        "air=hv57",
        "air=slc-day",
        "air=slc-night",
        "air=power&cn2=1e-11&cexp=0",
        "air=power&cn2=1e-18&cexp=-3",
    ];
    let optics = [
        "sw=0.1&sh=0.1&cols=100000&rows=100000&focal=0.5&fnum=0.5&wl=200",
        "sw=200&sh=200&cols=16&rows=16&focal=5000&fnum=64&wl=20000",
    ];
    let extras = "speed=150&shutter=10&need=0.0001&tdim=10000&aw=100000&al=1&fo=95&so=0";
    for g in geometries {
        for a in airs {
            for o in optics {
                let query = format!("{o}&{g}&{a}&{extras}");
                if let Err(problem) = check_report(&query) {
                    panic!("{problem}");
                }
                assert!(report_for_query(&query).errors.is_empty(), "{query}");
            }
        }
    }
}

/// `BASE` with `key` set to `value` (replacing the base's own value, if any).
fn base_with(key: &str, value: &str) -> String {
    let mut raw = RawScenario::from_query(BASE);
    raw.set(key, value);
    raw.to_query()
}

/// Asserts that `value` for `key` is rejected with a message naming the key's label and range,
/// and that the rest of the scenario still loads.
fn check_rejected(key: &str, value: &str) {
    let (scenario, errors) = Scenario::from_query(&base_with(key, value));
    let spec = spec(key);
    assert_eq!(errors.len(), 1, "{key}={value:?}: {errors:?}");
    let error = &errors[0];
    assert_eq!(error.key, key, "{key}={value:?}: {errors:?}");
    assert!(error.message.contains(spec.label), "{key}={value:?}: {}", error.message);
    assert!(
        error.message.contains(&spec.range_text()),
        "{key}={value:?}: {}",
        error.message
    );
    if key != "focal" {
        assert_eq!(scenario.focal_mm, 8.8, "{key}={value:?}");
    }
    if key != "h" {
        assert_eq!(scenario.height_m, 80.0, "{key}={value:?}");
    }
}

#[test]
fn bad_values_name_the_key_and_the_accepted_range() {
    for spec in INPUTS.iter().filter(|i| i.is_number()) {
        let (min, max) = spec.range().unwrap_or_default();
        let below = min - min.abs().max(1.0);
        let above = max * 2.0 + 1.0;
        let mut bad = vec![
            below.to_string(),
            above.to_string(),
            "abc".into(),
            String::new(),
            "NaN".into(),
            "inf".into(),
            "-inf".into(),
            "1e999".into(),
            "%".into(),
            "１２".into(),
        ];
        if spec.is_whole() {
            bad.push(format!("{min}.5"));
        }
        if spec.key == "shutter" {
            bad.extend(["1/0".into(), "0/0".into(), "-1/1000".into(), "1/1000/2".into()]);
        }
        for value in bad {
            check_rejected(spec.key, &value);
        }
    }
    for (key, value, words) in [
        ("air", "fog", "none, hv57, slc-day, slc-night, power"),
        ("units", "furlongs", "metric or imperial"),
        ("v", "2", "give 1"),
    ] {
        let (_, errors) = Scenario::from_query(&format!("{BASE}&{key}={value}"));
        let error = errors
            .iter()
            .find(|e| e.key == key)
            .unwrap_or_else(|| panic!("{key}={value} accepted"));
        assert!(error.message.contains(words), "{key}: {}", error.message);
    }
}

#[test]
fn missing_required_keys_are_named_and_defaults_used() {
    let (scenario, errors) = Scenario::from_query("");
    let named: Vec<&str> = errors.iter().map(|e| e.key.as_str()).collect();
    let required: Vec<&str> = INPUTS.iter().filter(|i| i.required).map(|i| i.key).collect();
    assert_eq!(named, required);
    assert_eq!(
        required,
        ["sw", "sh", "cols", "rows", "focal", "fnum", "h"],
        "the contract's required keys"
    );
    for error in &errors {
        let spec = spec(&error.key);
        assert!(error.message.contains(&spec.range_text()), "{}", error.message);
    }
    assert!(scenario.focal_mm > 0.0 && scenario.height_m > 0.0);
}

#[test]
fn unknown_keys_are_kept_and_listed_as_ignored() {
    let query = format!("{BASE}&foo=bar&Zoom=2&x%C3%BC=%26");
    let (scenario, errors) = Scenario::from_query(&query);
    assert!(errors.is_empty(), "{errors:?}");
    assert_eq!(
        scenario.extra,
        vec![
            ("foo".into(), "bar".into()),
            ("Zoom".into(), "2".into()),
            ("xü".into(), "&".into())
        ]
    );
    let report = report_for_query(&query);
    assert_eq!(report.ignored, vec!["foo", "Zoom", "xü"]);
    // Re-sharing keeps them.
    let again = scenario.to_query();
    assert!(again.ends_with("&foo=bar&Zoom=2&x%C3%BC=%26"), "{again}");
}

#[test]
fn shutter_accepts_a_fraction() {
    // (text, seconds)
    for (text, seconds) in [
        ("1/1000", 0.001),
        ("1/250", 0.004),
        (" 1 / 60 ", 1.0 / 60.0),
        ("0.002", 0.002),
        ("2/1", 2.0),
    ] {
        let (scenario, errors) = Scenario::from_query(&base_with("shutter", text));
        assert!(errors.is_empty(), "shutter={text}: {errors:?}");
        assert_eq!(scenario.shutter_s, seconds, "shutter={text}");
    }
    // Written back as the decimal it stands for.
    let (scenario, _) = Scenario::from_query(&format!("{BASE}&shutter=1/1000"));
    assert!(scenario.to_query().contains("&shutter=0.001&"));
}

#[test]
fn ground_distance_and_tilt_together_are_an_error() {
    let (scenario, errors) = Scenario::from_query(&format!("{BASE}&gd=50&tilt=30"));
    assert_eq!(errors.len(), 1, "{errors:?}");
    assert_eq!(errors[0].key, "tilt");
    assert!(
        errors[0].message.contains("gd") && errors[0].message.contains("tilt"),
        "{}",
        errors[0].message
    );
    assert_eq!(scenario.offset, Offset::GroundDistance(50.0));
    // Either alone is fine; tilt gives gd = h·tan(tilt) over a flat Earth, and over the round
    // one (radius k·R_E, k = 4/3; resolution-model §10) the arc to where the look meets the
    // ground: by the law of sines the angle at the target from its vertical is
    // asin((r + h)·sin θ / r), and the arc is r times its excess over θ (by hand).
    let (tilted, errors) = Scenario::from_query(&format!("{BASE}&tilt=45"));
    assert!(errors.is_empty());
    let g = tilted.geometry();
    let (r, theta) = (4.0 / 3.0 * 6_371_000.0, 45f64.to_radians());
    let arc = r * (((r + 80.0) * theta.sin() / r).asin() - theta);
    assert!((g.ground_distance_m - arc).abs() < 1e-9 * arc, "{g:?} vs {arc}");
    assert!(
        (g.ground_distance_m - 80.0).abs() < 1e-3,
        "{g:?}: within a millimetre of flat"
    );
}

#[test]
fn repeated_keys_use_the_first_value_and_say_so() {
    let (scenario, errors) = Scenario::from_query(&format!("{BASE}&focal=50&focal=100"));
    assert_eq!(scenario.focal_mm, 8.8);
    assert!(
        errors
            .iter()
            .any(|e| e.key == "focal" && e.message.contains("more than once")),
        "{errors:?}"
    );
}

#[test]
fn long_names_are_cut_and_names_stay_text() {
    let long: String = "é".repeat(NAME_MAX_CHARS + 5);
    let (scenario, errors) = Scenario::from_query(&format!("{BASE}&name={long}"));
    assert_eq!(scenario.name.chars().count(), NAME_MAX_CHARS);
    assert!(errors.iter().any(|e| e.key == "name"));
    let (scenario, _) = Scenario::from_query(&format!("{BASE}&name=%3Cb%3EFence%20%26%20gate%3C%2Fb%3E"));
    assert_eq!(scenario.name, "<b>Fence & gate</b>");
}
