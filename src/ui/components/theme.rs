//! The high-contrast switch, kept in the browser's storage so that it lasts through a reload.
//! The page's `data-theme` is set in one place, the effect here (through `browser::set_theme`).

use crate::ui::browser;
use yew::prelude::*;

/// Where the high-contrast preference is kept.
const THEME_KEY: &str = "sharpfield.theme";

/// The theme's name, in storage and in the page's `data-theme`.
fn theme_name(contrast: bool) -> &'static str {
    if contrast {
        "contrast"
    } else {
        "default"
    }
}

/// The "High contrast" toggle button (a hook of the header, which draws it).
#[hook]
pub fn use_theme_toggle() -> Html {
    let contrast = use_state(|| browser::storage_get(THEME_KEY).ok().flatten().as_deref() == Some(theme_name(true)));
    use_effect_with(*contrast, |on| browser::set_theme(theme_name(*on)));
    let onclick = {
        let contrast = contrast.clone();
        Callback::from(move |_| {
            let next = !*contrast;
            // A browser that refuses storage still switches: the choice then lasts until the page
            // closes, which is no loss worth a message.
            let _ = browser::storage_set(THEME_KEY, theme_name(next));
            contrast.set(next);
        })
    };
    html! {
        <button type="button" class="toggle" aria-pressed={contrast.to_string()} {onclick}>{ "High contrast" }</button>
    }
}
