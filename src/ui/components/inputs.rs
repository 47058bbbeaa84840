//! The input groups, in the order the trade thinks: camera, lens, band, geometry, air, motion,
//! what is needed, and the survey area.

use super::field::{Choice, NumberField};
use crate::core::contract::inputs::entry_unit;
use crate::core::presets::cameras::{BANDS, SENSOR_FORMATS};
use crate::core::words::format;
use crate::core::words::format::format_number;
use crate::core::words::units::Units;
use crate::ui::browser;
use crate::ui::markup::Markup;
use crate::ui::state::{Action, State};
use std::rc::Rc;
use yew::prelude::*;

/// Properties shared by the input groups.
#[derive(Properties, PartialEq, Clone)]
pub struct InputsProps {
    pub state: Rc<State>,
    pub dispatch: Callback<Action>,
}

/// A numeric field for `key`, with an optional hint.
fn field(props: &InputsProps, key: &'static str, hint: Option<String>) -> Html {
    let entry = entry_unit(key, props.state.plan.scenario.units);
    html! {
        <NumberField key_name={key} value={props.state.text(key)}
            error={props.state.error(key).map(AttrValue::from)}
            hint={hint.map(AttrValue::from)} dispatch={props.dispatch.clone()} {entry} />
    }
}

/// A callback that dispatches `to_action(value)`: the same callback on every render while the
/// app's dispatch stays the same, so the select it is given is drawn again only when its options
/// or its choice change. `to_action` is fixed at each call site (hooks are called in order).
#[hook]
pub fn use_action<T: 'static>(dispatch: &Callback<Action>, to_action: fn(T) -> Action) -> Callback<T> {
    use_callback(dispatch.clone(), move |value: T, dispatch| {
        dispatch.emit(to_action(value))
    })
}

/// `x` rounded to `decimals` decimal places (a position to 6 places is about 0.1 m).
fn round_to(x: f64, decimals: i32) -> f64 {
    let scale = 10f64.powi(decimals);
    (x * scale).round() / scale
}

/// Two fields side by side.
fn pair(first: Html, second: Html) -> Html {
    html! { <div class="pair">{ first }{ second }</div> }
}

/// The value of a length key in metres, under its field when it is typed in feet or inches.
fn length_hint(props: &InputsProps, key: &str) -> Option<String> {
    if props.state.plan.scenario.units != Units::Imperial || props.state.error(key).is_some() {
        return None;
    }
    let metres: f64 = props.state.text(key).trim().parse().ok()?;
    Some(format!("= {}", format::length(metres, Units::Metric)))
}

/// Options for a select from (value, label) pairs.
fn options(items: impl IntoIterator<Item = (String, String)>) -> Vec<(AttrValue, AttrValue)> {
    items
        .into_iter()
        .map(|(v, l)| (AttrValue::from(v), AttrValue::from(l)))
        .collect()
}

/// Whether the raw text of `key` reads as `value`.
fn reads_as(state: &State, key: &str, value: f64) -> bool {
    state
        .text(key)
        .trim()
        .parse::<f64>()
        .map(|v| (v - value).abs() <= 1e-9 * value.abs().max(1e-30))
        .unwrap_or(false)
}

/// Asks the device for its position; `place` turns it into the change to make and the words for
/// `said`, where a refusal is said too (or, when the browser cannot tell, what to type instead).
fn ask_position(
    dispatch: &Callback<Action>,
    said: &UseStateHandle<Option<String>>,
    instead: &str,
    place: Box<dyn Fn(f64, f64) -> (Action, String)>,
) {
    let (dispatch, report) = (dispatch.clone(), said.clone());
    let asked = browser::current_position(move |result| match result {
        Ok((lat, lon)) => {
            let (action, words) = place(lat, lon);
            dispatch.emit(action);
            report.set(Some(words));
        }
        Err(message) => report.set(Some(message)),
    });
    if !asked {
        said.set(Some(format!(
            "This browser cannot tell the device's position; type {instead} instead."
        )));
    }
}

