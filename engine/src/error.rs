//! The engine's one error type.
//!
//! Every public entry point returns `Result<_, Error>`. An error names the
//! input field it is about (the same key the JSON design file and the page
//! use), so a front end can show the message beside that field, and its
//! message says what to change, not only what is wrong.

use serde::{Deserialize, Serialize};
use std::fmt;

/// What went wrong, and where.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Error {
    /// One input value is out of its domain (non-finite, negative, zero, absurd).
    Input { field: String, message: String },
    /// The inputs are each valid but together ask for something impossible
    /// (e.g. a duty limit that the reset winding cannot allow).
    Infeasible { field: Option<String>, message: String },
    /// A name (core, material, wire) that the libraries do not know.
    Unknown { field: String, message: String },
    /// A file or JSON document that cannot be read.
    Format { field: Option<String>, message: String },
}

impl Error {
    pub fn input(field: &str, message: impl Into<String>) -> Self {
        Error::Input { field: field.to_string(), message: message.into() }
    }
    pub fn infeasible(field: Option<&str>, message: impl Into<String>) -> Self {
        Error::Infeasible { field: field.map(str::to_string), message: message.into() }
    }
    pub fn unknown(field: &str, message: impl Into<String>) -> Self {
        Error::Unknown { field: field.to_string(), message: message.into() }
    }
    pub fn format(field: Option<&str>, message: impl Into<String>) -> Self {
        Error::Format { field: field.map(str::to_string), message: message.into() }
    }

    /// The input field this error is about, if it is about one.
    pub fn field(&self) -> Option<&str> {
        match self {
            Error::Input { field, .. } | Error::Unknown { field, .. } => Some(field),
            Error::Infeasible { field, .. } | Error::Format { field, .. } => field.as_deref(),
        }
    }

    pub fn message(&self) -> &str {
        match self {
            Error::Input { message, .. }
            | Error::Infeasible { message, .. }
            | Error::Unknown { message, .. }
            | Error::Format { message, .. } => message,
        }
    }
}

impl fmt::Display for Error {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.field() {
            Some(field) => write!(f, "{field}: {}", self.message()),
            None => f.write_str(self.message()),
        }
    }
}

impl std::error::Error for Error {}

pub type Result<T> = std::result::Result<T, Error>;

/// Checks shared by every entry point: a value must be finite and positive.
pub fn positive(field: &str, value: f64, unit: &str) -> Result<f64> {
    if !value.is_finite() {
        return Err(Error::input(field, format!("must be a finite number of {unit}")));
    }
    if value <= 0.0 {
        return Err(Error::input(field, format!("must be greater than zero {unit}")));
    }
    Ok(value)
}

/// A finite value that may be zero but not negative.
pub fn non_negative(field: &str, value: f64, unit: &str) -> Result<f64> {
    if !value.is_finite() {
        return Err(Error::input(field, format!("must be a finite number of {unit}")));
    }
    if value < 0.0 {
        return Err(Error::input(field, format!("must not be negative ({unit})")));
    }
    Ok(value)
}

/// A finite value inside `[lo, hi]`, with the range shown in `unit`s.
pub fn in_range(field: &str, value: f64, lo: f64, hi: f64, unit: &str) -> Result<f64> {
    if !value.is_finite() {
        return Err(Error::input(field, format!("must be a finite number of {unit}")));
    }
    if value < lo || value > hi {
        return Err(Error::input(
            field,
            format!("must lie between {lo} and {hi} {unit} (got {value})"),
        ));
    }
    Ok(value)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn positive_rejects_zero_nan_negative() {
        assert!(positive("f", 0.0, "Hz").is_err());
        assert!(positive("f", -1.0, "Hz").is_err());
        assert!(positive("f", f64::NAN, "Hz").is_err());
        assert!(positive("f", f64::INFINITY, "Hz").is_err());
        assert_eq!(positive("f", 2.0, "Hz"), Ok(2.0));
        assert_eq!(positive("f", -1.0, "Hz").unwrap_err().field(), Some("f"));
    }

    #[test]
    fn range_message_names_limits() {
        let e = in_range("duty_max", 0.9, 0.05, 0.5, "").unwrap_err();
        assert!(e.message().contains("0.5"), "{e}");
    }
}
