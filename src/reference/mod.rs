//! Bundled reference data: published Antoine constants, boiling points, the
//! IAPWS-IF97 water line, and lookup by name, CAS number and structure.

pub mod cas;
