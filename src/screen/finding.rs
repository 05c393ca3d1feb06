//! Findings of the table checks: the one [`Finding`](crate::finding::Finding) with a
//! [`CheckCode`] (declared in `finding/check.rs`), whose severity is fixed per code.

pub use crate::finding::{CheckCode, Finding, Severity};
