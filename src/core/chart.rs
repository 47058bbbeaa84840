//! Chart geometry (being written).