/// Camera: a generic sensor format or custom sensor size and pixel count.
/// (A hook the form calls: a component of its own costs more code than the redraw it saves.)
#[hook]
pub fn use_camera_group(props: &InputsProps) -> Html {
    let state = &props.state;
    let selected = SENSOR_FORMATS
        .iter()
        .find(|f| {
            reads_as(state, "sw", f.width_mm)
                && reads_as(state, "sh", f.height_mm)
                && reads_as(state, "cols", f64::from(f.cols))
                && reads_as(state, "rows", f64::from(f.rows))
        })
        .map(|f| f.id)
        .unwrap_or("custom");
    let on_change = use_action(&props.dispatch, |id: String| {
        match SENSOR_FORMATS.iter().find(|f| f.id == id) {
            Some(f) => Action::Set(vec![
                ("sw".into(), format_number(f.width_mm)),
                ("sh".into(), format_number(f.height_mm)),
                ("cols".into(), f.cols.to_string()),
                ("rows".into(), f.rows.to_string()),
            ]),
            None => Action::Set(Vec::new()),
        }
    });
    let mut items: Vec<(String, String)> = SENSOR_FORMATS
        .iter()
        .map(|f| (f.id.to_string(), f.label.to_string()))
        .collect();
    items.push(("custom".into(), "Custom sensor".into()));
    let pitch_um = state.plan.report.pitch_m * 1e6;
    html! {
        <fieldset class="group" id="group-camera">
            <legend>{ "Camera" }</legend>
            <Choice id="camera-preset" label="Sensor format" options={options(items)} selected={selected} {on_change} />
            { pair(field(props, "sw", None), field(props, "sh", None)) }
            { pair(field(props, "cols", None), field(props, "rows", None)) }
            { field(props, "fill", Some("1 = the whole pixel collects light".to_string())) }
            <p class="derived">{ "Pixel pitch " }<span data-key="pitch_m" data-si={state.plan.report.pitch_m.to_string()}>{ format!("{} µm", format::significant(pitch_um)) }</span></p>
        </fieldset>
    }
}

/// Lens: focal length, f-number, and how far from perfect it is (drawn by the form: it has no
/// state of its own, and the form draws it anew on every change anyway).
pub fn lens_group(props: &InputsProps) -> Html {
    let aperture = props.state.plan.report.aperture_m;
    html! {
        <fieldset class="group" id="group-lens">
            <legend>{ "Lens" }</legend>
            { pair(field(props, "focal", None), field(props, "fnum", None)) }
            { pair(field(props, "obsc", Some("0 for an ordinary lens".to_string())), field(props, "wfe", Some("0 for a perfect lens".to_string()))) }
            <p class="derived">{ "Aperture diameter " }<span data-key="aperture_m" data-si={aperture.to_string()}>{ format!("{} mm", format::significant(aperture * 1000.0)) }</span></p>
        </fieldset>
    }
}

/// Band: a named band or a wavelength.
/// (A hook the form calls: a component of its own costs more code than the redraw it saves.)
#[hook]
pub fn use_band_group(props: &InputsProps) -> Html {
    let state = &props.state;
    let selected = BANDS
        .iter()
        .find(|b| reads_as(state, "wl", b.wavelength_nm))
        .map(|b| b.id)
        .unwrap_or("custom");
    let on_change = use_action(&props.dispatch, |id: String| match BANDS.iter().find(|b| b.id == id) {
        Some(b) => Action::set("wl", format_number(b.wavelength_nm)),
        None => Action::Set(Vec::new()),
    });
    let mut items: Vec<(String, String)> = BANDS.iter().map(|b| (b.id.to_string(), b.label.to_string())).collect();
    items.push(("custom".into(), "Other wavelength".into()));
    html! {
        <fieldset class="group" id="group-band">
            <legend>{ "Band" }</legend>
            <Choice id="band-preset" label="Band" options={options(items)} selected={selected} {on_change} />
            { field(props, "wl", None) }
            { field(props, "snr", Some("50 for a well-lit scene (assumed)".to_string())) }
        </fieldset>
    }
}

