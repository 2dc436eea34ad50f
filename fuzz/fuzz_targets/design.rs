//! Fuzz the design reader and, on what it accepts, `size` and the
//! renderers: no input may panic, and no accepted design may give a report
//! with a non-finite figure that the guard does not flag.
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let Ok(text) = std::str::from_utf8(data) else {
        return;
    };
    let Ok(design) = draftwire::design::parse_design("fuzz.toml", text) else {
        return;
    };
    let report = match draftwire::analysis::size(&design) {
        Ok(r) => r,
        Err(e) => draftwire::analysis::unsized_report(&design, &e),
    };
    let bad = draftwire::render::guard::non_finite_fields(&report);
    if !bad.is_empty() {
        assert!(
            report.checks.iter().any(|c| c.id == "internal-non-finite"),
            "non-finite figures not flagged: {bad:?}"
        );
    }
    let _ = draftwire::render::text::render(&report, "fuzz.toml");
    let _ = draftwire::render::json::render(&report);
});
