//! Reading values out of the raw file: each value is parsed with its unit
//! and checked, and every failure becomes a diagnostic that points at it.

use super::diagnostic::{did_you_mean, Diagnostic};
use super::model::{Rail, Sizable};
use super::raw::{Scalar, Value, Word};
use crate::quantity::{parse_quantity, Dimension};

/// Reads one design file's values, turning each into a diagnostic that
/// points at it when it is wrong.
pub(crate) struct Reader<'a> {
    pub(crate) file: &'a str,
    pub(crate) source: &'a str,
    pub(crate) assumptions: Vec<String>,
}

pub(crate) type R<T> = Result<T, Box<Diagnostic>>;

impl<'a> Reader<'a> {
    pub(crate) fn err(
        &self,
        span: Option<std::ops::Range<usize>>,
        field: &str,
        message: String,
    ) -> Box<Diagnostic> {
        Box::new(Diagnostic::at(
            self.file,
            self.source,
            span,
            Some(field),
            message,
        ))
    }

    pub(crate) fn quantity(&self, v: &Value, field: &str, dim: Dimension) -> R<f64> {
        let x = self.quantity_unchecked(v, field, dim)?;
        let (lo, hi) = dim.plausible_magnitude();
        let unit = dim.si_unit();
        let unit = if unit == "1" { "" } else { unit };
        let show = |y: f64| {
            if !y.is_finite() {
                format!("{y}")
            } else if y == 0.0 || (1e-12..=1e12).contains(&y.abs()) {
                crate::quantity::format_engineering(y, unit, 4)
            } else {
                format!("{y:.3e} {unit}").trim_end().to_string()
            }
        };
        if !x.is_finite() {
            return Err(self.err(
                Some(v.span()),
                field,
                format!("expected a finite {}, found {}", dim.name(), show(x)),
            ));
        }
        if x != 0.0 && !(lo..=hi).contains(&x.abs()) {
            return Err(self.err(
                Some(v.span()),
                field,
                format!(
                    "expected a {} of magnitude {} to {} (the plausible range for any {} in a detector design; docs/design-file.md, Units), found {}",
                    dim.name(),
                    show(lo),
                    show(hi),
                    dim.name(),
                    show(x)
                ),
            ));
        }
        if let Some(r) = super::ranges::range_of(field, dim) {
            if !(r.lo..=r.hi).contains(&x) {
                return Err(self.err(
                    Some(v.span()),
                    field,
                    format!(
                        "expected {} of {} to {} ({}; docs/design-file.md, Per-key ranges), found {}",
                        dim.name(),
                        show_key_value(dim, r.lo),
                        show_key_value(dim, r.hi),
                        r.why,
                        show_key_value(dim, x)
                    ),
                ));
            }
        }
        Ok(x)
    }

    fn quantity_unchecked(&self, v: &Value, field: &str, dim: Dimension) -> R<f64> {
        let text = match v.get_ref() {
            Scalar::Text(t) if t.trim().eq_ignore_ascii_case("auto") => {
                return Err(self.err(
                    Some(v.span()),
                    field,
                    format!(
                        "\"auto\" is not accepted here: draftwire does not size this value; give {} with its unit, such as {}",
                        dim.name(),
                        dim.examples()
                    ),
                ))
            }
            Scalar::Text(t) => t.clone(),
            Scalar::Number(n) => {
                if dim == Dimension::Fraction {
                    return Ok(*n);
                }
                return Err(self.err(
                    Some(v.span()),
                    field,
                    format!(
                        "missing unit: expected {} with its unit, such as {}, found the bare number {n}",
                        dim.name(),
                        dim.examples()
                    ),
                ));
            }
        };
        parse_quantity(&text, dim).map_err(|e| self.err(Some(v.span()), field, e.to_string()))
    }

