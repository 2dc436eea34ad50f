//! Every SVG the examples produce, rasterised with a real renderer (resvg):
//! the image is not blank and each expected series is present, found by
//! its fixed colour.

use assert_cmd::Command;
use resvg::tiny_skia::{Pixmap, Transform};
use resvg::usvg::{Options, Tree};
use std::path::Path;

fn draftwire() -> Command {
    let mut c = Command::cargo_bin("draftwire").unwrap();
    c.env_remove("RUST_BACKTRACE");
    c
}

/// Rasterise an SVG; (pixels that are not white, pixels near each colour).
fn raster(svg: &str, colours: &[(u8, u8, u8)], png: Option<&str>) -> (usize, Vec<usize>) {
    let tree = Tree::from_str(svg, &Options::default()).expect("a valid SVG");
    let size = tree.size().to_int_size();
    let mut pixmap = Pixmap::new(size.width(), size.height()).unwrap();
    resvg::render(&tree, Transform::default(), &mut pixmap.as_mut());
    if let Some(p) = png {
        let _ = pixmap.save_png(p);
    }
    let data = pixmap.data();
    let mut ink = 0;
    let mut found = vec![0; colours.len()];
    for px in data.chunks(4) {
        let (r, g, b, a) = (px[0], px[1], px[2], px[3]);
        if a > 0 && (r, g, b) != (255, 255, 255) {
            ink += 1;
        }
        for (k, &(cr, cg, cb)) in colours.iter().enumerate() {
            let d = (r as i32 - cr as i32).abs()
                + (g as i32 - cg as i32).abs()
                + (b as i32 - cb as i32).abs();
            if a == 255 && d <= 12 {
                found[k] += 1;
            }
        }
    }
    (ink, found)
}

fn rgb(c: plotters::style::RGBColor) -> (u8, u8, u8) {
    (c.0, c.1, c.2)
}

fn svg_of(args: &[&str]) -> String {
    let out = draftwire().args(args).output().unwrap();
    assert!(
        out.status.code().unwrap() <= 1,
        "{args:?}: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8(out.stdout).unwrap()
}

fn dump(name: &str) -> Option<String> {
    std::env::var("DRAFTWIRE_PNG_DIR")
        .ok()
        .map(|d| format!("{d}/{name}.png"))
}

#[test]
fn every_example_draws_its_transfer_curve() {
    use draftwire::render::svg::{SECOND, SENSE, TRIP};
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
    for e in std::fs::read_dir(&dir).unwrap() {
        let p = e.unwrap().path();
        if p.extension().is_none_or(|x| x != "toml") {
            continue;
        }
        let svg = svg_of(&["size", "--format", "svg", p.to_str().unwrap()]);
        let name = p.file_stem().unwrap().to_string_lossy().to_string();
        let (ink, found) = raster(
            &svg,
            &[rgb(SENSE), rgb(TRIP), rgb(SECOND)],
            dump(&name).as_deref(),
        );
        assert!(ink > 10_000, "{name}: nearly blank ({ink} px)");
        for (k, n) in found.iter().enumerate() {
            assert!(*n > 50, "{name}: series {k} missing ({n} px)");
        }
    }
}

#[test]
fn spread_and_sweep_draw_their_series() {
    use draftwire::render::svg::{RELEASE, SENSE, TRIP};
    let ex = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples/server-cabinet-airflow.toml");
    let ex = ex.to_str().unwrap();
    let svg = svg_of(&["spread", "--format", "svg", "--trials", "2000", ex]);
    let (ink, found) = raster(&svg, &[rgb(SENSE), rgb(TRIP)], dump("spread").as_deref());
    assert!(
        ink > 10_000 && found[0] > 500 && found[1] > 50,
        "{ink} {found:?}"
    );
    let svg = svg_of(&[
        "sweep",
        ex,
        "detector.trip_airflow",
        "0.5 m/s",
        "1.5 m/s",
        "--points",
        "9",
        "--format",
        "svg",
    ]);
    let (ink, found) = raster(&svg, &[rgb(TRIP), rgb(RELEASE)], dump("sweep").as_deref());
    assert!(
        ink > 10_000 && found[0] > 50 && found[1] > 50,
        "{ink} {found:?}"
    );
}

/// Every example's schematic (`netlist --svg`) rasterises to a non-blank
/// 800 px wide picture with the symbols' ink and the nets' colour, and
/// names every part of the bill in a text element (the renderer here draws
/// no text, so names are checked in the SVG source; common practice).
#[test]
fn every_example_draws_its_schematic() {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
    for e in std::fs::read_dir(&dir).unwrap() {
        let p = e.unwrap().path();
        if p.extension().is_none_or(|x| x != "toml") {
            continue;
        }
        let name = p.file_stem().unwrap().to_string_lossy().to_string();
        let svg = svg_of(&["netlist", "--svg", p.to_str().unwrap()]);
        let tree = Tree::from_str(&svg, &Options::default()).expect("a valid SVG");
        assert_eq!(tree.size().width(), 800.0, "{name}");
        // The net dots are NET blue (#1f5fa8).
        let (ink, found) = raster(
            &svg,
            &[(0x1f, 0x5f, 0xa8)],
            dump(&format!("{name}-schematic")).as_deref(),
        );
        assert!(ink > 5_000, "{name}: nearly blank ({ink} px)");
        assert!(found[0] > 100, "{name}: no net dots ({} px)", found[0]);
        let json = svg_of(&["size", "--format", "json", p.to_str().unwrap()]);
        let v: serde_json::Value = serde_json::from_str(&json).unwrap();
        for row in v["values"].as_array().unwrap() {
            let d = row["designator"].as_str().unwrap();
            assert!(
                svg.contains(&format!(">{d}</text>")),
                "{name}: {d} not named in the schematic"
            );
        }
    }
}
