//! JSON rendering: the report as serde serialises it, units in key names.

use crate::report::Report;

/// The report as pretty-printed JSON with a trailing newline.
pub fn render(report: &Report) -> String {
    // Serialising plain structs of finite numbers and strings cannot fail.
    let mut s =
        serde_json::to_string_pretty(report).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"));
    s.push('\n');
    s
}