    pub(crate) fn positive(&self, v: &Value, field: &str, dim: Dimension) -> R<f64> {
        let x = self.quantity(v, field, dim)?;
        if x > 0.0 {
            Ok(x)
        } else {
            Err(self.err(
                Some(v.span()),
                field,
                format!(
                    "expected {} above zero, found {}",
                    dim.name(),
                    crate::quantity::format_sig(x, 6)
                ),
            ))
        }
    }

    /// A positive quantity within a key's own physical range `[lo, hi]`
    /// (SI), or an error at it.
    pub(crate) fn positive_within(
        &self,
        v: &Value,
        field: &str,
        dim: Dimension,
        lo: f64,
        hi: f64,
    ) -> R<f64> {
        let x = self.positive(v, field, dim)?;
        if (lo..=hi).contains(&x) {
            return Ok(x);
        }
        let u = dim.si_unit();
        Err(self.err(
            Some(v.span()),
            field,
            format!(
                "expected {} of {} to {}, found {}",
                dim.name(),
                crate::quantity::format_engineering(lo, u, 3),
                crate::quantity::format_engineering(hi, u, 3),
                crate::quantity::format_engineering(x, u, 4)
            ),
        ))
    }

    pub(crate) fn non_negative(&self, v: &Value, field: &str, dim: Dimension) -> R<f64> {
        let x = self.quantity(v, field, dim)?;
        if x >= 0.0 {
            Ok(x)
        } else {
            Err(self.err(
                Some(v.span()),
                field,
                format!(
                    "expected {} of at least zero, found {}",
                    dim.name(),
                    crate::quantity::format_sig(x, 6)
                ),
            ))
        }
    }

    pub(crate) fn fraction_in(&self, v: &Value, field: &str, lo: f64, hi: f64) -> R<f64> {
        let x = self.quantity(v, field, Dimension::Fraction)?;
        if x >= lo && x <= hi {
            Ok(x)
        } else {
            Err(self.err(
                Some(v.span()),
                field,
                format!(
                    "expected a fraction between {} % and {} %, found {} %",
                    crate::quantity::format_sig(lo * 100.0, 6),
                    crate::quantity::format_sig(hi * 100.0, 6),
                    crate::quantity::format_sig(x * 100.0, 6)
                ),
            ))
        }
    }

    pub(crate) fn opt<T>(
        &mut self,
        v: &Option<Value>,
        f: impl FnOnce(&Self, &Value) -> R<T>,
    ) -> R<Option<T>> {
        match v {
            Some(v) => f(self, v).map(Some),
            None => Ok(None),
        }
    }

    pub(crate) fn or_default<T>(
        &mut self,
        v: &Option<Value>,
        default: T,
        note: &str,
        f: impl FnOnce(&Self, &Value) -> R<T>,
    ) -> R<T> {
        match v {
            Some(v) => f(self, v),
            None => {
                if !note.is_empty() {
                    self.assumptions.push(note.to_string());
                }
                Ok(default)
            }
        }
    }

