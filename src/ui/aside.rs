//! The page's second on-demand module, `sharpfield-aside`: work the first plan does not need, done
//! in a web worker once the page shows its figures, so that it is neither in the first load nor in
//! the way of typing. It places the sun (NREL SPA and its tables), draws the QR code of a link, and
//! works out the day's good hours and the best settings (some hundreds of evaluations each).
//!
//! Requests and answers (`ui::worker` carries them, JS arrays of plain values):
//! - `["sun", unix_s, latitude, longitude]` → `[placed, elevation, azimuth]`;
//! - `["qr", link]` → `[size, path]`, or `[]` when the link is too long for a QR code;
//! - `["light", query]` → `[html]`: the light's figures and notes, as the light panel shows them;
//! - `["extras", query]` → `[html]`: the day's good hours on a timeline and the best settings with
//!   their trades, as the light panel shows them; its button carries the settings to apply
//!   (`data-fnum`, `data-iso`).

use crate::core::contract::plan::Extras;
use crate::core::contract::report::{BestReport, DayReport};
use crate::core::contract::scenario::{AirModel, Scenario};
use crate::core::formats::qr::{qr_svg, QrSvg};
use crate::core::physics::light::sun::{sun_position, Place, SunPosition};
use crate::core::planning::light::{DaySample, DAY_STEP_S};
use crate::core::words::format::{self, format_number};
use crate::core::words::light::{exposure_time, light_note, light_source, snr_source};
use crate::core::words::notes;
use crate::ui::markup::esc;
use crate::ui::worker;
use js_sys::Array;

/// The worker's loader, unhashed so that the page can name it (trunk's `data-loader-shim`).
const LOADER: &str = "./sharpfield-aside_loader.js";

/// In the worker: answers every request.
pub fn serve() {
    worker::serve(answer);
}

fn answer(request: &Array) -> Array {
    let number = |i: u32| request.get(i).as_f64().unwrap_or(f64::NAN);
    let text = |i: u32| request.get(i).as_string().unwrap_or_default();
    match text(0).as_str() {
        "sun" => {
            let place = Place {
                latitude_deg: number(2),
                longitude_deg: number(3),
                height_m: 0.0,
            };
            match sun_position(number(1), place) {
                Some(p) => Array::of3(&true.into(), &p.elevation_deg.into(), &p.azimuth_deg.into()),
                None => Array::of1(&false.into()),
            }
        }
        "qr" => match qr_svg(&text(1)) {
            Some(qr) => Array::of2(&(qr.size as f64).into(), &qr.path.into()),
            None => Array::new(),
        },
        "light" => Array::of1(&light_html(&text(1)).into()),
        "extras" => Array::of1(&extras_html(&text(1)).into()),
        _ => Array::new(),
    }
}

/// In the page: the sun at `unix_s` from `place`, as SPA places it (`Ok(None)` for a time it
/// cannot take), or why the module could not answer.
pub fn sun(unix_s: f64, place: Place, done: impl FnOnce(Result<Option<SunPosition>, String>) + 'static) {
    let request = [
        "sun".into(),
        unix_s.into(),
        place.latitude_deg.into(),
        place.longitude_deg.into(),
    ];
    worker::ask(LOADER, &request, move |answer| {
        done(answer.map(|a| {
            (a.get(0).as_bool() == Some(true)).then(|| SunPosition {
                elevation_deg: a.get(1).as_f64().unwrap_or(f64::NAN),
                azimuth_deg: a.get(2).as_f64().unwrap_or(f64::NAN),
            })
        }))
    });
}

/// In the page: the QR code of `link` (`None` when it is too long, or the module did not answer).
pub fn qr(link: &str, done: impl FnOnce(Option<QrSvg>) + 'static) {
    worker::ask(LOADER, &["qr".into(), link.into()], move |answer| {
        done(answer.ok().and_then(|a| {
            Some(QrSvg {
                size: a.get(0).as_f64()? as usize,
                path: a.get(1).as_string()?,
                modules: Vec::new(),
            })
        }))
    });
}

/// What the module draws for the light panel.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Drawing {
    /// The light's figures and notes.
    Light,
    /// The day's good hours on a timeline and the best settings.
    Extras,
}

/// In the page: the HTML of part of the light panel for `query`, built in the module so that its
/// drawing code is not in the first load.
pub fn draw(drawing: Drawing, query: &str, done: impl FnOnce(Result<String, String>) + 'static) {
    let kind = match drawing {
        Drawing::Light => "light",
        Drawing::Extras => "extras",
    };
    worker::ask(LOADER, &[kind.into(), query.into()], move |answer| {
        done(answer.map(|a| a.get(0).as_string().unwrap_or_default()))
    });
}

/// A figure tagged with its report field and SI value, as the page tags every figure.
fn figure(key: &str, si: f64, text: &str) -> String {
    figure_word(key, &si.to_string(), text)
}

