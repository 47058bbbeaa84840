//! Formats: survey boundaries (GeoJSON, KML, the `field` text), GeoJSON export, the saved-scenario file, QR codes and the `when` date and time.

pub mod boundary;
pub mod field_export;
pub mod geojson;
pub mod library;
pub mod qr;
pub mod when;
