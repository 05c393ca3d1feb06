//! One vocabulary for outcomes: a [`Finding`] is a stable code, a [`Severity`], one
//! sentence and the [`Subject`] it is about. Each domain has its own code enum
//! ([`FitCode`], [`CheckCode`], [`ReferenceCode`], [`PlanCode`], [`MixtureCode`]) declared with
//! `finding_codes!`; [`Code`] holds any of them.
//!
//! Codes are interface: scripts match on the kebab-case strings, so a code is never
//! renamed or reused for another meaning.
//!
//! Adding a domain's codes: a file here declaring `finding_codes! { pub enum XCode { … } }`,
//! then one line in the `codes_of_domains!` call below.
//!
//! ```
//! use ebullio::finding::{Finding, FitCode, Severity};
//! let f = Finding::new(FitCode::NarrowRange, "The data span only 8 K.");
//! assert_eq!(f.code, "narrow-range");
//! assert_eq!(f.severity, Severity::Warning);
//! ```

mod binary_fit;
mod check;
mod fit;
mod mixture;
mod plan;
mod reference;

pub use crate::severity::Severity;
pub use binary_fit::BinaryFitCode;
pub use check::CheckCode;
pub use fit::FitCode;
pub use mixture::MixtureCode;
pub use plan::PlanCode;
pub use reference::ReferenceCode;

use serde::{Deserialize, Serialize};

/// Declare a domain's finding codes: each variant with its stable kebab-case code and
/// the severity it always carries. Generates `ALL`, `as_str`, `severity`, `parse`,
/// `Display` and serde as the kebab-case string.
macro_rules! finding_codes {
    (
        $(#[$meta:meta])*
        $vis:vis enum $name:ident {
            $( $(#[$vmeta:meta])* $var:ident = $code:literal, $sev:ident; )*
        }
    ) => {
        $(#[$meta])*
        #[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
        $vis enum $name {
            $( $(#[$vmeta])* $var, )*
        }

        impl $name {
            /// Every code, in report order.
            pub const ALL: &'static [$name] = &[$($name::$var),*];

            /// The stable kebab-case code.
            pub fn as_str(self) -> &'static str {
                match self {
                    $($name::$var => $code,)*
                }
            }

            /// The severity this code always carries.
            pub fn severity(self) -> $crate::severity::Severity {
                match self {
                    $($name::$var => $crate::severity::Severity::$sev,)*
                }
            }

            /// The code written as `s`, if it is one of these.
            pub fn parse(s: &str) -> Option<Self> {
                match s {
                    $($code => Some($name::$var),)*
                    _ => None,
                }
            }
        }

        impl std::fmt::Display for $name {
            fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
                f.write_str(self.as_str())
            }
        }

        impl serde::Serialize for $name {
            fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
                s.serialize_str(self.as_str())
            }
        }

        impl<'de> serde::Deserialize<'de> for $name {
            fn deserialize<D: serde::Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
                let s = String::deserialize(d)?;
                $name::parse(&s).ok_or_else(|| {
                    serde::de::Error::custom(format!("unknown finding code '{s}'"))
                })
            }
        }
    };
}
pub(crate) use finding_codes;

/// Declare [`Code`] over the domains' code enums, in the order a written code is
/// looked up when read back (a code string may exist in two domains).
macro_rules! codes_of_domains {
    ($( $(#[$vmeta:meta])* $var:ident($ty:ident), )*) => {
        /// Any domain's finding code. Serialises as the code's kebab-case string.
        #[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
        #[non_exhaustive]
        pub enum Code {
            $( $(#[$vmeta])* $var($ty), )*
        }

        impl Code {
            /// The stable kebab-case code.
            pub fn as_str(self) -> &'static str {
                match self {
                    $(Code::$var(c) => c.as_str(),)*
                }
            }

            /// The severity the code carries.
            pub fn severity(self) -> Severity {
                match self {
                    $(Code::$var(c) => c.severity(),)*
                }
            }

            /// The code written as `s`, looked up domain by domain in declaration order.
            pub fn parse(s: &str) -> Option<Self> {
                $( if let Some(c) = $ty::parse(s) { return Some(Code::$var(c)); } )*
                None
            }
        }

        $(
            impl From<$ty> for Code {
                fn from(c: $ty) -> Self {
                    Code::$var(c)
                }
            }

            impl PartialEq<$ty> for Code {
                fn eq(&self, other: &$ty) -> bool {
                    *self == Code::$var(*other)
                }
            }

            impl PartialEq<Code> for $ty {
                fn eq(&self, other: &Code) -> bool {
                    Code::$var(*self) == *other
                }
            }
        )*
    };
}

codes_of_domains! {
    /// About a vapor-pressure fit.
    Fit(FitCode),
    /// About a fit held against reference data.
    Reference(ReferenceCode),
    /// About a separation plan.
    Plan(PlanCode),
    /// About a row of a property table.
    Check(CheckCode),
    /// About a two-component vapor-liquid study.
    Mixture(MixtureCode),
    /// About a binary VLE data fit.
    BinaryFit(BinaryFitCode),
}

impl std::fmt::Display for Code {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.as_str())
    }
}

impl PartialEq<&str> for Code {
    fn eq(&self, other: &&str) -> bool {
        self.as_str() == *other
    }
}

impl Serialize for Code {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(self.as_str())
    }
}

impl<'de> Deserialize<'de> for Code {
    fn deserialize<D: serde::Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        let s = String::deserialize(d)?;
        Code::parse(&s)
            .ok_or_else(|| serde::de::Error::custom(format!("unknown finding code '{s}'")))
    }
}

/// What a finding is about. `Whole` (the job as a whole) is left out of JSON.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Subject {
    /// The whole job (the fit, the plan, the table).
    #[default]
    Whole,
    /// A measured point, by its 1-based position in the data.
    Point(usize),
    /// A table row, by its 1-based data row.
    Row(usize),
    /// A compound, by name.
    Compound(String),
    /// A pair of compounds (light, heavy).
    Pair([String; 2]),
}

