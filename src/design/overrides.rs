//! `--set KEY=VALUE`: overrides applied to a design file's text before it is
//! read, so that every check the reader makes applies to them too, and an
//! error in an override points at the override rather than at the file.
//!
//! An override replaces the value of a key the file gives, or adds the key
//! under its table (adding the table at the end when the file has none).
//! VALUE is written as the file would hold it, without the TOML quotes: a
//! bare number stays a number, `[a, b]` becomes an array of strings, and
//! anything else becomes a string.

use super::diagnostic::Diagnostic;
use std::ops::Range;

/// One `--set` argument, split.
#[derive(Debug, Clone, PartialEq)]
pub struct Override {
    /// Dotted key, e.g. `detector.trip_airflow`.
    pub key: String,
    /// The value as typed.
    pub value: String,
    /// Remove the key instead of setting it (`KEY=` with nothing after).
    pub remove: bool,
}

impl Override {
    /// Split `KEY=VALUE`.
    pub fn parse(arg: &str) -> Result<Self, Box<Diagnostic>> {
        let Some((k, v)) = arg.split_once('=') else {
            return Err(Box::new(Diagnostic::at(
                "--set",
                arg,
                Some(0..arg.len()),
                None,
                format!(
                    "expected KEY=VALUE, such as detector.trip_airflow=0.4 m/s; found \"{arg}\""
                ),
            )));
        };
        let key = k.trim();
        let parts: Vec<&str> = key.split('.').collect();
        if parts.len() < 2
            || parts
                .iter()
                .any(|p| p.is_empty() || !p.chars().all(|c| c.is_ascii_alphanumeric() || c == '_'))
        {
            return Err(Box::new(Diagnostic::at(
                "--set",
                arg,
                Some(0..k.len()),
                None,
                format!("expected a dotted key as in the file, such as detector.trip_airflow; found \"{key}\""),
            )));
        }
        Ok(Self {
            key: key.to_string(),
            value: v.trim().to_string(),
            remove: v.trim().is_empty(),
        })
    }

    /// The TOML literal the value stands for.
    fn literal(&self) -> String {
        let v = self.value.as_str();
        let quote = |s: &str| {
            format!(
                "\"{}\"",
                s.trim().replace('\\', "\\\\").replace('"', "\\\"")
            )
        };
        if v.parse::<f64>().is_ok_and(f64::is_finite) && !v.contains(char::is_alphabetic) {
            return v.to_string();
        }
        if let Some(inner) = v.strip_prefix('[').and_then(|s| s.strip_suffix(']')) {
            let items: Vec<String> = inner.split(',').map(quote).collect();
            return format!("[{}]", items.join(", "));
        }
        quote(v)
    }
}

/// Where an override landed in the patched text.
#[derive(Debug, Clone, PartialEq)]
struct Patch {
    /// 1-based line of the patched text holding it.
    line: usize,
    /// The override.
    over: Override,
}

/// The design text with the overrides applied, and where each landed.
#[derive(Debug, Clone, PartialEq)]
pub struct Patched {
    /// The text to read.
    pub text: String,
    patches: Vec<Patch>,
}

/// The line range of `key = …` directly inside table `[table]`, if the
/// file writes it that way.
fn find_key_line(text: &str, table: &str, key: &str) -> Option<Range<usize>> {
    let mut current = String::new();
    let mut pos = 0;
    for line in text.split_inclusive('\n') {
        let t = line.trim();
        if t.starts_with('[') && !t.starts_with("[[") {
            current = t
                .trim_start_matches('[')
                .split(']')
                .next()
                .unwrap_or("")
                .trim()
                .to_string();
        } else if t.starts_with("[[") {
            current = String::from("\u{0}");
        } else if current == table {
            if let Some((k, _)) = t.split_once('=') {
                if k.trim() == key {
                    return Some(pos..pos + line.trim_end_matches(['\n', '\r']).len());
                }
            }
        }
        pos += line.len();
    }
    None
}

/// The byte position just after the header line `[table]`, if present.
fn find_table_end_of_header(text: &str, table: &str) -> Option<usize> {
    let mut pos = 0;
    for line in text.split_inclusive('\n') {
        let t = line.trim();
        if t.starts_with('[') && !t.starts_with("[[") {
            let name = t
                .trim_start_matches('[')
                .split(']')
                .next()
                .unwrap_or("")
                .trim();
            if name == table {
                return Some(pos + line.len());
            }
        }
        pos += line.len();
    }
    None
}

