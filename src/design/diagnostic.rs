//! Errors about a design file, pointing at file:line:column with the
//! offending source line and a caret under the value.

use std::fmt;
use std::ops::Range;

/// One error in a design file.
#[derive(Debug, Clone, PartialEq)]
pub struct Diagnostic {
    /// File name as given by the caller.
    pub file: String,
    /// 1-based line, when the position is known.
    pub line: Option<usize>,
    /// 1-based column (in characters), when the position is known.
    pub column: Option<usize>,
    /// Dotted key path of the field, e.g. `element.resistance.r0`.
    pub field: Option<String>,
    /// What was wrong, and what was expected.
    pub message: String,
    /// A suggestion, e.g. "did you mean `series`?".
    pub help: Option<String>,
    /// The source line and the caret span on it (character columns).
    snippet: Option<(String, Range<usize>)>,
}

impl Diagnostic {
    /// A diagnostic at byte span `span` of `source`.
    pub fn at(
        file: &str,
        source: &str,
        span: Option<Range<usize>>,
        field: Option<&str>,
        message: String,
    ) -> Self {
        let mut d = Diagnostic {
            file: file.to_string(),
            line: None,
            column: None,
            field: field.map(str::to_string),
            message,
            help: None,
            snippet: None,
        };
        if let Some(span) = span {
            let start = span.start.min(source.len());
            let end = span.end.clamp(start, source.len());
            let line_start = source[..start].rfind('\n').map_or(0, |i| i + 1);
            let line_end = source[start..]
                .find('\n')
                .map_or(source.len(), |i| start + i);
            let line_no = source[..start].matches('\n').count() + 1;
            let col = source[line_start..start].chars().count() + 1;
            let text = source[line_start..line_end]
                .trim_end_matches('\r')
                .to_string();
            let caret_end = end.min(line_end);
            let width = source[start..caret_end].chars().count().max(1);
            d.line = Some(line_no);
            d.column = Some(col);
            d.snippet = Some(cut_snippet(&text, col - 1, width));
        }
        d
    }

    /// Attach a suggestion.
    pub fn with_help(mut self, help: Option<String>) -> Self {
        self.help = help;
        self
    }
}

impl fmt::Display for Diagnostic {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}", self.file)?;
        if let (Some(l), Some(c)) = (self.line, self.column) {
            write!(f, ":{l}:{c}")?;
        }
        write!(f, ": ")?;
        if let Some(field) = &self.field {
            write!(f, "{field}: ")?;
        }
        write!(f, "{}", self.message)?;
        if let (Some((text, span)), Some(l)) = (&self.snippet, self.line) {
            let gutter = l.to_string().len();
            write!(
                f,
                "\n{:gutter$} |\n{l} | {text}\n{:gutter$} | {}{}",
                "",
                "",
                " ".repeat(span.start),
                "^".repeat(span.len())
            )?;
        }
        if let Some(h) = &self.help {
            write!(f, "\n  = help: {h}")?;
        }
        Ok(())
    }
}

impl std::error::Error for Diagnostic {}

/// Longest source line shown in a snippet, characters.
pub const SNIPPET_MAX_CHARS: usize = 120;

/// A source line cut to [`SNIPPET_MAX_CHARS`] around the caret (with "…"
/// where it was cut), and the caret's range in the cut text (characters).
fn cut_snippet(text: &str, caret: usize, width: usize) -> (String, Range<usize>) {
    let chars: Vec<char> = text.chars().collect();
    if chars.len() <= SNIPPET_MAX_CHARS {
        return (text.to_string(), caret..caret + width);
    }
    let width = width.min(SNIPPET_MAX_CHARS / 2);
    let start = caret.saturating_sub(SNIPPET_MAX_CHARS / 4);
    let end = (start + SNIPPET_MAX_CHARS).min(chars.len());
    let mut out = String::new();
    let mut shift = 0;
    if start > 0 {
        out.push('…');
        shift = 1;
    }
    out.extend(&chars[start..end]);
    if end < chars.len() {
        out.push('…');
    }
    let c = caret - start + shift;
    (out, c..c + width)
}

/// Levenshtein edit distance (Levenshtein, Soviet Physics Doklady 10
/// (1966) 707), used for "did you mean" hints.
pub fn edit_distance(a: &str, b: &str) -> usize {
    let b: Vec<char> = b.chars().collect();
    let mut prev: Vec<usize> = (0..=b.len()).collect();
    for (i, ca) in a.chars().enumerate() {
        let mut cur = vec![i + 1; b.len() + 1];
        for (j, cb) in b.iter().enumerate() {
            let cost = usize::from(ca != *cb);
            cur[j + 1] = (prev[j] + cost).min(prev[j + 1] + 1).min(cur[j] + 1);
        }
        prev = cur;
    }
    prev[b.len()]
}

/// The closest candidate to `word` within a small edit distance.
pub fn did_you_mean<'a>(
    word: &str,
    candidates: impl IntoIterator<Item = &'a str>,
) -> Option<&'a str> {
    let limit = (word.chars().count() / 3).max(2);
    candidates
        .into_iter()
        .map(|c| (edit_distance(&word.to_lowercase(), &c.to_lowercase()), c))
        .filter(|(d, _)| *d <= limit)
        .min_by_key(|(d, _)| *d)
        .map(|(_, c)| c)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn edit_distance_of_known_pairs() {
        // Reference: the classic example, kitten → sitting needs 3 edits
        // (Levenshtein 1966; any algorithms text).
        assert_eq!(edit_distance("kitten", "sitting"), 3);
        assert_eq!(edit_distance("", "abc"), 3);
        assert_eq!(edit_distance("series", "series"), 0);
    }

    #[test]
    fn suggests_near_miss_only() {
        assert_eq!(
            did_you_mean("serie", ["series", "rail", "kind"]),
            Some("series")
        );
        assert_eq!(did_you_mean("banana", ["series", "rail", "kind"]), None);
    }

    #[test]
    fn points_at_line_and_column() {
        let src = "a = 1\nr0 = \"68\"\n";
        let start = src.find("\"68\"").unwrap();
        let d = Diagnostic::at(
            "x.toml",
            src,
            Some(start..start + 4),
            Some("r0"),
            "missing unit".into(),
        );
        assert_eq!((d.line, d.column), (Some(2), Some(6)));
        let text = d.to_string();
        assert!(text.starts_with("x.toml:2:6: r0: missing unit"), "{text}");
        assert!(text.contains("2 | r0 = \"68\"\n  |      ^^^^"), "{text}");
    }
}
