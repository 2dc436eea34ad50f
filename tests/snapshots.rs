//! Every bundled example's full text report, snapshot-tested with insta.
//! After an intended change: `INSTA_UPDATE=always cargo test --test
//! snapshots`, then review the diff under tests/snapshots/.

use draftwire::analysis::size;
use draftwire::design::parse_design;
use draftwire::render;
use std::path::Path;

fn examples() -> Vec<String> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
    let mut v: Vec<String> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .filter(|n| n.ends_with(".toml"))
        .collect();
    v.sort();
    v
}

#[test]
fn example_reports_match_their_snapshots() {
    for name in examples() {
        let file = format!("examples/{name}");
        let text =
            std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join(&file)).unwrap();
        let design = parse_design(&file, &text).unwrap();
        let rendered = match size(&design) {
            Ok(report) => render::text::render(&report, &file),
            Err(e) => format!("design failed: {e}\n"),
        };
        insta::assert_snapshot!(name.trim_end_matches(".toml").to_string(), rendered);
    }
}
