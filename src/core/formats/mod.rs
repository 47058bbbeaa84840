//! Formats: GeoJSON export, the saved-scenario file, QR codes and the `when` date and time.

pub mod geojson;
pub mod library;
pub mod qr;
pub mod when;
