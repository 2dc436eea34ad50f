//! The report for people: aligned, unit-labelled plain text.

use crate::quantity::format_engineering;
use crate::report::Report;
use std::fmt::Write;

/// A plain aligned table; each column left- (`l`) or right-aligned (`r`).
struct Table {
    rows: Vec<Vec<String>>,
    /// A note printed under a row (index into `rows`), wrapped.
    notes: Vec<(usize, String)>,
}

impl Table {
    fn new(header: &[&str]) -> Self {
        Self {
            rows: vec![header.iter().map(|s| s.to_string()).collect()],
            notes: Vec::new(),
        }
    }
    fn push(&mut self, row: Vec<String>) {
        self.rows.push(row);
    }
    fn push_with_note(&mut self, row: Vec<String>, note: String) {
        self.rows.push(row);
        self.notes.push((self.rows.len() - 1, note));
    }
    fn render(&self, out: &mut String, indent: &str, align: &str, width: usize) {
        let align: Vec<char> = align.chars().collect();
        let n = self.rows.iter().map(Vec::len).max().unwrap_or(0);
        let widths: Vec<usize> = (0..n)
            .map(|i| {
                self.rows
                    .iter()
                    .filter_map(|r| r.get(i))
                    .map(|c| c.chars().count())
                    .max()
                    .unwrap_or(0)
            })
            .collect();
        for (r, row) in self.rows.iter().enumerate() {
            let mut line = String::from(indent);
            for (i, cell) in row.iter().enumerate() {
                let pad = widths[i] - cell.chars().count();
                if i > 0 {
                    line.push_str("  ");
                }
                if align.get(i).copied().unwrap_or('r') == 'l' {
                    line.push_str(cell);
                    if i + 1 < row.len() {
                        line.push_str(&" ".repeat(pad));
                    }
                } else {
                    line.push_str(&" ".repeat(pad));
                    line.push_str(cell);
                }
            }
            out.push_str(line.trim_end());
            out.push('\n');
            for (_, note) in self.notes.iter().filter(|(i, _)| *i == r) {
                let hang = format!("{indent}{}  ", " ".repeat(widths[0]));
                out.push_str(&wrap(note, &hang, &hang, width));
            }
        }
    }
}

/// Labelled values, one a line, labels padded to a common column.
fn key_values(out: &mut String, lines: &[(&str, String)]) {
    for (k, v) in lines {
        let _ = writeln!(out, "  {k:<30} {v}");
    }
}

/// Width to which running text is wrapped when the terminal's is unknown.
pub const DEFAULT_WIDTH: usize = 100;

/// Wrap `text` at word boundaries to `width` characters, the first line
/// starting with `first`, the others with `rest`; ends with a newline.
fn wrap(text: &str, first: &str, rest: &str, width: usize) -> String {
    let mut out = String::new();
    let mut line = String::from(first);
    let mut empty = true;
    for word in text.split_whitespace() {
        let len = line.chars().count() + word.chars().count() + usize::from(!empty);
        if !empty && len > width {
            out.push_str(&line);
            out.push('\n');
            line = String::from(rest);
            empty = true;
        }
        if !empty {
            line.push(' ');
        }
        line.push_str(word);
        empty = false;
    }
    out.push_str(&line);
    out.push('\n');
    out
}

fn eng(x: f64, unit: &str) -> String {
    format_engineering(x, unit, 3)
}

/// An airflow with its unit, or what happens instead.
fn airflow_or(u: Option<f64>, instead: &str, air: AirflowUnit) -> String {
    u.map_or_else(|| instead.to_string(), |u| air.text(u))
}

fn heading(out: &mut String, title: &str) {
    let _ = writeln!(out, "\n{title}\n{}", "─".repeat(title.chars().count()));
}

/// Render the report as aligned text.
pub fn render(r: &Report, file: &str) -> String {
    render_with_width(r, file, DEFAULT_WIDTH)
}

/// [`render`] with running text wrapped to `width` columns (the CLI passes
/// the terminal's width, `COLUMNS`).
pub fn render_with_width(r: &Report, file: &str, width: usize) -> String {
    render_with(r, file, width, AirflowUnit::MetresPerSecond)
}

