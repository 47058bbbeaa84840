//! Light in the plan (resolution-model §9, url-and-report keys `when`, `sky`, `lux`, `refl`, `iso`,
//! `baseiso`, `expmode`, `fw`, `rn`, `fmin`): the `when` format and its errors, the metered
//! exposure and its smear, the electrons and the contrast SNR by hand, the sun through the
//! contract against the NREL report's example, the day's hours, and the best settings evaluated
//! again just either side of their answer.

use sharpfield::core::contract::plan::Plan;
use sharpfield::core::contract::report::{report_for_query, Report};
use sharpfield::core::contract::scenario::{RawScenario, Scenario};
use std::f64::consts::PI;

fn check(case: &str, actual: f64, expected: f64, relative: f64) {
    assert!(
        (actual - expected).abs() <= relative * expected.abs(),
        "{case}: got {actual}, expected {expected} (± {relative:e} relative)"
    );
}

fn report(query: &str) -> Report {
    report_for_query(query)
}

/// A 1-type 20 MP camera at 80 m with a sensor given in full, so the figures can be worked by hand.
const CAMERA: &str = "sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80&gd=0&speed=10&fw=20000&rn=3&baseiso=100";

#[test]
fn when_reads_iso_8601_with_an_offset_and_writes_it_back() {
    for (text, written) in [
        ("2026-06-21T10:30+02:00", "2026-06-21T10:30+02:00"),
        ("2026-06-21T10:30:15Z", "2026-06-21T10:30:15+00:00"),
        ("2026-06-21 10:30-0530", "2026-06-21T10:30-05:30"),
        ("2026-02-28T23:59:59+14", "2026-02-28T23:59:59+14:00"),
    ] {
        let (scenario, errors) = Scenario::from_query(&format!("{CAMERA}&when={}", text.replace('+', "%2B")));
        assert!(errors.is_empty(), "{text}: {errors:?}");
        assert!(scenario.when.is_some(), "{text}");
        assert_eq!(scenario.to_raw().get("when"), Some(written), "{text}");
    }
}

#[test]
fn a_bad_when_names_the_field_and_the_format_and_the_rest_still_loads() {
    for bad in [
        "2026-13-01T10:00+02:00",
        "2026-02-30T10:00+02:00",
        "2026-06-21T10:00",
        "2026-06-21T25:00Z",
        "tomorrow",
        "2026-06-21T10:00+25:00",
    ] {
        let query = format!(
            "{}&when={}&lat=52&lon=5",
            CAMERA.replace("h=80", "h=95"),
            bad.replace('+', "%2B")
        );
        let (scenario, errors) = Scenario::from_query(&query);
        let error = errors
            .iter()
            .find(|e| e.key == "when")
            .unwrap_or_else(|| panic!("{bad}: no error"));
        assert!(error.message.starts_with("Date and time '"), "{}", error.message);
        assert!(
            error.message.contains("such as 2026-06-21T10:30+02:00"),
            "{}",
            error.message
        );
        assert!(scenario.when.is_none(), "{bad}");
        assert_eq!(scenario.height_m, 95.0, "{bad}: the rest of the scenario loads");
        assert_eq!(errors.len(), 1, "{bad}: {errors:?}");
    }
}

/// ISO 2720 by hand: N²/t = L·S/K, K = 12.5, L = ρE/π. 10 000 lx, ρ = 0.18, f/4, ISO 100:
/// L = 572.96 cd/m², t = 16·12.5/(572.96·100) = 3.4907 ms.
#[test]
fn metered_exposure_follows_iso_2720_and_its_smear_is_the_same_as_typing_it() {
    let auto = report(&format!("{CAMERA}&lux=10000&refl=0.18&iso=100&expmode=auto"));
    let by_hand = 4.0_f64.powi(2) * 12.5 / (0.18 * 10_000.0 / PI * 100.0);
    check("metered exposure", auto.exposure_s, by_hand, 1e-12);
    assert!(auto.metered);
    // The same frame with the time typed in smears exactly as much.
    let typed = report(&format!(
        "{CAMERA}&lux=10000&refl=0.18&iso=100&expmode=set&shutter={by_hand}"
    ));
    check("smear of the metered time", auto.motion_m, typed.motion_m, 1e-12);
    // EV100 = log2(L·100/K).
    check(
        "EV100",
        auto.ev100.unwrap_or(f64::NAN),
        (0.18 * 10_000.0 / PI * 100.0 / 12.5).log2(),
        1e-12,
    );
    // A typed exposure stays typed, whatever the light.
    let set = report(&format!("{CAMERA}&lux=10000&shutter=0.002"));
    assert_eq!(set.exposure_s, 0.002);
    assert!(!set.metered);
}

