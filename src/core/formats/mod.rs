//! Formats: GeoJSON export, the saved-scenario file and QR codes.

pub mod geojson;
pub mod library;
pub mod qr;
