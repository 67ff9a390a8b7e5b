//! The file set `layloft tooling` leaves in its folder, as a user meets it: the manifest and its
//! checksums, the STL headers, the files of an earlier run, and the cores either side of a web
//! that ends inside the span. Projects: copies of the invented mine-fan demo with a second,
//! invented web.
//!
//! Sources: SHA-256 as FIPS PUB 180-4 defines it (the digests are recomputed here from the files
//! on disk by the library's digest, itself checked against the NIST examples in its unit tests);
//! the binary STL layout (80-byte header, facet count, 50 bytes a facet) as the format's common
//! description gives it (from memory); each STL read back with `stl_io`, which shares no code
//! with the writer.

use std::path::{Path, PathBuf};

use crate::support_stl::read_stl_file;
use serde_json::Value;

fn files_in(dir: &Path) -> Vec<String> {
    let mut names: Vec<String> = std::fs::read_dir(dir)
        .unwrap()
        .filter_map(|e| e.ok())
        .map(|e| e.file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    names
}

/// A copy of the mine-fan demo, with a rear web from the root to r = 0.70 m when `rear`.
fn demo(dir: &Path, rear: bool) -> PathBuf {
    crate::support_run::copy_demo("mine-fan", dir);
    if rear {
        let toml = dir.join("blade.toml");
        let text = std::fs::read_to_string(&toml).unwrap().replace(
            "[[point_mass]]",
            "[[web]]\nname = \"rear\"\nchord_frac = 0.62\nr_end_m = 0.70\n\n[[point_mass]]",
        );
        std::fs::write(&toml, text).unwrap();
        let plies = dir.join("plies.csv");
        let mut text = std::fs::read_to_string(&plies).unwrap();
        text.push_str("rear-1,glass-biax,45,0.40,0.70,web:rear,,\n");
        text.push_str("rear-2,glass-biax,-45,0.40,0.70,web:rear,,\n");
        std::fs::write(&plies, text).unwrap();
    }
    dir.join("blade.toml")
}

fn run(project: &Path, out: &Path) -> (Value, String, String) {
    let (code, stdout, stderr) = crate::cli_tooling::coarse_tooling(project, out, &["--json"]);
    assert_eq!(code, Some(0), "{stderr}");
    let json = serde_json::from_str(&stdout).unwrap_or_else(|e| panic!("{e}: {stdout}"));
    (json, stdout, stderr)
}

fn sha256_file(path: &Path) -> String {
    layloft::mesh::sha256_hex(&std::fs::read(path).unwrap())
}

fn x_range(path: &Path) -> [f64; 2] {
    let mut f = std::fs::File::open(path).unwrap();
    let mesh = stl_io::read_stl(&mut f).unwrap();
    mesh.vertices.iter().fold([f64::INFINITY, f64::NEG_INFINITY], |r, v| {
        [r[0].min(v[0] as f64), r[1].max(v[0] as f64)]
    })
}

#[test]
fn a_web_removed_leaves_exactly_the_new_set_and_files_the_tool_did_not_write() {
    let dir = tempfile::tempdir().unwrap();
    let (two, one) = (dir.path().join("two"), dir.path().join("one"));
    std::fs::create_dir_all(&two).unwrap();
    std::fs::create_dir_all(&one).unwrap();
    let out = dir.path().join("meshes");
    let (json, _, _) = run(&demo(&two, true), &out);

    // Two webs, the rear one ending at r = 0.70 m: the front cell runs root to tip; the two cells
    // behind the main web end at the rear web's bulkhead and one cell runs on beyond it.
    let cores: Vec<&str> = json["parts"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| p["name"].as_str().unwrap())
        .filter(|n| n.starts_with("core"))
        .collect();
    assert_eq!(cores, ["core-1", "core-2", "core-3", "core-4"]);
    let x = |n: &str| x_range(&out.join(format!("{n}.stl")));
    let (front, mid, back, beyond) = (x("core-1"), x("core-2"), x("core-3"), x("core-4"));
    // Root and tip spheres at 401 and 898.5 mm less the end laminate (blade.toml).
    assert!(front[0] < 402.0 && front[1] > 890.0, "the front core crosses r = 700 mm: {front:?}");
    for (name, r) in [("core-2", mid), ("core-3", back)] {
        assert!(r[1] < 700.0 && r[1] > 690.0, "{name} ends at the bulkhead: {r:?}");
    }
    assert!(beyond[0] > 700.0 && beyond[0] < 710.0 && beyond[1] > 890.0, "{beyond:?}");

    // Manifest: every file of the set, with the size and digest of the bytes on disk.
    let manifest: Value =
        serde_json::from_str(&std::fs::read_to_string(out.join("tooling-manifest.json")).unwrap())
            .unwrap();
    let listed: Vec<String> = manifest["files"]
        .as_array()
        .unwrap()
        .iter()
        .map(|f| f["file"].as_str().unwrap().to_string())
        .collect();
    let mut on_disk = files_in(&out);
    on_disk.retain(|f| f != "tooling-manifest.json" && f != ".layloft-set");
    let mut sorted = listed.clone();
    sorted.sort();
    assert_eq!(sorted, on_disk);
    for f in manifest["files"].as_array().unwrap() {
        let path = out.join(f["file"].as_str().unwrap());
        assert_eq!(f["size_bytes"].as_u64().unwrap(), std::fs::metadata(&path).unwrap().len());
        assert_eq!(f["sha256"].as_str().unwrap(), sha256_file(&path), "{}", path.display());
    }
    assert_eq!(manifest["stl_unit"], "mm");
    // Binary STL header: the part's name and unit, never "solid" at the start.
    let bytes = std::fs::read(out.join("core-3.stl")).unwrap();
    let header = String::from_utf8_lossy(&bytes[..80]);
    assert!(header.starts_with("layloft part core-3, unit mm"), "{header}");
    let count = u32::from_le_bytes([bytes[80], bytes[81], bytes[82], bytes[83]]) as usize;
    assert_eq!(bytes.len(), 84 + 50 * count);
    assert!(read_stl_file(&out.join("core-3.stl")).closed_oriented);

    // Files the tool did not write: one of the user's, and an STL the manifest does not list.
    std::fs::write(out.join("notes.txt"), "shop notes").unwrap();
    std::fs::write(out.join("core-9.stl"), "not ours").unwrap();
    let (json, _, stderr) = run(&demo(&one, false), &out);
    let mut want: Vec<String> = [
        "core-1.stl",
        "core-2.stl",
        "shell.stl",
        "mould-upper.stl",
        "mould-lower.stl",
        "mould-upper-machining.stl",
        "mould-lower-machining.stl",
        "mould-root-end.stl",
        "mould-root-end-machining.stl",
        "mould-tip-end.stl",
        "mould-tip-end-machining.stl",
        "tooling-summary.json",
        "tooling-exploded.svg",
        "tooling-manifest.json",
        "notes.txt",
        "core-9.stl",
        ".layloft-set",
    ]
    .iter()
    .map(|s| s.to_string())
    .collect();
    // The two cores' casting moulds (halves and end pieces, each also machined).
    for core in ["core-1", "core-2"] {
        for part in ["upper", "lower", "root-end", "tip-end"] {
            want.push(format!("{core}-cast-{part}.stl"));
            want.push(format!("{core}-cast-{part}-machining.stl"));
        }
    }
    want.sort();
    assert_eq!(files_in(&out), want);
    // Removed: core-3 and core-4 and the files of their casting moulds, exactly the files of
    // the earlier manifest that belong to those cores.
    let mut gone: Vec<String> = listed
        .iter()
        .filter(|f| {
            ["core-3.", "core-4.", "core-3-cast-", "core-4-cast-"].iter().any(|p| f.starts_with(p))
        })
        .cloned()
        .collect();
    gone.sort();
    assert!(gone.contains(&"core-3.stl".to_string()) && gone.contains(&"core-4.stl".to_string()));
    assert!(gone.len() > 2, "the removed cores' casting moulds are among the removed files");
    let mut removed: Vec<String> = json["earlier_files"]["removed"]
        .as_array()
        .unwrap()
        .iter()
        .map(|f| f.as_str().unwrap().to_string())
        .collect();
    removed.sort();
    assert_eq!(removed, gone);
    assert!(
        stderr.contains(&format!(
            "removed {} file(s) of the earlier run that the new set no longer holds: ",
            gone.len()
        )) && stderr.contains("core-3.stl")
            && stderr.contains("core-4.stl"),
        "{stderr}"
    );
    assert_eq!(std::fs::read_to_string(out.join("core-9.stl")).unwrap(), "not ours");
}

#[test]
fn a_changed_file_of_the_earlier_run_is_left_in_place_with_a_warning() {
    let dir = tempfile::tempdir().unwrap();
    let (two, one) = (dir.path().join("two"), dir.path().join("one"));
    std::fs::create_dir_all(&two).unwrap();
    std::fs::create_dir_all(&one).unwrap();
    let out = dir.path().join("meshes");
    run(&demo(&two, true), &out);
    std::fs::write(out.join("core-4.stl"), "edited by hand").unwrap();
    let (json, stdout, stderr) = run(&demo(&one, false), &out);
    assert!(!out.join("core-3.stl").exists());
    assert!(out.join("core-4.stl").exists());
    assert_eq!(json["earlier_files"]["left_in_place"][0]["file"], "core-4.stl");
    assert!(stderr.contains("core-4.stl belonged to the earlier run"), "{stderr}");
    assert!(!stdout.is_empty());
}

#[test]
fn a_mould_material_gives_the_mould_masses() {
    // Mass = volume × density (definition), with the demo's al-6082 record at 2700 kg/m³.
    let dir = tempfile::tempdir().unwrap();
    let toml = demo(dir.path(), false);
    let text = std::fs::read_to_string(&toml).unwrap().replace(
        "core_alloy = \"bi58sn42\"",
        "core_alloy = \"bi58sn42\"\nmould_material = \"al-6082\"",
    );
    std::fs::write(&toml, text).unwrap();
    let (json, stdout, _) = run(&toml, &dir.path().join("out"));
    for p in json["parts"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|p| p["name"].as_str().unwrap().starts_with("mould"))
    {
        let (v, m) = (p["volume_m3"].as_f64().unwrap(), p["mass_kg"].as_f64().unwrap());
        assert!((m / (v * 2700.0) - 1.0).abs() < 1e-12, "{p}");
        assert!(p["mass_basis"].as_str().unwrap().contains("al-6082"));
    }
    assert!(!stdout.is_empty());
}

/// The cores are lofted beside the mould, the casting moulds and the checks of the parts run
/// side by side, and a large mesh's self-intersection test on all cores: the files must not
/// depend on the number of threads, to the byte (a law of the method: each part's arithmetic
/// is the same on any thread, and the results are taken in the order one thread makes them).
/// A copy of the mine-fan demo with a second web (three cores) at 0.3 mm.
#[test]
fn the_tooling_files_do_not_depend_on_the_number_of_threads() {
    let dir = tempfile::tempdir().unwrap();
    let project = demo(dir.path(), true);
    let run_on = |threads: &str| {
        let out = dir.path().join(format!("out-{threads}"));
        let status = std::process::Command::new(env!("CARGO_BIN_EXE_layloft"))
            .env("LAYLOFT_THREADS", threads)
            .args(["tooling", &project.to_string_lossy(), "--out", &out.to_string_lossy()])
            .args(["--tolerance-mm", "0.3", "--quiet"])
            .output()
            .unwrap();
        assert!(status.status.success(), "{}", String::from_utf8_lossy(&status.stderr));
        out
    };
    let (one, two) = (run_on("1"), run_on("2"));
    let names = files_in(&one);
    assert_eq!(names, files_in(&two));
    let stl: Vec<&String> = names.iter().filter(|n| n.ends_with(".stl")).collect();
    assert!(stl.len() >= 10, "{names:?}");
    for name in stl {
        let (a, b) =
            (std::fs::read(one.join(name)).unwrap(), std::fs::read(two.join(name)).unwrap());
        assert!(a == b, "{name} differs between one thread and two");
    }
}

#[test]
fn a_core_sealed_between_bulkheads_is_warned_of_and_named_above_the_verdict() {
    // The rear web of `demo` moved inside the span, from r = 0.55 to 0.75 m: behind the main
    // web, the cells between its two bulkheads reach neither end of the blade, so their alloy
    // cannot leave the shell through a print. That stood only as a line in the summary, under a
    // melting check that said PASS; it is now a warning and a line of its own above the
    // verdict. The melting check (temperatures) still passes: status 0.
    let dir = tempfile::tempdir().unwrap();
    let project = demo(dir.path(), true);
    let text = std::fs::read_to_string(&project).unwrap();
    let text = text.replace("r_end_m = 0.70", "r_start_m = 0.55\nr_end_m = 0.75");
    std::fs::write(&project, text).unwrap();
    let plies = dir.path().join("plies.csv");
    let text = std::fs::read_to_string(&plies)
        .unwrap()
        .replace(",0.40,0.70,web:rear", ",0.55,0.75,web:rear");
    std::fs::write(&plies, text).unwrap();
    let (code, stdout, stderr) =
        crate::cli_tooling::coarse_tooling(&project, &dir.path().join("out"), &[]);
    assert_eq!(code, Some(0), "{stderr}");
    assert!(stderr.contains("is sealed between bulkheads"), "{stderr}");
    let last: Vec<&str> = stdout.lines().rev().take(2).collect();
    assert_eq!(last[0], "Core-alloy melting check: PASS", "{stdout}");
    assert!(last[1].starts_with("Core drainage: core-") && last[1].contains("sealed"), "{stdout}");
}
