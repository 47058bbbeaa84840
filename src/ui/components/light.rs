//! Light and exposure: the inputs (date and time, sky, illuminance, exposure mode, ISO, the
//! sensor's charge and noise) and the panel (the sun, the light, the exposure used, electrons and
//! SNR, the day's good hours on a timeline, and the best settings with a button to apply them).

use super::field::{Choice, NumberField};
use super::inputs::{use_action, InputsProps};
use crate::core::contract::inputs::entry_unit;
use crate::core::contract::plan::{Extras, Plan};
use crate::core::contract::report::{BestReport, DayReport};
use crate::core::planning::light::DaySample;
use crate::core::words::format::{self, format_number};
use crate::core::words::light::{exposure_time, light_source, snr_source};
use crate::core::words::notes;
use crate::ui::browser;
use crate::ui::components::results::value;
use crate::ui::state::{Action, State};
use std::rc::Rc;
use web_sys::HtmlInputElement;
use yew::prelude::*;

/// How long typing must pause before the day and the best settings are worked out (ms): each is
/// some hundreds of evaluations, too many for every keystroke.
const EXTRAS_PAUSE_MS: u32 = 250;

/// A numeric field of the light group.
fn field(props: &InputsProps, key: &'static str, hint: Option<&str>) -> Html {
    let state = &props.state;
    html! {
        <NumberField key_name={key} value={state.text(key)} error={state.error(key).map(AttrValue::from)}
            hint={hint.map(AttrValue::from)} dispatch={props.dispatch.clone()} entry={entry_unit(key, state.plan.scenario.units)} />
    }
}

/// The date and time field: ISO 8601 text, kept as typed, with the device's clock as a start.
#[function_component(WhenField)]
fn when_field(props: &InputsProps) -> Html {
    let error = props.state.error("when");
    let oninput = use_action(&props.dispatch, |e: InputEvent| {
        Action::set("when", e.target_unchecked_into::<HtmlInputElement>().value())
    });
    let on_now = use_action(&props.dispatch, |_: MouseEvent| {
        Action::set("when", browser::now_local_iso())
    });
    html! {
        <div class={classes!("field", error.is_some().then_some("invalid"))}>
            <label for="in-when">{ "Date and time" }<span class="unit">{ " (local, with UTC offset)" }</span></label>
            <input id="in-when" name="when" type="text" autocomplete="off" spellcheck="false" placeholder="2026-06-21T10:30+02:00"
                value={props.state.text("when")} {oninput} aria-invalid={error.is_some().to_string()}
                aria-describedby={error.is_some().then_some("err-when")} />
            <span class="hint">
                <button type="button" id="when-now" onclick={on_now}>{ "Use this device's clock" }</button>
                { " The place is the survey origin (latitude, longitude) below." }
            </span>
            if let Some(error) = error { <span class="error" id="err-when" role="alert">{ error }</span> }
        </div>
    }
}

/// Light: when and where, the sky or a measured illuminance, how the exposure is set, the sensor.
#[function_component(LightGroup)]
pub fn light_group(props: &InputsProps) -> Html {
    let state = &props.state;
    let skies = [
        ("clear", "Clear sky"),
        ("partly", "Partly cloudy"),
        ("overcast", "Overcast"),
    ]
    .map(|(v, l)| (AttrValue::from(v), AttrValue::from(l)))
    .to_vec();
    let sky = match state.text("sky").trim() {
        "partly" => "partly",
        "overcast" => "overcast",
        _ => "clear",
    };
    let on_sky = use_action(&props.dispatch, |word: String| Action::set("sky", word));
    let modes = [
        ("set", "As typed (exposure time above)"),
        ("auto", "Metered by the camera (ISO 2720)"),
    ]
    .map(|(v, l)| (AttrValue::from(v), AttrValue::from(l)))
    .to_vec();
    let mode = if state.text("expmode").trim() == "auto" {
        "auto"
    } else {
        "set"
    };
    let on_mode = use_action(&props.dispatch, |word: String| Action::set("expmode", word));
    html! {
        <fieldset class="group" id="group-light">
            <legend>{ "Light and exposure" }</legend>
            <WhenField state={state.clone()} dispatch={props.dispatch.clone()} />
            <Choice id="sky" label="Sky" options={skies} selected={sky} on_change={on_sky} />
            { field(props, "lux", Some("measured, instead of the sun's (leave empty)")) }
            <Choice id="expmode" label="Exposure time" options={modes} selected={mode} on_change={on_mode} />
            <div class="pair">{ field(props, "iso", None) }{ field(props, "refl", Some("0.18 for an average scene")) }</div>
            { field(props, "fmin", Some("for the best settings; the f-number above if empty")) }
            <details class="sensor">
                <summary>{ "Sensor charge and noise" }</summary>
                <p class="hint">{ "Generic figures for the pixel size are used when these are empty (from memory; a maker's sheet is better)." }</p>
                <div class="pair">{ field(props, "fw", None) }{ field(props, "rn", None) }</div>
                { field(props, "baseiso", None) }
            </details>
        </fieldset>
    }
}