/// The unit airflow is shown in by the text report.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum AirflowUnit {
    /// m/s (the report's own unit).
    MetresPerSecond,
    /// ft/min (1 ft/min = 0.00508 m/s exactly, yard and pound agreement 1959).
    FeetPerMinute,
    /// cm/s.
    CentimetresPerSecond,
}

impl AirflowUnit {
    /// m/s in one of this unit.
    fn m_per_s(self) -> f64 {
        match self {
            AirflowUnit::MetresPerSecond => 1.0,
            AirflowUnit::FeetPerMinute => 0.00508,
            AirflowUnit::CentimetresPerSecond => 0.01,
        }
    }
    /// Its symbol.
    pub fn symbol(self) -> &'static str {
        match self {
            AirflowUnit::MetresPerSecond => "m/s",
            AirflowUnit::FeetPerMinute => "ft/min",
            AirflowUnit::CentimetresPerSecond => "cm/s",
        }
    }
    /// An airflow in this unit with the report's precision (three decimals
    /// in m/s, one in ft/min and cm/s), without the symbol.
    fn number(self, u: f64, extra_digits: usize) -> String {
        let d = if self == AirflowUnit::MetresPerSecond {
            3
        } else {
            1
        } + extra_digits;
        format!("{:.*}", d, u / self.m_per_s())
    }
    /// The same with the symbol.
    fn text(self, u: f64) -> String {
        format!("{} {}", self.number(u, 0), self.symbol())
    }
    /// Prose written in m/s, its airflows converted: every number (or
    /// range `a–b`) followed by " m/s" is rescaled, four significant
    /// figures; "per m/s" becomes "per <unit>".
    fn prose(self, text: &str) -> String {
        if self == AirflowUnit::MetresPerSecond {
            return text.to_string();
        }
        let mut out = String::new();
        let mut rest = text;
        while let Some(i) = rest.find(" m/s") {
            let after = rest[i + 4..].chars().next();
            if after.is_some_and(|c| c.is_alphanumeric()) {
                out.push_str(&rest[..i + 4]);
                rest = &rest[i + 4..];
                continue;
            }
            let before = &rest[..i];
            // The number (or a–b range) right before " m/s".
            let start = before
                .rfind(|c: char| {
                    !(c.is_ascii_digit()
                        || c == '.'
                        || c == '-'
                        || c == '+'
                        || c == '–'
                        || c == 'e')
                })
                .map_or(0, |k| {
                    k + before[k..].chars().next().map_or(1, char::len_utf8)
                });
            let token = &before[start..];
            let convert = |t: &str| -> Option<String> {
                let v: f64 = t.parse().ok()?;
                Some(crate::quantity::format_sig(v / self.m_per_s(), 4))
            };
            let converted = match token.split_once('–') {
                Some((a, b)) => convert(a).zip(convert(b)).map(|(a, b)| format!("{a}–{b}")),
                None => convert(token),
            };
            match converted {
                Some(c) if !token.is_empty() => {
                    out.push_str(&before[..start]);
                    out.push_str(&c);
                }
                _ => out.push_str(before),
            }
            out.push(' ');
            out.push_str(self.symbol());
            rest = &rest[i + 4..];
        }
        out.push_str(rest);
        out
    }
}