/// ISO 12232: H = 0.65·L·t/N²; electrons = full well · H · S0/78; noise √(n̄ + σ²) at the mean of
/// the 15 % target and 7 % background (the GIQE contrast SNR, resolution-model §5.1, §9).
#[test]
fn electrons_and_the_contrast_snr_by_hand_reach_the_imaging_chain() {
    let t = 0.001;
    let r = report(&format!("{CAMERA}&lux=20000&shutter={t}&iso=100"));
    let electrons = |rho: f64| 20_000.0 * 0.65 * (rho * 20_000.0 / PI) * t / 16.0 * 100.0 / 78.0;
    let (target, background) = (electrons(0.15), electrons(0.07));
    let noise = (0.5 * (target + background) + 9.0).sqrt();
    check("target electrons", r.target_e.unwrap_or(f64::NAN), target, 1e-12);
    check(
        "background electrons",
        r.background_e.unwrap_or(f64::NAN),
        background,
        1e-12,
    );
    check("contrast SNR", r.snr, (target - background) / noise, 1e-12);
    assert_eq!(
        serde_json::to_value(r.snr_source).ok(),
        Some(serde_json::json!("light"))
    );
    // The NIIRS and the GRD follow: a darker scene has a lower SNR, a lower NIIRS, a coarser GRD.
    let dark = report(&format!("{CAMERA}&lux=500&shutter={t}&iso=100"));
    assert!(dark.snr < r.snr && dark.niirs < r.niirs && dark.grd_m >= r.grd_m);
    // A typed SNR wins over the light's.
    let typed = report(&format!("{CAMERA}&lux=20000&shutter={t}&snr=30"));
    assert_eq!(typed.snr, 30.0);
    assert_eq!(
        serde_json::to_value(typed.snr_source).ok(),
        Some(serde_json::json!("typed"))
    );
    // Without light, the assumed 50 of the imaging chain, as before.
    assert_eq!(report(CAMERA).snr, 50.0);
}

/// The NREL report's example (NREL/TP-560-34302, 2004): 17 October 2003, 12:30:30 at UTC−7,
/// 39.742476° N, 105.1786° W → zenith 50.11162°, azimuth 194.34024°. The plan places the sun at
/// sea level in standard air with an estimated ΔT (the report's 1830 m, 820 mbar, 11 °C and ΔT 67 s
/// move the refraction by under 0.01°), so it is checked to 0.02°.
#[test]
fn the_sun_through_the_contract_matches_the_nrel_example() {
    let r = report("when=2003-10-17T12:30:30-07:00&lat=39.742476&lon=-105.1786");
    let elevation = r.sun_elevation_deg.unwrap_or(f64::NAN);
    assert!((elevation - (90.0 - 50.11162)).abs() < 0.02, "elevation {elevation}");
    let azimuth = r.sun_azimuth_deg.unwrap_or(f64::NAN);
    assert!((azimuth - 194.34024).abs() < 0.02, "azimuth {azimuth}");
    // The IES clear-sky model at that elevation gives daylight (tens of klx).
    let lux = r.illuminance_lx.unwrap_or(0.0);
    assert!(lux > 30_000.0 && lux < 110_000.0, "{lux}");
    // spa_tester.c prints sunrise 06:12:43 for that day (local time); the day's report rounds to
    // the minute.
    let day = r.day.expect("a day for a time and place");
    assert_eq!(day.sunrise.as_deref(), Some("06:13"));
}

#[test]
fn a_night_time_gives_no_light_and_says_so() {
    let r = report(&format!(
        "{CAMERA}&when=2026-06-21T01:00%2B02:00&lat=52&lon=5&expmode=auto"
    ));
    assert!(r.sun_elevation_deg.is_some_and(|e| e < 0.0));
    assert_eq!(r.illuminance_lx, None);
    let codes: Vec<&str> = r.light_notes.iter().map(|n| n.code).collect();
    assert!(codes.contains(&"night") && codes.contains(&"no-light"), "{codes:?}");
    assert_eq!(r.exposure_s, 0.001, "the typed exposure is used");
}

/// The day's good hours: every sample inside a window has the sun at least 15° high and the need
/// met under its light, checked by planning each window's ends again as a scenario of its own.
#[test]
fn the_days_windows_meet_the_need_at_their_ends_and_not_just_outside() {
    let base = format!("{CAMERA}&need=0.05&expmode=auto&iso=100&lat=52&lon=5&speed=12");
    let r = report(&format!("{base}&when=2026-03-21T12:00%2B01:00"));
    let day = r.day.expect("a day");
    assert!(!day.windows.is_empty(), "a spring day at 52° N has good hours");
    for window in &day.windows {
        let (from, to) = window.split_once('–').expect("HH:MM–HH:MM");
        let shifted = |clock: &str, minutes: i32| {
            let (h, m) = clock.split_once(':').expect("HH:MM");
            let total = h.parse::<i32>().unwrap_or(0) * 60 + m.parse::<i32>().unwrap_or(0) + minutes;
            format!("{:02}:{:02}", total.div_euclid(60), total.rem_euclid(60))
        };
        // One sample (20 min) before the window and one after it are not good.
        let (before, after) = (shifted(from, -20), shifted(to, 20));
        for (clock, inside) in [
            (from, true),
            (to, true),
            (before.as_str(), false),
            (after.as_str(), false),
        ] {
            let at = report(&format!("{base}&when=2026-03-21T{clock}%2B01:00"));
            let met = at.sun_elevation_deg.unwrap_or(0.0) >= 14.99
                && at.detail_on_plane_m <= 0.05 * (1.0 + 1e-9)
                && at.illuminance_lx.is_some();
            assert_eq!(
                met, inside,
                "{clock}: elevation {:?}, detail {}",
                at.sun_elevation_deg, at.detail_on_plane_m
            );
        }
    }
    assert!(day.good_hours > 0.0 && day.good_hours < 24.0);
}