/// A word (or a number's text) tagged with its report field.
fn figure_word(key: &str, word: &str, text: &str) -> String {
    format!(
        r#"<span class="value" data-key="{key}" data-si="{word}">{}</span>"#,
        esc(text)
    )
}

/// The day on a 24-hour line: the sun's height, the good hours shaded, the time of `when` marked.
fn timeline(day: &DayReport, samples: &[DaySample], scenario: &Scenario) -> String {
    let Some(first) = samples.first() else {
        return String::new();
    };
    let (w, h) = (480.0, 64.0);
    let start = first.unix_s;
    let x = |t: f64| (t - start) / 86_400.0 * w;
    let y = |elevation: f64| h / 2.0 - elevation.clamp(-90.0, 90.0) / 90.0 * (h / 2.0 - 2.0);
    let step = DAY_STEP_S / 86_400.0 * w;
    let mut out = format!(
        r#"<svg class="day-line" viewBox="0 -2 {w} {}" role="img" aria-label="The sun's height over the day; shaded: good hours ({})"><rect class="night" x="0" y="{}" width="{w}" height="{}"></rect>"#,
        h + 16.0,
        esc(&if day.windows.is_empty() {
            "none".to_string()
        } else {
            day.windows.join(", ")
        }),
        h / 2.0,
        h / 2.0
    );
    for s in samples.iter().filter(|s| s.good) {
        out += &format!(
            r#"<rect class="good" x="{:.1}" y="0" width="{step:.1}" height="{h}"></rect>"#,
            x(s.unix_s) - 0.5 * step
        );
    }
    out += &format!(
        r#"<line class="horizon" x1="0" x2="{w}" y1="{0}" y2="{0}"></line><path class="sun-path" d=""#,
        h / 2.0
    );
    for (i, s) in samples.iter().enumerate() {
        out += &format!(
            "{}{:.1} {:.1}",
            if i == 0 { 'M' } else { 'L' },
            x(s.unix_s),
            y(s.elevation_deg)
        );
    }
    out += r#""></path>"#;
    if let Some(now) = scenario.when.and_then(|t| t.unix_s()).map(x) {
        out += &format!(r#"<line class="now" x1="{now:.1}" x2="{now:.1}" y1="0" y2="{h}"></line>"#);
    }
    for hour in [0, 6, 12, 18, 24] {
        let anchor = match hour {
            0 => "start",
            24 => "end",
            _ => "middle",
        };
        out += &format!(
            r#"<text x="{}" y="{}" text-anchor="{anchor}">{hour:02}:00</text>"#,
            f64::from(hour) / 24.0 * w,
            h + 13.0
        );
    }
    out + "</svg>"
}

/// The best settings, why, and a button to apply them (the page listens for its click).
fn best_block(best: &BestReport, scenario: &Scenario) -> String {
    let units = scenario.units;
    let gain = if best.current_resolved_m > 0.0 {
        best.resolved_m / best.current_resolved_m
    } else {
        1.0
    };
    let mut out = format!(
        "<div class=\"best\" id=\"best-settings\"><h3>Best settings under this light</h3><p>f/{}, {}, ISO {} resolve {} ({} of now; {} governs), NIIRS {}.</p>",
        figure("best.f_number", best.f_number, &format::significant(best.f_number)),
        figure("best.exposure_s", best.exposure_s, &exposure_time(best.exposure_s)),
        figure("best.iso", best.iso, &format!("{}", best.iso.round())),
        figure("best.resolved_m", best.resolved_m, &format::length(best.resolved_m, units)),
        esc(&format::percent(gain)),
        esc(&notes::lower_first(notes::limit_title(best.governing))),
        figure("best.niirs", best.niirs, &format!("{:.1}", best.niirs)),
    );
    let mut met = String::new();
    if let Some(reach) = best.reach_m {
        met += &format!(
            " up to a {} of {}",
            notes::axis_noun(scenario.solve_axis()),
            figure("best.reach_m", reach, &format::length(reach, units))
        );
    }
    if let Some(speed) = best.max_speed_mps {
        met += if met.is_empty() {
            " up to a ground speed of "
        } else {
            " and a ground speed of "
        };
        met += &figure("best.max_speed_mps", speed, &format::speed(speed, units));
    }
    if !met.is_empty() {
        out += &format!("<p>With them the need is met{met}.</p>");
    }
    out += "<ul class=\"why\">";
    for why in &best.why {
        out += &format!("<li>One third of a stop {}</li>", esc(why));
    }
    out + &format!(
        "</ul><button type=\"button\" id=\"apply-best\" data-fnum=\"{}\" data-iso=\"{}\">Use these settings (metered exposure)</button></div>",
        format_number((best.f_number * 100.0).round() / 100.0),
        format_number(best.iso.round())
    )
}

/// A labelled line of the light panel's figure list.
fn row(out: &mut String, label: &str, line: &str) {
    *out += &format!("<dt>{}</dt><dd>{line}</dd>", esc(label));
}

/// The light's figures and notes of a query, as the light panel shows them (the same figures as
/// the report's: the same core, the sun by the same SPA).
fn light_html(query: &str) -> String {
    let (scenario, _) = Scenario::from_query(query);
    let light = scenario.light();
    let sensor = scenario.sensor();
    let sig = format::significant;
    let mut out = String::from("<dl class=\"figures\">");
    if let Some(sun) = light.sun {
        row(
            &mut out,
            "Sun",
            &format!(
                "{} high, azimuth {} from north",
                figure(
                    "sun_elevation_deg",
                    sun.elevation_deg,
                    &format!("{}°", sig(sun.elevation_deg))
                ),
                figure(
                    "sun_azimuth_deg",
                    sun.azimuth_deg,
                    &format!("{}°", sig(sun.azimuth_deg))
                )
            ),
        );
    }
    let lux = match light.illuminance_lx {
        Some(lux) => format!(
            "{}, {}",
            figure("illuminance_lx", lux, &format!("{} lx", sig(lux))),
            esc(light_source(light.source))
        ),
        None => "not known: give a date, time and place, or the illuminance".to_string(),
    };
    row(&mut out, "Light on the ground", &lux);
    if let Some(ev) = light.ev100 {
        row(
            &mut out,
            "Exposure value (ISO 100)",
            &figure("ev100", ev, &format!("EV {ev:.1}")),
        );
    }
    row(
        &mut out,
        "Exposure time used",
        &format!(
            "{}{}",
            figure("exposure_s", light.exposure_s, &exposure_time(light.exposure_s)),
            if light.metered { ", metered" } else { ", as typed" }
        ),
    );
    if let Some(signal) = light.signal {
        row(
            &mut out,
            "Electrons, 15 % and 7 % grey",
            &format!(
                "{} and {}, noise {}",
                figure("target_e", signal.target_e, &sig(signal.target_e)),
                figure("background_e", signal.background_e, &sig(signal.background_e)),
                figure("noise_e", signal.noise_e, &sig(signal.noise_e))
            ),
        );
    }
    row(
        &mut out,
        "Contrast SNR",
        &format!(
            "{}, {}",
            figure("snr", light.snr, &sig(light.snr)),
            esc(snr_source(light.snr_source))
        ),
    );
    row(
        &mut out,
        "Sensor",
        &esc(&format!(
            "full well {} e⁻, read noise {} e⁻, base ISO {}",
            sig(sensor.full_well_e),
            sig(sensor.read_noise_e),
            sig(sensor.base_iso)
        )),
    );
    out += "</dl><ul class=\"light-notes\">";
    for note in &light.notes {
        let words = light_note(note);
        out += &format!("<li data-note=\"{}\">{}</li>", words.code, esc(&words.text));
    }
    out + "</ul>"
}

/// The day's good hours and the best settings of a query, as the light panel shows them.
fn extras_html(query: &str) -> String {
    let (scenario, _) = Scenario::from_query(query);
    let extras = Extras::of(&scenario, &scenario.setup(), scenario.solve_axis());
    let mut out = String::new();
    if let Some(day) = &extras.day {
        let at = |t: &Option<String>| t.clone().unwrap_or_else(|| "none".into());
        let hours = if day.windows.is_empty() {
            "No hour of this day has the sun 15° high with the need met.".to_string()
        } else {
            format!(
                "Good hours (sun at least 15° high{}): {}.",
                if scenario.need().is_given() {
                    ", the need met"
                } else {
                    ""
                },
                day.windows.join(", ")
            )
        };
        out += &format!(
            "<h3>When to fly</h3><p>{}</p>{}",
            esc(&format!(
                "Sunrise {}, noon {} ({}° high), sunset {}. {hours}",
                at(&day.sunrise),
                day.noon,
                format::significant(day.noon_elevation_deg),
                at(&day.sunset)
            )),
            timeline(day, &extras.day_samples, &scenario)
        );
        let (suggested, title, why) = if day.air_suggested == AirModel::SlcDay.key() {
            (AirModel::SlcDay, "SLC day", "the sun is up")
        } else {
            (AirModel::SlcNight, "SLC night", "the sun is down")
        };
        let chosen = scenario.air;
        let differs = matches!(chosen, AirModel::SlcDay | AirModel::SlcNight) && chosen != suggested;
        out += &format!(
            "<p class=\"air-hint\">Air turbulence at this hour: the {} profile suits it ({why}){}</p>",
            figure_word("day.air_suggested", day.air_suggested, title),
            if differs {
                "; this scenario uses the other SLC profile, which is yours to keep or change under Air."
            } else {
                "."
            }
        );
    }
    if let Some(best) = &extras.best {
        out += &best_block(best, &scenario);
    }
    out
}