/// Apply the overrides to `source`.
pub fn apply(source: &str, overrides: &[Override]) -> Patched {
    let mut text = source.to_string();
    if !text.is_empty() && !text.ends_with('\n') {
        text.push('\n');
    }
    let mut landed: Vec<(usize, Override)> = Vec::new();
    for o in overrides {
        let (table, key) = o.key.rsplit_once('.').unwrap_or(("", &o.key));
        if o.remove {
            if let Some(r) = find_key_line(&text, table, key) {
                let end = (r.end + 1).min(text.len());
                text.replace_range(r.start..end, "");
            }
            continue;
        }
        let new_line = format!("{key} = {}", o.literal());
        let at = if let Some(r) = find_key_line(&text, table, key) {
            text.replace_range(r.clone(), &new_line);
            r.start
        } else if let Some(p) = find_table_end_of_header(&text, table) {
            text.insert_str(p, &format!("{new_line}\n"));
            p
        } else {
            let p = text.len();
            text.push_str(&format!("\n[{table}]\n{new_line}\n"));
            p + table.len() + 4
        };
        landed.push((at, o.clone()));
    }
    // Lines are counted in the final text (later patches may shift earlier
    // ones only when inserted above them; re-find each by its content).
    let removed: Vec<Patch> = overrides
        .iter()
        .filter(|o| o.remove)
        .map(|o| Patch {
            line: 0,
            over: o.clone(),
        })
        .collect();
    let patches = landed
        .into_iter()
        .map(|(_, o)| {
            let (table, key) = o.key.rsplit_once('.').unwrap_or(("", &o.key));
            let r = find_key_line(&text, table, key).unwrap_or(0..0);
            let line = text[..r.start].matches('\n').count() + 1;
            Patch { line, over: o }
        })
        .chain(removed)
        .collect();
    Patched { text, patches }
}

impl Patched {
    /// Re-point a diagnostic that falls on an overridden line at the
    /// override itself.
    pub fn remap(&self, d: Box<Diagnostic>) -> Box<Diagnostic> {
        let Some(line) = d.line else {
            return d;
        };
        let Some(p) = self.patches.iter().find(|p| p.line == line) else {
            return d;
        };
        let shown = format!("{}={}", p.over.key, p.over.value);
        let start = p.over.key.len() + 1;
        Box::new(
            Diagnostic::at(
                "--set",
                &shown,
                Some(start..shown.len().max(start + 1)),
                Some(&p.over.key),
                d.message.clone(),
            )
            .with_help(d.help.clone()),
        )
    }

    /// The overrides in words, for the report's assumptions.
    pub fn notes(&self) -> Vec<String> {
        self.patches
            .iter()
            .map(|p| {
                format!(
                    "{} = {} (set on the command line)",
                    p.over.key, p.over.value
                )
            })
            .collect()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn replaces_adds_and_creates() {
        let src = "[detector]\ntrip_airflow = \"0.3 m/s\"\n\n[drive]\nkind = \"series-resistor\"\n";
        let o = |s: &str| Override::parse(s).unwrap();
        let p = apply(
            src,
            &[
                o("detector.trip_airflow=0.42 m/s"),
                o("drive.series=auto"),
                o("element.cooling.n=0.45"),
                o("detector.trip_band=[0.2 m/s, 0.6 m/s]"),
            ],
        );
        assert!(p.text.contains("trip_airflow = \"0.42 m/s\""), "{}", p.text);
        assert!(!p.text.contains("0.3 m/s"));
        assert!(
            p.text.contains("[drive]\nseries = \"auto\"\n"),
            "{}",
            p.text
        );
        assert!(p.text.contains("[element.cooling]\nn = 0.45"), "{}", p.text);
        assert!(
            p.text.contains("trip_band = [\"0.2 m/s\", \"0.6 m/s\"]"),
            "{}",
            p.text
        );
        assert_eq!(p.notes().len(), 4);
        // The result is still TOML.
        assert!(p.text.parse::<toml::Table>().is_ok());
    }

    #[test]
    fn malformed_overrides_are_errors() {
        assert!(Override::parse("no-equals").is_err());
        assert!(Override::parse("toplevel=1").is_err());
        assert!(Override::parse("a..b=1").is_err());
    }
}
