//! HTML written as text, for parts drawn as a string rather than as yew elements: the second
//! module's drawings (`ui::aside`) and the printed sheet's text (`components::print`). A yew
//! `html!` element costs much more code than the same element written as text.

use yew::{AttrValue, Html};

/// Appends `text` to `out`, made safe for HTML; a carriage return is written as a character
/// reference so that parsing keeps it (the parser would read it as a line feed).
pub fn push_esc(out: &mut String, text: &str) {
    for c in text.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\r' => out.push_str("&#13;"),
            _ => out.push(c),
        }
    }
}

/// Text made safe for HTML.
pub fn esc(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    push_esc(&mut out, text);
    out
}

/// HTML built as text: markup as written, text escaped.
#[derive(Default)]
pub struct Markup(String);

impl Markup {
    /// Appends markup as written (the caller's own tags, never text from elsewhere).
    pub fn tag(&mut self, markup: &str) -> &mut Self {
        self.0.push_str(markup);
        self
    }

    /// Appends text, escaped.
    pub fn text(&mut self, text: &str) -> &mut Self {
        push_esc(&mut self.0, text);
        self
    }

    /// Appends a figure tagged with its report field and SI value, as the page tags every figure
    /// (`results::value` for yew elements).
    pub fn figure(&mut self, key: &str, si: f64, text: &str) -> &mut Self {
        self.tag(&format!(r#"<span class="value" data-key="{key}" data-si="{si}">"#))
            .text(text)
            .tag("</span>")
    }

    /// The markup as text.
    pub fn into_string(self) -> String {
        self.0
    }

    /// The markup as yew nodes.
    pub fn html(self) -> Html {
        Html::from_html_unchecked(AttrValue::from(self.0))
    }
}