/// Properties of the light panel.
#[derive(Properties, PartialEq, Clone)]
pub struct LightProps {
    pub state: Rc<State>,
    pub dispatch: Callback<Action>,
}

/// The day and the best settings of a plan, worked out once typing pauses (only when there is
/// light to work with: a time and place, or a typed illuminance).
#[hook]
fn use_extras(plan: &Rc<Plan>) -> Option<(Rc<Plan>, Rc<Extras>)> {
    let extras = use_state(|| None::<(Rc<Plan>, Rc<Extras>)>);
    {
        let extras = extras.clone();
        use_effect_with(plan.clone(), move |plan| {
            let fresh = extras.as_ref().is_some_and(|(p, _)| Rc::ptr_eq(p, plan));
            let lit = plan.scenario.when.is_some() || plan.report.illuminance_lx.is_some();
            let timer = (!fresh && lit).then(|| {
                let (extras, plan) = (extras.clone(), plan.clone());
                gloo::timers::callback::Timeout::new(EXTRAS_PAUSE_MS, move || {
                    let worked = Rc::new(plan.extras());
                    extras.set(Some((plan, worked)));
                })
            });
            move || drop(timer)
        });
    }
    (*extras).clone()
}

/// The day on a 24-hour line: the sun's height, the good hours shaded, the time of `when` marked.
fn timeline(day: &DayReport, samples: &[DaySample], plan: &Plan) -> Html {
    if samples.is_empty() {
        return html! {};
    }
    let (w, h) = (480.0, 64.0);
    let start = samples.first().map_or(0.0, |s| s.unix_s);
    let x = |t: f64| (t - start) / 86_400.0 * w;
    let y = |elevation: f64| h / 2.0 - elevation.clamp(-90.0, 90.0) / 90.0 * (h / 2.0 - 2.0);
    let mut curve = String::new();
    for (i, s) in samples.iter().enumerate() {
        curve.push_str(&format!(
            "{}{:.1} {:.1}",
            if i == 0 { 'M' } else { 'L' },
            x(s.unix_s),
            y(s.elevation_deg)
        ));
    }
    let spans: Vec<(f64, f64)> = samples
        .iter()
        .filter(|s| s.good)
        .map(|s| (x(s.unix_s) - 0.5 * (1200.0 / 86_400.0 * w), 1200.0 / 86_400.0 * w))
        .collect();
    let now = plan.scenario.when.and_then(|t| t.unix_s()).map(x);
    let hours = [0, 6, 12, 18, 24];
    html! {
        <svg class="day-line" viewBox={format!("0 -2 {w} {}", h + 16.0)} role="img"
            aria-label={format!("The sun's height over the day; shaded: good hours ({})", if day.windows.is_empty() { "none".to_string() } else { day.windows.join(", ") })}>
            <rect class="night" x="0" y={(h / 2.0).to_string()} width={w.to_string()} height={(h / 2.0).to_string()} />
            { for spans.iter().map(|(from, width)| html! { <rect class="good" x={format!("{from:.1}")} y="0" width={format!("{width:.1}")} height={h.to_string()} /> }) }
            <line class="horizon" x1="0" x2={w.to_string()} y1={(h / 2.0).to_string()} y2={(h / 2.0).to_string()} />
            <path class="sun-path" d={curve} />
            if let Some(now) = now { <line class="now" x1={format!("{now:.1}")} x2={format!("{now:.1}")} y1="0" y2={h.to_string()} /> }
            { for hours.iter().map(|hour| html! {
                <text x={(f64::from(*hour) / 24.0 * w).to_string()} y={(h + 13.0).to_string()}
                    text-anchor={match hour { 0 => "start", 24 => "end", _ => "middle" }}>{ format!("{hour:02}:00") }</text>
            }) }
        </svg>
    }
}