    pub(crate) fn required<'v>(
        &self,
        v: &'v Option<Value>,
        field: &str,
        near: Option<std::ops::Range<usize>>,
        what: &str,
    ) -> R<&'v Value> {
        v.as_ref()
            .ok_or_else(|| self.err(near, field, format!("missing: {what}")))
    }

    pub(crate) fn sizable(&self, v: &Value, field: &str, dim: Dimension) -> R<Sizable> {
        if let Scalar::Text(t) = v.get_ref() {
            if t.trim().eq_ignore_ascii_case("auto") {
                return Ok(Sizable::Auto);
            }
        }
        self.positive(v, field, dim).map(Sizable::Fixed)
    }

    pub(crate) fn word(&self, w: &Word, field: &str, choices: &[&'static str]) -> R<&'static str> {
        let text = w.get_ref().trim();
        if let Some(c) = choices.iter().find(|c| c.eq_ignore_ascii_case(text)) {
            return Ok(c);
        }
        let help =
            did_you_mean(text, choices.iter().copied()).map(|c| format!("did you mean \"{c}\"?"));
        Err(Box::new(
            Diagnostic::at(
                self.file,
                self.source,
                Some(w.span()),
                Some(field),
                format!("expected one of {}, found \"{text}\"", quote_list(choices)),
            )
            .with_help(help),
        ))
    }

    pub(crate) fn rail(&self, w: &Word, field: &str, has_regulator: bool) -> R<Rail> {
        let rail = match self.word(w, field, &["input", "regulated"])? {
            "input" => Rail::Input,
            _ => Rail::Regulated,
        };
        if rail == Rail::Regulated && !has_regulator {
            return Err(self.err(
                Some(w.span()),
                field,
                "the \"regulated\" rail needs a [supply.regulator] section, and there is none"
                    .into(),
            ));
        }
        Ok(rail)
    }
}

/// A per-key bound or value for people: temperatures in °C, everything
/// else with an engineering prefix.
fn show_key_value(dim: Dimension, x: f64) -> String {
    if dim == Dimension::Temperature {
        format!("{} °C", crate::quantity::format_sig(x - 273.15, 4))
    } else {
        let text = crate::quantity::format_engineering(x, dim.si_unit(), 4);
        // Bounds read best without trailing zeros: "100 mV", not "100.0 mV".
        match text.split_once(' ') {
            Some((number, unit)) if number.contains('.') => {
                format!(
                    "{} {unit}",
                    number.trim_end_matches('0').trim_end_matches('.')
                )
            }
            _ => text,
        }
    }
}

fn quote_list(items: &[&str]) -> String {
    items
        .iter()
        .map(|s| format!("\"{s}\""))
        .collect::<Vec<_>>()
        .join(", ")
}

/// Turn a toml/serde error into a diagnostic, with a "did you mean" hint
/// for unknown keys.
pub(crate) fn toml_error(file: &str, source: &str, e: &toml::de::Error) -> Diagnostic {
    let message = e.message().trim().to_string();
    let mut help = None;
    if let Some(rest) = message.strip_prefix("unknown field `") {
        if let Some((unknown, tail)) = rest.split_once('`') {
            let expected: Vec<&str> = tail.split('`').skip(1).step_by(2).collect();
            help = did_you_mean(unknown, expected.iter().copied())
                .map(|c| format!("did you mean `{c}`?"));
        }
    }
    let message = if message == "duplicate key" {
        // Name the key and where it was first given.
        let span = e.span().unwrap_or(0..0);
        let key = source
            .get(span.clone())
            .unwrap_or("")
            .trim()
            .trim_matches(|c| c == '[' || c == ']' || c == '"')
            .to_string();
        let first = source[..span.start.min(source.len())]
            .lines()
            .enumerate()
            .find(|(_, l)| {
                let l = l.trim();
                let head = l.trim_start_matches('[').trim_end_matches(']').trim();
                (l.starts_with('[') && head == key)
                    || l.split('=').next().map(str::trim) == Some(key.as_str())
            })
            .map(|(i, _)| i + 1);
        match first {
            Some(line) => format!("duplicate key `{key}`: it was first given on line {line}"),
            None => format!("duplicate key `{key}`"),
        }
    } else if message.contains("number overflowed")
        || message.contains("integer overflow")
        || message.contains("as i128")
    {
        "the number is too large to read: write it with a unit and an exponent, such as \"1e6 ohm\""
            .to_string()
    } else if message.contains("recursion") {
        "nesting too deep: a design file needs at most a table inside a table".to_string()
    } else if let Some(rest) = message.strip_prefix("missing field `") {
        let key = rest.split('`').next().unwrap_or_default();
        format!("missing required key or table `{key}` (docs/design-file.md lists what it holds)")
    } else if message.contains("untagged enum Scalar") {
        "expected a number, or a quoted string with its unit such as \"68 ohm\"".to_string()
    } else {
        message
    };
    Diagnostic::at(file, source, e.span(), None, message).with_help(help)
}
