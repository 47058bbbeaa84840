//! GeoJSON export of the survey (RFC 7946). Being written: see issue 5.