/// A piece of a figure's line: words, or a figure tagged with its report field and SI value.
enum Part {
    Text(String),
    Figure(&'static str, f64, String),
}

fn text(t: impl Into<String>) -> Part {
    Part::Text(t.into())
}

/// A line of parts (one `html!` for every line of the panel keeps the page's code small).
fn line(parts: Vec<Part>) -> Html {
    html! {
        { for parts.into_iter().map(|p| match p {
            Part::Text(t) => html! { { t } },
            Part::Figure(key, si, t) => value(key, si, t),
        }) }
    }
}

/// Labelled figure lines as a definition list.
fn figure_list(rows: Vec<(&'static str, Vec<Part>)>) -> Html {
    html! {
        <dl class="figures">
            { for rows.into_iter().map(|(label, parts)| html! { <><dt>{ label }</dt><dd>{ line(parts) }</dd></> }) }
        </dl>
    }
}

/// The plan's light figures, as lines.
fn light_rows(r: &crate::core::contract::report::Report) -> Vec<(&'static str, Vec<Part>)> {
    let sig = format::significant;
    let mut rows = Vec::new();
    if let (Some(elevation), Some(azimuth)) = (r.sun_elevation_deg, r.sun_azimuth_deg) {
        rows.push((
            "Sun",
            vec![
                Part::Figure("sun_elevation_deg", elevation, format!("{}°", sig(elevation))),
                text(" high, azimuth "),
                Part::Figure("sun_azimuth_deg", azimuth, format!("{}°", sig(azimuth))),
                text(" from north"),
            ],
        ));
    }
    rows.push((
        "Light on the ground",
        match r.illuminance_lx {
            Some(lux) => vec![
                Part::Figure("illuminance_lx", lux, format!("{} lx", sig(lux))),
                text(format!(", {}", light_source(r.light_source))),
            ],
            None => vec![text("not known: give a date, time and place, or the illuminance")],
        },
    ));
    if let Some(ev) = r.ev100 {
        rows.push((
            "Exposure value (ISO 100)",
            vec![Part::Figure("ev100", ev, format!("EV {ev:.1}"))],
        ));
    }
    rows.push((
        "Exposure time used",
        vec![
            Part::Figure("exposure_s", r.exposure_s, exposure_time(r.exposure_s)),
            text(if r.metered { ", metered" } else { ", as typed" }),
        ],
    ));
    if let (Some(target), Some(background), Some(noise)) = (r.target_e, r.background_e, r.noise_e) {
        rows.push((
            "Electrons, 15 % and 7 % grey",
            vec![
                Part::Figure("target_e", target, sig(target)),
                text(" and "),
                Part::Figure("background_e", background, sig(background)),
                text(", noise "),
                Part::Figure("noise_e", noise, sig(noise)),
            ],
        ));
    }
    rows.push((
        "Contrast SNR",
        vec![
            Part::Figure("snr", r.snr, sig(r.snr)),
            text(format!(", {}", snr_source(r.snr_source))),
        ],
    ));
    rows.push((
        "Sensor",
        vec![text(format!(
            "full well {} e⁻, read noise {} e⁻, base ISO {}",
            sig(r.full_well_e),
            sig(r.read_noise_e),
            sig(r.base_iso)
        ))],
    ));
    rows
}

/// The best settings, why, and a button to apply them.
fn best_block(best: &BestReport, plan: &Plan, dispatch: &Callback<Action>) -> Html {
    let units = plan.scenario.units;
    let sig = format::significant;
    let apply = {
        let dispatch = dispatch.clone();
        let (f_number, iso) = (best.f_number, best.iso);
        Callback::from(move |_: MouseEvent| {
            dispatch.emit(Action::Set(vec![
                ("fnum".into(), format_number((f_number * 100.0).round() / 100.0)),
                ("iso".into(), format_number(iso.round())),
                ("expmode".into(), "auto".into()),
            ]))
        })
    };
    let gain = if best.current_resolved_m > 0.0 {
        best.resolved_m / best.current_resolved_m
    } else {
        1.0
    };
    let settings = vec![
        text("f/"),
        Part::Figure("best.f_number", best.f_number, sig(best.f_number)),
        text(", "),
        Part::Figure("best.exposure_s", best.exposure_s, exposure_time(best.exposure_s)),
        text(", ISO "),
        Part::Figure("best.iso", best.iso, format!("{}", best.iso.round())),
        text(" resolve "),
        Part::Figure(
            "best.resolved_m",
            best.resolved_m,
            format::length(best.resolved_m, units),
        ),
        text(format!(
            " ({} of now; {} governs), NIIRS ",
            format::percent(gain),
            notes::lower_first(notes::limit_title(best.governing))
        )),
        Part::Figure("best.niirs", best.niirs, format!("{:.1}", best.niirs)),
        text("."),
    ];
    let mut met = Vec::new();
    if let Some(reach) = best.reach_m {
        met.push(text(format!(" up to a {} of ", notes::axis_noun(plan.sweep.axis))));
        met.push(Part::Figure("best.reach_m", reach, format::length(reach, units)));
    }
    if let Some(speed) = best.max_speed_mps {
        met.push(text(if met.is_empty() {
            " up to a ground speed of "
        } else {
            " and a ground speed of "
        }));
        met.push(Part::Figure("best.max_speed_mps", speed, format::speed(speed, units)));
    }
    html! {
        <div class="best" id="best-settings">
            <h3>{ "Best settings under this light" }</h3>
            <p>{ line(settings) }</p>
            if !met.is_empty() { <p>{ "With them the need is met" }{ line(met) }{ "." }</p> }
            <ul class="why">{ for best.why.iter().map(|w| html! { <li>{ format!("One third of a stop {w}") }</li> }) }</ul>
            <button type="button" id="apply-best" onclick={apply}>{ "Use these settings (metered exposure)" }</button>
        </div>
    }
}

/// The light panel.
#[function_component(LightPanel)]
pub fn light_panel(props: &LightProps) -> Html {
    let plan = &props.state.plan;
    let r = &plan.report;
    let extras = use_extras(plan);
    let lit = plan.scenario.when.is_some() || r.illuminance_lx.is_some();
    let extras_html = match (&extras, lit) {
        (Some((extras_plan, extras)), true) => {
            let settled = Rc::ptr_eq(extras_plan, plan);
            let day = extras.day.as_ref().map(|day| {
                let at = |t: &Option<String>| t.clone().unwrap_or_else(|| "none".into());
                let hours = if day.windows.is_empty() {
                    "No hour of this day has the sun 15° high with the need met.".to_string()
                } else {
                    format!(
                        "Good hours (sun at least 15° high{}): {}.",
                        if extras_plan.scenario.need().is_given() { ", the need met" } else { "" },
                        day.windows.join(", ")
                    )
                };
                html! {
                    <>
                        <h3>{ "When to fly" }</h3>
                        <p>{ format!("Sunrise {}, noon {} ({}° high), sunset {}. {hours}", at(&day.sunrise), day.noon, format::significant(day.noon_elevation_deg), at(&day.sunset)) }</p>
                        { timeline(day, &extras.day_samples, extras_plan) }
                    </>
                }
            });
            let best = extras
                .best
                .as_ref()
                .map(|b| best_block(b, extras_plan, &props.dispatch));
            html! {
                <div class={classes!("extras", (!settled).then_some("stale"))} data-settled={settled.to_string()}>
                    { day.unwrap_or_default() }{ best.unwrap_or_default() }
                </div>
            }
        }
        _ => Html::default(),
    };
    html! {
        <section class="panel" id="light" aria-labelledby="light-title">
            <h2 id="light-title">{ "Light and exposure" }</h2>
            { figure_list(light_rows(r)) }
            <ul class="light-notes">{ for r.light_notes.iter().map(|n| html! { <li data-note={n.code}>{ n.text.clone() }</li> }) }</ul>
            { extras_html }
            <p class="note">{ "Daylight from the IES sky model; sensor figures generic unless typed. Low sun, glare and twilight are shown as information only." }</p>
        </section>
    }
}
