//! The contract's `when`: a local date and time with its offset from UTC, ISO 8601 extended form
//! (`2026-06-21T10:30+02:00`; whole seconds optional, `Z` for UTC, a space for the `T`).

use crate::core::physics::light::sun::CivilTime;

/// How the `when` text must look, for error messages.
pub const WHEN_FORMAT: &str = "a local date and time with its UTC offset, such as 2026-06-21T10:30+02:00";

/// Digits of `text` as a number, only if every character is an ASCII digit and there are `len`.
fn digits(text: &str, len: usize) -> Option<u32> {
    (text.len() == len && text.bytes().all(|b| b.is_ascii_digit()))
        .then(|| text.parse().ok())
        .flatten()
}

/// Reads a UTC offset: `Z`, `+HH:MM`, `-HH:MM`, `+HHMM` or `+HH`.
fn offset_minutes(text: &str) -> Option<i32> {
    if text == "Z" || text == "z" {
        return Some(0);
    }
    let sign = match text.as_bytes().first()? {
        b'+' => 1,
        b'-' => -1,
        _ => return None,
    };
    let rest = text.get(1..)?.replace(':', "");
    let (h, m) = match rest.len() {
        2 => (digits(&rest, 2)?, 0),
        4 => (digits(rest.get(..2)?, 2)?, digits(rest.get(2..)?, 2)?),
        _ => return None,
    };
    (h <= 23 && m <= 59).then(|| sign * (h as i32 * 60 + m as i32))
}

/// Parses `when`; `None` unless it is a real date and time with an offset.
pub fn parse_when(text: &str) -> Option<CivilTime> {
    let text = text.trim();
    let (date, rest) = text.split_once(['T', 't', ' '])?;
    let mut date_parts = date.split('-');
    let year = digits(date_parts.next()?, 4)? as i32;
    let month = digits(date_parts.next()?, 2)?;
    let day = digits(date_parts.next()?, 2)?;
    if date_parts.next().is_some() {
        return None;
    }
    let split = rest.find(['Z', 'z', '+', '-'])?;
    let (clock, offset) = rest.split_at(split);
    let mut clock_parts = clock.split(':');
    let hour = digits(clock_parts.next()?, 2)?;
    let minute = digits(clock_parts.next()?, 2)?;
    let second = match clock_parts.next() {
        None => 0.0,
        Some(s) => f64::from(digits(s, 2)?),
    };
    if clock_parts.next().is_some() {
        return None;
    }
    let time = CivilTime {
        year,
        month,
        day,
        hour,
        minute,
        second,
        offset_minutes: offset_minutes(offset)?,
    };
    time.unix_s().map(|_| time)
}

/// Writes `when` as the contract does: `YYYY-MM-DDTHH:MM[:SS]±HH:MM`, seconds only when not zero
/// (so that what [`parse_when`] reads is written back the same).
pub fn write_when(time: &CivilTime) -> String {
    let sign = if time.offset_minutes < 0 { '-' } else { '+' };
    let offset = time.offset_minutes.unsigned_abs();
    // Whole seconds: the reader takes no fractions.
    let second = time.second.clamp(0.0, 60.0).floor() as u32;
    let seconds = if second > 0 {
        format!(":{second:02}")
    } else {
        String::new()
    };
    format!(
        "{:04}-{:02}-{:02}T{:02}:{:02}{seconds}{sign}{:02}:{:02}",
        time.year,
        time.month,
        time.day,
        time.hour,
        time.minute,
        offset / 60,
        offset % 60
    )
}