/// [`render_with_width`] with airflow shown in `unit` (the JSON and CSV
/// reports stay in m/s).
pub fn render_with(r: &Report, file: &str, width: usize, unit: AirflowUnit) -> String {
    let air = unit;
    let mut out = String::new();
    let _ = writeln!(out, "draftwire size · {}", r.title);
    let _ = writeln!(out, "design file   {file}");
    let _ = writeln!(out, "element       {}", r.element);
    let _ = writeln!(out, "drive         {}", r.drive);
    let _ = writeln!(
        out,
        "air           {:.1} °C, {:.1} kPa",
        r.ambient_c,
        r.pressure_pa / 1000.0
    );
    if let Some(k) = &r.equivalent_kings_law {
        let _ = writeln!(
            out,
            "King's law    G(U) ≈ {} + {}·Uⁿ, n = {:.3} (equivalent around {:.0} °C, U in m/s)",
            eng(k.a_w_per_k, "W/K"),
            eng(k.b_w_per_k, "W/K"),
            k.n,
            k.at_temperature_c
        );
    }
    let failed: Vec<&str> = r
        .checks
        .iter()
        .filter(|c| !c.passed)
        .map(|c| c.id.as_str())
        .collect();
    let passed_n = r.checks.len() - failed.len();
    let verdict = if failed.is_empty() {
        format!(
            "PASS: {passed_n} of {} design checks passed at their worst combined condition",
            r.checks.len()
        )
    } else {
        format!(
            "FAIL: {passed_n} of {} design checks passed; failing: {}",
            r.checks.len(),
            failed.join(", ")
        )
    };
    out.push_str(&wrap(&verdict, "result        ", "              ", width));
    let _ = writeln!(out, "comparator    {}", r.comparator_limits);

    heading(
        &mut out,
        &format!("Element operating points (ambient {:.1} °C)", r.ambient_c),
    );
    let mut t = Table::new(&[
        "",
        "airflow",
        "element",
        "resistance",
        "current",
        "power",
        "sense",
        "overheat",
        "time const.",
    ]);
    t.push(vec![
        "".into(),
        air.symbol().into(),
        "°C".into(),
        "".into(),
        "".into(),
        "".into(),
        "".into(),
        "ratio".into(),
        "".into(),
    ]);
    for p in &r.operating_points {
        t.push(vec![
            p.label.clone(),
            air.number(p.airflow_m_per_s, 0),
            format!("{:.1}", p.element_temperature_c),
            eng(p.element_resistance_ohm, "Ω"),
            eng(p.element_current_a, "A"),
            eng(p.element_power_w, "W"),
            format!("{:.4} V", p.sense_voltage_v),
            format!("{:.3}", p.overheat_ratio),
            eng(p.time_constant_s, "s"),
        ]);
    }
    t.render(&mut out, "  ", "lrrrrrrrr", width);

    let tr = &r.trip;
    heading(
        &mut out,
        &format!("Trip point (trips on {} airflow)", tr.direction),
    );
    let trip_lines = [
        ("target", air.text(tr.target_airflow_m_per_s)),
        (
            "trip band",
            format!(
                "{}–{} {} at every condition",
                air.number(tr.band_m_per_s[0], 0),
                air.number(tr.band_m_per_s[1], 0),
                air.symbol()
            ),
        ),
        (
            if tr.direction == "rising" {
                "background airflow"
            } else {
                "normal airflow"
            },
            format!(
                "{} (the output must stay idle there)",
                air.text(tr.normal_airflow_m_per_s)
            ),
        ),
        (
            "trips at",
            airflow_or(tr.airflow_m_per_s, "never switches", air),
        ),
        (
            "releases at",
            airflow_or(tr.release_airflow_m_per_s, "never releases", air),
        ),
        (
            "sense voltage at trip",
            format!("{:.4} V", tr.sense_voltage_v),
        ),
        (
            "reference voltage (wiper)",
            format!("{:.4} V", tr.reference_voltage_v),
        ),
        (
            "sensitivity dV/dU",
            format!(
                "{} mV per {}",
                crate::quantity::format_sig(
                    tr.sensitivity_v_per_m_per_s * 1000.0 * air.m_per_s(),
                    4
                ),
                air.symbol()
            ),
        ),
        (
            "trimmer setting",
            format!(
                "{:.1} % of travel from the grounded end",
                tr.trimmer_position_percent
            ),
        ),
        (
            "trimmer range",
            format!(
                "grounded end: {}; top end: {}",
                tr.trimmer_bottom_state, tr.trimmer_top_state
            ),
        ),
        (
            "1 % of travel moves it",
            format!(
                "{} {}",
                air.number(tr.airflow_per_percent_travel_m_per_s, 1),
                air.symbol()
            ),
        ),
        (
            "comparator offset adds",
            match tr.offset_uncertainty_m_per_s {
                Some(u) => format!("± {} {}", air.number(u, 1), air.symbol()),
                None => "— (the sense voltage does not move with airflow here)".to_string(),
            },
        ),
        ("non-inverting input (+)", tr.non_inverting_input.clone()),
        ("inverting input (−)", tr.inverting_input.clone()),
    ];
    let mut trip_lines = trip_lines.to_vec();
    if let Some(m) = &tr.model_spread_m_per_s {
        let each: Vec<String> = m
            .by_rule
            .iter()
            .map(|(rule, u)| match u {
                Some(u) => format!("{rule} {}", air.number(*u, 1)),
                None => format!("{rule} never"),
            })
            .collect();
        trip_lines.push((
            "model spread",
            format!(
                "{}–{} {} over the mixing rules ({}; the design uses {})",
                air.number(m.min, 1),
                air.number(m.max, 1),
                air.symbol(),
                each.join(", "),
                m.chosen
            ),
        ));
    }
    if let Some(s) = &tr.support_loss {
        trip_lines.push((
            "supports take",
            format!(
                "{:.1} % of the loss in still air, {:.1} % at the trip airflow (fin model; cold length {:.2} mm and {:.2} mm)",
                100.0 * s.share_still_air,
                100.0 * s.share_at_trip,
                s.cold_length_still_air_mm,
                s.cold_length_at_trip_mm
            ),
        ));
    }
    key_values(&mut out, &trip_lines);
    out.push_str(&wrap(&air.prose(&tr.hysteresis_note), "  ", "  ", width));

    heading(&mut out, "Bill of values");
    let mut t = Table::new(&["ref", "function", "part", "value", "exact", "rating"]);
    for v in &r.values {
        let exact = match (v.exact, v.value_ohm, v.value_a, v.value_f) {
            (Some(x), Some(_), _, _) => eng(x, "Ω"),
            (Some(x), _, Some(_), _) => eng(x, "A"),
            (Some(x), _, _, Some(_)) => eng(x, "F"),
            _ => String::new(),
        };
        let rating = match v.rating_w {
            Some(w) if v.rating.is_empty() => crate::circuit::ratings::bench_power_text(w),
            Some(w) => format!(
                "{} · {}",
                crate::circuit::ratings::bench_power_text(w),
                v.rating
            ),
            None => v.rating.clone(),
        };
        let series = if v.e_series.is_empty() {
            String::new()
        } else {
            format!(" ({})", v.e_series)
        };
        t.push_with_note(
            vec![
                v.designator.clone(),
                v.function.clone(),
                v.part.clone(),
                format!("{}{}", v.text, series),
                exact,
                rating,
            ],
            air.prose(&v.reason),
        );
    }
    t.render(&mut out, "  ", "llllll", width);

    if !r.nodes.is_empty() {
        heading(&mut out, "Connections");
        let mut t = Table::new(&["node", "what it is", "pins on it"]);
        for n in &r.nodes {
            t.push(vec![n.name.clone(), n.what.clone(), n.parts.join(", ")]);
        }
        t.render(&mut out, "  ", "lll", width);
    }

    if !r.drift.is_empty() {
        heading(&mut out, "Trip-point drift");
        let compensated = r.compensation.kind != "none";
        let mut head = vec![
            "condition",
            "ambient",
            "element rail",
            "ref rail",
            "trips at",
            "releases at",
            "shift",
        ];
        if compensated {
            head.push("uncompensated");
        }
        head.push("note");
        let mut t = Table::new(&head);
        let mut corners = Vec::new();
        for d in &r.drift {
            let mut condition = d.condition.clone();
            if d.corner != "nominal parts" || d.offset_v != 0.0 {
                corners.push(format!(
                    "[{}] {}{}",
                    corners.len() + 1,
                    d.corner,
                    if d.offset_v != 0.0 {
                        format!(
                            ", comparator offset drift {} mV",
                            crate::analysis::corners::signed_mv(d.offset_v)
                        )
                    } else {
                        String::new()
                    }
                ));
                condition.push_str(&format!(" [{}]", corners.len()));
            }
            let mut cells = vec![
                condition,
                format!("{:.1} °C", d.ambient_c),
                format!("{:.3} V", d.element_rail_v),
                format!("{:.3} V", d.reference_rail_v),
                d.trip_airflow_m_per_s.map_or("—".into(), |u| air.text(u)),
                d.release_airflow_m_per_s
                    .map_or("—".into(), |u| air.text(u)),
                d.shift_m_per_s.map_or("—".into(), |u| {
                    format!("{}{}", crate::quantity::sign_of(u), air.text(u.abs()))
                }),
            ];
            if compensated {
                cells.push(
                    match (d.uncompensated_trip_airflow_m_per_s, &d.uncompensated_note) {
                        (Some(u), _) => air.text(u),
                        (None, Some(n)) => air.prose(n),
                        (None, None) => "—".into(),
                    },
                );
            }
            cells.push(air.prose(&d.note));
            t.push(cells);
        }
        t.render(
            &mut out,
            "  ",
            if compensated { "lrrrrrrrl" } else { "lrrrrrrl" },
            width,
        );
        for c in &corners {
            out.push_str(&wrap(c, "  ", "      ", width));
        }
        let c = &r.compensation;
        let span = |x: Option<f64>| {
            x.map_or("— (some condition never switches)".to_string(), |u| {
                air.text(u)
            })
        };
        out.push_str(&wrap(
            &format!("Compensation: {}", air.prose(&c.why)),
            "  ",
            "    ",
            width,
        ));
        for n in &c.notes {
            out.push_str(&wrap(&air.prose(n), "  ", "    ", width));
        }
        if compensated {
            let ratio = match (c.drift_span_m_per_s, c.uncompensated_drift_span_m_per_s) {
                (Some(a), Some(b)) if a > 0.0 && b >= 1.05 * a => {
                    format!(" ({:.0}× narrower)", b / a)
                }
                (Some(_), Some(_)) => " (no narrower: here the compensation does not help)".into(),
                _ => String::new(),
            };
            out.push_str(&wrap(
                &format!(
                    "Drift span over ambient and supply (nominal parts): {} compensated, {} uncompensated{ratio}.",
                    span(c.drift_span_m_per_s),
                    span(c.uncompensated_drift_span_m_per_s)
                ),
                "  ",
                "    ",
                width,
            ));
        }
    }

    if r.supply.idle_a > 0.0 {
        heading(&mut out, "Supply");
        let mut lines = vec![
            ("input current, idle", eng(r.supply.idle_a, "A")),
            ("input current, tripped", eng(r.supply.tripped_a, "A")),
        ];
        if let Some(tj) = r.supply.regulator_junction_c {
            lines.push((
                "regulator dissipation (worst)",
                eng(r.supply.regulator_dissipation_w.unwrap_or(0.0), "W"),
            ));
            lines.push(("regulator junction (worst)", format!("{tj:.1} °C")));
        }
        key_values(&mut out, &lines);
    }

    heading(&mut out, "Design checks (failing first)");
    let failing = r.checks.iter().filter(|c| !c.passed);
    let passing = r.checks.iter().filter(|c| c.passed);
    for c in failing.chain(passing) {
        let mut text = format!(
            "{} {} [{}] — {}",
            if c.passed { "pass" } else { "FAIL" },
            c.name,
            c.id,
            air.prose(&c.detail)
        );
        if !c.condition.is_empty() {
            text.push_str(&format!(" (worst at: {})", air.prose(&c.condition)));
        }
        out.push_str(&wrap(&text, "  ", "       ", width));
    }
    if !r.diagnostics.is_empty() {
        heading(&mut out, "Solver diagnostics (not design checks)");
        for c in &r.diagnostics {
            let text = format!(
                "{} {} [{}] — {}",
                if c.passed { "ok  " } else { "BAD " },
                c.name,
                c.id,
                air.prose(&c.detail)
            );
            out.push_str(&wrap(&text, "  ", "       ", width));
        }
    }

    if !r.warnings.is_empty() {
        heading(&mut out, "Warnings");
        for w in r.warnings.iter().map(|w| air.prose(w)) {
            out.push_str(&wrap(&w, "  ? ", "    ", width));
        }
    }

    heading(&mut out, "Cautions");
    for c in r.cautions.iter().map(|c| air.prose(c)) {
        out.push_str(&wrap(&c, "  ! ", "    ", width));
    }
    if !r.assumptions.is_empty() {
        heading(&mut out, "Assumed (the file left these open)");
        for a in r.assumptions.iter().map(|a| air.prose(a)) {
            out.push_str(&wrap(&a, "  - ", "    ", width));
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::wrap;

    #[test]
    fn wraps_at_word_boundaries_with_hanging_indent() {
        let w = wrap("one two three four five", "- ", "  ", 10);
        assert_eq!(w, "- one two\n  three\n  four\n  five\n");
        // A word longer than the width stands on its own line.
        assert_eq!(wrap("abcdefghijkl x", "", "", 5), "abcdefghijkl\nx\n");
    }
}