/// Geometry: height, and straight down, tilted, or a target at a ground distance.
/// (A hook the form calls: a component of its own costs more code than the redraw it saves.)
#[hook]
pub fn use_geometry_group(props: &InputsProps) -> Html {
    let state = &props.state;
    let mode = if state.raw.get("tilt").is_some() {
        "tilt"
    } else if state.raw.get("gd").map(|g| g.trim() != "0").unwrap_or(false) {
        "gd"
    } else {
        "down"
    };
    let on_change = use_action(&props.dispatch, |mode: String| match mode.as_str() {
        "tilt" => Action::SetAndRemove(vec![("tilt".into(), "30".into())], vec!["gd".into()]),
        "gd" => Action::SetAndRemove(vec![("gd".into(), "500".into())], vec!["tilt".into()]),
        _ => Action::SetAndRemove(vec![("gd".into(), "0".into())], vec!["tilt".into()]),
    });
    let items = vec![
        ("down".to_string(), "Looking straight down".to_string()),
        ("tilt".to_string(), "Tilted from straight down".to_string()),
        (
            "gd".to_string(),
            "Target at a ground distance (mast, vehicle)".to_string(),
        ),
    ];
    let report = &state.plan.report;
    let units = state.plan.scenario.units;
    // The derived figures, written as text (ui::markup).
    let mut derived = Markup::default();
    derived
        .text("Slant range ")
        .tag(&format!(
            r#"<span data-key="slant_range_m" data-si="{}">"#,
            report.slant_range_m
        ))
        .text(&format::length(report.slant_range_m, units))
        .tag(&format!(
            r#"</span>, look angle <span data-key="look_angle_deg" data-si="{}">"#,
            report.look_angle_deg
        ))
        .text(&format!("{}°", format::significant(report.look_angle_deg)))
        .tag("</span>");
    if let (Some(horizon), true) = (report.horizon_m, mode != "down") {
        derived
            .tag(&format!(r#", horizon <span data-key="horizon_m" data-si="{horizon}">"#))
            .text(&format::length(horizon, units))
            .tag("</span>");
        if !report.visible {
            derived.tag(r#"<strong data-key="visible" data-si="false">: the target is below it, not in view</strong>"#);
        }
    }
    html! {
        <fieldset class="group" id="group-geometry">
            <legend>{ "Geometry" }</legend>
            { field(props, "h", length_hint(props, "h")) }
            <Choice id="geometry-mode" label="View" options={options(items)} selected={mode} {on_change} />
            if mode == "tilt" { { field(props, "tilt", None) } }
            if mode == "gd" { { field(props, "gd", length_hint(props, "gd")) } }
            { field(props, "tht", Some("a roof, a mast, a person's head; 0 for the ground".to_string())) }
            if mode != "down" { { field(props, "refk", Some("bends the view over the Earth: 4/3 for standard air, 1 for none".to_string())) } }
            <p class="derived">{ derived.html() }</p>
        </fieldset>
    }
}

/// The air presets in plain words: (id, label, air, cn2, cexp).
const AIR_PRESETS: &[(&str, &str, &str, &str, &str)] = &[
    ("none", "Leave turbulence out", "none", "", ""),
    (
        "calm",
        "Calm night or overcast: weak turbulence",
        "power",
        "1e-15",
        "-0.667",
    ),
    ("mild", "Mild day: moderate turbulence", "power", "1e-14", "-1.333"),
    ("sunny", "Sunny day: strong turbulence", "power", "1e-13", "-1.333"),
    (
        "hot",
        "Sunny day over hot ground (tarmac, sand, roofs)",
        "power",
        "1e-12",
        "-1.333",
    ),
    ("measured", "Measured Cn² near the ground (enter it)", "power", "", ""),
    ("hv57", "Standard model: Hufnagel–Valley 5/7", "hv57", "", ""),
    ("slc-day", "Standard model: SLC day", "slc-day", "", ""),
    ("slc-night", "Standard model: SLC night", "slc-night", "", ""),
];

/// Air: the turbulence along the path.
/// (A hook the form calls: a component of its own costs more code than the redraw it saves.)
#[hook]
pub fn use_air_group(props: &InputsProps) -> Html {
    let state = &props.state;
    let air = state.text("air");
    let air = if air.is_empty() { "none".to_string() } else { air };
    let selected = AIR_PRESETS
        .iter()
        .find(|(_, _, a, cn2, cexp)| {
            *a == air
                && (cn2.is_empty()
                    || (reads_as(state, "cn2", cn2.parse().unwrap_or(0.0))
                        && reads_as(state, "cexp", cexp.parse().unwrap_or(0.0))))
                && !(*a == "power" && cn2.is_empty())
        })
        .map(|p| p.0)
        .unwrap_or(if air == "power" { "measured" } else { "none" });
    let on_change = use_action(&props.dispatch, |id: String| {
        let Some((_, _, air, cn2, cexp)) = AIR_PRESETS.iter().find(|p| p.0 == id) else {
            return Action::Set(Vec::new());
        };
        let mut pairs = vec![("air".to_string(), air.to_string())];
        if !cn2.is_empty() {
            pairs.push(("cn2".into(), cn2.to_string()));
            pairs.push(("cexp".into(), cexp.to_string()));
        }
        Action::Set(pairs)
    });
    let items = AIR_PRESETS.iter().map(|p| (p.0.to_string(), p.1.to_string()));
    let r0 = state.plan.report.r0_m;
    html! {
        <fieldset class="group" id="group-air">
            <legend>{ "Air" }</legend>
            <Choice id="air-preset" label="Turbulence" options={options(items)} selected={selected} {on_change} />
            if air == "power" {
                { pair(field(props, "cn2", None), field(props, "cexp", Some("−4/3 sunny day, −2/3 night".to_string()))) }
            }
            <p class="derived">{ "Fried parameter r0 of the path " }
                <span data-key="r0_m" data-si={r0.map(|r| r.to_string()).unwrap_or_default()}>
                    { r0.map(|r| format::length(r, state.plan.scenario.units)).unwrap_or_else(|| "none (no turbulence)".to_string()) }
                </span>
            </p>
        </fieldset>
    }
}

/// Motion: ground speed, exposure time, turning, the target's speed and jitter (drawn by the form,
/// as the lens group is).
pub fn motion_group(props: &InputsProps) -> Html {
    let speed_hint = props
        .state
        .text("speed")
        .trim()
        .parse::<f64>()
        .ok()
        .filter(|_| props.state.error("speed").is_none())
        .map(|v| format!("= {}", format::speed(v, Units::Metric)));
    html! {
        <fieldset class="group" id="group-motion">
            <legend>{ "Motion" }</legend>
            { pair(field(props, "speed", speed_hint), field(props, "shutter", Some("1/1000 is accepted".to_string()))) }
            { pair(field(props, "rate", Some("gimbal slew, mast sway".to_string())), field(props, "tspeed", None)) }
            { field(props, "jitter", Some("vibration of the camera mount".to_string())) }
        </fieldset>
    }
}

/// Typical targets and their critical dimensions, from the range-performance literature as recalled
/// in resolution-model §6 (from memory: check before relying on them).
const TARGET_PRESETS: &[(&str, &str, &str)] = &[
    ("person", "A person (0.75 m)", "0.75"),
    ("car", "A passenger car (2.3 m)", "2.3"),
];

/// What is needed: a resolution on the ground, and a target to judge.
/// (A hook the form calls: a component of its own costs more code than the redraw it saves.)
#[hook]
pub fn use_need_group(props: &InputsProps) -> Html {
    let state = &props.state;
    let selected = TARGET_PRESETS
        .iter()
        .find(|(_, _, v)| reads_as(state, "tdim", v.parse().unwrap_or(0.0)))
        .map(|p| p.0)
        .unwrap_or("custom");
    let on_change = use_action(&props.dispatch, |id: String| {
        match TARGET_PRESETS.iter().find(|p| p.0 == id) {
            Some((_, _, v)) => Action::set("tdim", *v),
            None => Action::Set(Vec::new()),
        }
    });
    let mut items: Vec<(String, String)> = TARGET_PRESETS
        .iter()
        .map(|p| (p.0.to_string(), p.1.to_string()))
        .collect();
    items.push(("custom".into(), "Another target (enter its size)".into()));
    let models = [
        ("2d", "√(visible area), 2-D criteria"),
        ("1d", "Smaller dimension, Johnson 1-D"),
    ]
    .map(|(v, l)| (v.to_string(), l.to_string()));
    let on_model = use_action(&props.dispatch, |word: String| Action::set("cdm", word));
    let plane = match state.text("tplane").trim() {
        "ground" => "ground",
        "upright" => "upright",
        _ => "auto",
    };
    let planes = [
        ("auto", "Follow the view (ground from the air, upright across)"),
        ("ground", "On the ground (cracks, seedlings, markings)"),
        ("upright", "Upright, facing the camera (people, vehicles, posts)"),
    ]
    .map(|(v, l)| (v.to_string(), l.to_string()));
    let on_plane = use_action(&props.dispatch, |word: String| match word.as_str() {
        "ground" | "upright" => Action::set("tplane", word),
        _ => Action::Remove("tplane".into()),
    });
    html! {
        <fieldset class="group" id="group-need">
            <legend>{ "What you need to see" }</legend>
            { pair(field(props, "need", length_hint(props, "need")), field(props, "needgsd", length_hint(props, "needgsd"))) }
            <Choice id="target-plane" label="On the target's plane" options={options(planes)} selected={plane} on_change={on_plane} />
            <Choice id="target-preset" label="Target" options={options(items)} selected={selected} {on_change} />
            { field(props, "tdim", length_hint(props, "tdim")) }
            <Choice id="target-cdm" label="Critical dimension taken as" options={options(models)} selected={if state.text("cdm").trim() == "1d" { "1d" } else { "2d" }} on_change={on_model} />
        </fieldset>
    }
}

/// The survey area and the aircraft's limits.
#[function_component(SurveyGroup)]
pub fn survey_group(props: &InputsProps) -> Html {
    let locating = use_state(|| Option::<String>::None);
    let on_locate = {
        let (dispatch, said) = (props.dispatch.clone(), locating.clone());
        Callback::from(move |_| {
            said.set(Some("Asking this device for its position…".to_string()));
            let place = |lat: f64, lon: f64| {
                let action = Action::Set(vec![
                    ("lat".into(), format_number(round_to(lat, 6))),
                    ("lon".into(), format_number(round_to(lon, 6))),
                ]);
                (action, "Origin set to this device's position.".to_string())
            };
            ask_position(&dispatch, &said, "the origin", Box::new(place));
        })
    };
    // The device's position as the next corner of the boundary (a start for typing the corners
    // while walking the field).
    let on_corner = {
        // The boundary's text when the position arrives, not when the button was drawn: a click
        // before the group is drawn again, or typing while the device answers, must not be lost.
        let latest = use_mut_ref(String::new);
        *latest.borrow_mut() = props.state.text("field").to_string();
        let (dispatch, said) = (props.dispatch.clone(), locating.clone());
        Callback::from(move |_| {
            let latest = latest.clone();
            let place = move |lat: f64, lon: f64| {
                let field = latest.borrow().clone();
                let corner = format!(
                    "{} {}",
                    format_number(round_to(lon, 6)),
                    format_number(round_to(lat, 6))
                );
                let joined = if field.trim().is_empty() {
                    corner.clone()
                } else {
                    format!("{}, {corner}", field.trim_end())
                };
                (
                    Action::set("field", joined),
                    format!("Corner {corner} added to the boundary."),
                )
            };
            ask_position(&dispatch, &said, "the corners", Box::new(place));
        })
    };
    // A boundary file, read by its module into the boundary field; what it says is shown where
    // the device's position is (one status line for the group).
    let reader = use_mut_ref(|| None::<gloo::file::callbacks::FileReader>);
    let on_import = {
        let (dispatch, said) = (props.dispatch.clone(), locating.clone());
        Callback::from(move |e: Event| {
            let input: web_sys::HtmlInputElement = e.target_unchecked_into();
            let (dispatch, said) = (dispatch.clone(), said.clone());
            let task = browser::read_chosen_file(
                &input,
                Box::new(move |name, text| {
                    let text = text.unwrap_or_default();
                    crate::ui::field::read(&name.clone(), &text, move |read| match read {
                        Ok(field) => {
                            said.set(Some(format!("Read {name}.")));
                            dispatch.emit(Action::set("field", field));
                        }
                        Err(problem) => said.set(Some(format!("{name}: {problem}"))),
                    });
                }),
            );
            if task.is_some() {
                *reader.borrow_mut() = task;
            }
        })
    };
    html! {
        <fieldset class="group" id="group-survey">
            <legend>{ "Survey area and aircraft" }</legend>
            { pair(field(props, "aw", length_hint(props, "aw")), field(props, "al", length_hint(props, "al"))) }
            { pair(field(props, "fo", None), field(props, "so", None)) }
            { pair(field(props, "trig", None), field(props, "blur", None)) }
            { pair(field(props, "endur", None), field(props, "turn", None)) }
            { field(props, "mb", None) }
            { pair(field(props, "lat", None), field(props, "lon", None)) }
            <p class="locate">
                <button type="button" id="locate" onclick={on_locate}>{ "Use this device's position" }</button>
                if let Some(message) = &*locating { <span class="note" role="status" id="survey-status">{ format!(" {message}") }</span> }
            </p>
            { field(props, "hdg", None) }
            { field(props, "field", Some("lon lat points, commas between; ';' before a hole".to_string())) }
            <p class="locate">
                <label class="file-label" for="import-boundary">{ "Import a boundary (GeoJSON, KML)" }</label>
                <input id="import-boundary" type="file" accept=".geojson,.json,.kml" onchange={on_import} />
                <button type="button" id="add-corner" onclick={on_corner}>{ "Add this device's position as a corner" }</button>
            </p>
            { field(props, "relief", Some("lowest,highest, e.g. -5,25; the height is then above take-off".to_string())) }
            { pair(field(props, "wind", None), field(props, "wdir", None)) }
        </fieldset>
    }
}