impl Subject {
    /// True for [`Subject::Whole`].
    pub fn is_whole(&self) -> bool {
        matches!(self, Subject::Whole)
    }
}

impl std::fmt::Display for Subject {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Subject::Whole => Ok(()),
            Subject::Point(i) => write!(f, "point {i}"),
            Subject::Row(i) => write!(f, "row {i}"),
            Subject::Compound(c) => f.write_str(c),
            Subject::Pair([a, b]) => write!(f, "{a} / {b}"),
        }
    }
}

/// One finding: a stable code, its severity, one sentence a chemist understands, and
/// what it is about.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Finding {
    /// Stable kebab-case code.
    pub code: Code,
    /// How serious (fixed per code).
    pub severity: Severity,
    /// One sentence a chemist understands.
    pub message: String,
    /// What it is about.
    #[serde(default, skip_serializing_if = "Subject::is_whole")]
    pub subject: Subject,
}

impl Finding {
    /// A finding about the whole job, with the code's own severity.
    pub fn new(code: impl Into<Code>, message: impl Into<String>) -> Self {
        let code = code.into();
        Finding {
            code,
            severity: code.severity(),
            message: message.into(),
            subject: Subject::Whole,
        }
    }

    /// The same finding about `subject`.
    pub fn about(mut self, subject: Subject) -> Self {
        self.subject = subject;
        self
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn codes_are_unique_kebab_case_within_each_domain() {
        fn check(all: &[&'static str]) {
            let mut seen = std::collections::HashSet::new();
            for s in all {
                assert!(seen.insert(*s), "duplicate code {s}");
                assert!(s
                    .bytes()
                    .all(|b| b.is_ascii_lowercase() || b.is_ascii_digit() || b == b'-'));
            }
        }
        check(&FitCode::ALL.iter().map(|c| c.as_str()).collect::<Vec<_>>());
        check(
            &CheckCode::ALL
                .iter()
                .map(|c| c.as_str())
                .collect::<Vec<_>>(),
        );
        check(&PlanCode::ALL.iter().map(|c| c.as_str()).collect::<Vec<_>>());
        check(
            &BinaryFitCode::ALL
                .iter()
                .map(|c| c.as_str())
                .collect::<Vec<_>>(),
        );
        check(
            &ReferenceCode::ALL
                .iter()
                .map(|c| c.as_str())
                .collect::<Vec<_>>(),
        );
    }

    #[test]
    fn a_finding_serialises_as_before_and_reads_back() {
        let f = Finding::new(FitCode::OutlierPoint, "Point 6 is far off.");
        let j = serde_json::to_string(&f).unwrap();
        assert_eq!(
            j,
            r#"{"code":"outlier-point","severity":"warning","message":"Point 6 is far off."}"#
        );
        assert_eq!(serde_json::from_str::<Finding>(&j).unwrap(), f);
        let g = Finding::new(ReferenceCode::ReferenceTbDisagrees, "x")
            .about(Subject::Compound("toluene".into()));
        let back: Finding = serde_json::from_str(&serde_json::to_string(&g).unwrap()).unwrap();
        assert_eq!(back, g);
        assert!(serde_json::from_str::<Finding>(
            r#"{"code":"no-such-code","severity":"info","message":""}"#
        )
        .is_err());
    }

    #[test]
    fn severity_orders_and_parses() {
        assert!(Severity::Error > Severity::Warning && Severity::Warning > Severity::Info);
        assert_eq!(Severity::parse("Warning"), Some(Severity::Warning));
        assert_eq!(Severity::parse("fatal"), None);
    }
}