/// The best settings are re-evaluated one third of a stop either side in f-number and in ISO, each
/// as a scenario of its own with the exposure metered: none resolves finer.
#[test]
fn the_best_settings_are_no_worse_than_their_neighbours() {
    for base in [
        format!("{CAMERA}&lux=3000&refl=0.18&fmin=2.8&speed=12"),
        format!("{CAMERA}&lux=60000&refl=0.18&fmin=2&speed=5&need=0.04"),
        "sw=36&sh=24&cols=8192&rows=5464&focal=300&fnum=5.6&fmin=4&h=100&gd=2000&air=slc-day&tspeed=1.5&lux=15000&fw=50000&rn=2&baseiso=100"
            .to_string(),
    ] {
        let best = report(&base).best.expect("best settings under light");
        let plan = |fnum: f64, iso: f64| {
            let mut raw = RawScenario::from_query(&base);
            raw.set("fnum", &fnum.to_string());
            raw.set("iso", &iso.to_string());
            raw.set("expmode", "auto");
            Plan::from_raw(&raw).report
        };
        let here = plan(best.f_number, best.iso);
        check("the best re-evaluated", here.exposure_s, best.exposure_s, 1e-9);
        let finest = here.grd_along_m.max(here.grd_across_m);
        check("its detail", finest, best.resolved_m, 1e-9);
        let third_f = 2f64.powf(1.0 / 6.0);
        let third_iso = 2f64.powf(1.0 / 3.0);
        for (fnum, iso) in [
            (best.f_number * third_f, best.iso),
            (best.f_number / third_f, best.iso),
            (best.f_number, best.iso * third_iso),
            (best.f_number, best.iso / third_iso),
        ] {
            if !(0.5..=16.0 * 1.001).contains(&fnum) || !(100.0..=6400.0 * 1.001).contains(&iso) {
                continue;
            }
            if fnum < best.f_number && base.contains("fmin=") {
                let widest: f64 = base.split("fmin=").nth(1).and_then(|t| t.split('&').next()).and_then(|t| t.parse().ok()).unwrap_or(0.0);
                if fnum < widest * 0.999 {
                    continue;
                }
            }
            let r = plan(fnum, iso);
            if r.light_notes.iter().any(|n| n.code == "overexposed") {
                continue;
            }
            let detail = r.grd_along_m.max(r.grd_across_m);
            assert!(
                detail >= best.resolved_m * (1.0 - 1e-9),
                "{base}: f/{fnum} ISO {iso} resolves {detail}, finer than the best {} at f/{} ISO {}",
                best.resolved_m,
                best.f_number,
                best.iso
            );
        }
        assert!(best.resolved_m <= best.current_resolved_m * (1.0 + 1e-9));
        assert!(best.why.len() >= 2, "{:?}", best.why);
    }
}

/// The turbulence profile suggested for the hour follows the sun (issue 12): a daytime profile with
/// the sun up at `when`, a night-time one with it down; the scenario's `air` is left as chosen.
#[test]
fn the_suggested_turbulence_profile_follows_the_sun() {
    for (time, expected) in [("12:00", "slc-day"), ("23:30", "slc-night"), ("05:00", "slc-night")] {
        let query = format!("v=1&{CAMERA}&lat=-37.8&lon=145.2&when=2026-09-21T{time}%2B10%3A00&air=slc-night");
        let r = report(&query);
        let day = r.day.as_ref().expect("a day for a time and place");
        assert_eq!(day.air_suggested, expected, "{time}");
        // The sun's own side of the horizon, by NREL's SPA through the report.
        let up = r.sun_elevation_deg.expect("the sun placed") > 0.0;
        assert_eq!(up, expected == "slc-day", "{time}");
        assert_eq!(
            Scenario::from_query(&query).0.air.key(),
            "slc-night",
            "the choice is kept"
        );
    }
}

/// A place alone (a survey's origin) says nothing of the light; a time without a place says that
/// the sun needs one.
#[test]
fn only_a_time_without_a_place_asks_for_the_place() {
    let place_only = report(&format!("v=1&{CAMERA}&lat=-36.85&lon=146.29"));
    assert!(place_only.light_notes.is_empty(), "{:?}", place_only.light_notes);
    let time_only = report(&format!("v=1&{CAMERA}&when=2026-11-02T10%3A30%2B11%3A00"));
    let codes: Vec<&str> = time_only.light_notes.iter().map(|n| n.code).collect();
    assert_eq!(codes, ["place"]);
    assert!(time_only.light_notes[0].text.contains("latitude and longitude"));
}
