//! The outputs of a run are one set (issue 9): the manifest `drydig-run.json` names every file
//! with its FNV-1a hash; a killed run leaves the earlier set whole and no staging folder behind
//! once the next run has cleaned up; files of an earlier run that the new one does not write are
//! removed; an input is never overwritten; files get the umask's mode.
//!
//! FNV-1a 64: Fowler, Noll & Vo, offset basis 0xcbf29ce484222325, prime 0x100000001b3.

use std::os::unix::fs::PermissionsExt;
use std::path::{Path, PathBuf};
use std::process::{Command, Output, Stdio};
use std::time::Instant;

fn bin() -> &'static str {
    env!("CARGO_BIN_EXE_drydig")
}

fn drydig(args: &[&str]) -> Output {
    Command::new(bin())
        .args(args)
        .output()
        .expect("drydig runs")
}

fn layout(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name)
}

/// The SHA-256 of a file as GNU coreutils' `sha256sum` prints it (the tool outside drydig a
/// site engineer checks a manifest with).
fn sha256sum(path: &Path) -> String {
    let out = Command::new("sha256sum")
        .arg(path)
        .output()
        .expect("sha256sum (coreutils) runs");
    assert!(out.status.success(), "sha256sum {}", path.display());
    String::from_utf8_lossy(&out.stdout)
        .split_whitespace()
        .next()
        .unwrap_or_default()
        .to_string()
}

/// The folder holds exactly the set its manifest names, each file with its hash.
fn assert_whole(dir: &Path) {
    let m: serde_json::Value =
        serde_json::from_slice(&std::fs::read(dir.join("drydig-run.json")).expect("manifest"))
            .expect("manifest is JSON");
    let mut listed: Vec<String> = vec!["drydig-run.json".into()];
    for f in m["files"].as_array().unwrap() {
        let name = f["name"].as_str().unwrap();
        assert!(dir.join(name).exists(), "{name} missing");
        assert_eq!(
            sha256sum(&dir.join(name)),
            f["sha256"].as_str().unwrap(),
            "{name} is not the manifest's"
        );
        listed.push(name.to_string());
    }
    let mut present: Vec<String> = std::fs::read_dir(dir)
        .unwrap()
        .flatten()
        .map(|e| e.file_name().to_string_lossy().to_string())
        .collect();
    present.sort();
    listed.sort();
    assert_eq!(present, listed, "files beside the set");
}

fn no_staging_left(parent: &Path) {
    for e in std::fs::read_dir(parent).unwrap().flatten() {
        let n = e.file_name().to_string_lossy().to_string();
        assert!(!n.starts_with(".drydig-"), "left behind: {n}");
    }
}

#[test]
fn a_run_writes_a_whole_set_with_its_manifest_and_ordinary_modes() {
    let d = tempfile::tempdir().unwrap();
    let out = d.path().join("out");
    let f = layout("deep_shaft.toml");
    let cmd = format!(
        "umask 022; exec '{}' check '{}' -o '{}'",
        bin(),
        f.display(),
        out.display()
    );
    let run = Command::new("sh").arg("-c").arg(cmd).output().unwrap();
    assert_eq!(
        run.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&run.stderr)
    );
    assert_whole(&out);
    no_staging_left(d.path());
    // Umask 022: files 0644, the folder 0755 (POSIX open(2)/mkdir(2) with mode 0666/0777).
    let mode = std::fs::metadata(out.join("summary.json"))
        .unwrap()
        .permissions()
        .mode();
    assert_eq!(mode & 0o777, 0o644);
    let mode = std::fs::metadata(&out).unwrap().permissions().mode();
    assert_eq!(mode & 0o777, 0o755);
    let m: serde_json::Value =
        serde_json::from_slice(&std::fs::read(out.join("drydig-run.json")).unwrap()).unwrap();
    let input = &m["inputs"][0];
    assert_eq!(input["sha256"].as_str().unwrap(), sha256sum(&f));
}

#[test]
fn the_drawings_a_design_file_reads_are_inputs_in_the_manifest() {
    let d = tempfile::tempdir().unwrap();
    let out = d.path().join("out");
    let f = layout("riverside_basement_drawing.toml");
    let run = drydig(&["check", f.to_str().unwrap(), "-o", out.to_str().unwrap()]);
    assert!(
        run.status.code().is_some_and(|c| c == 0 || c == 3),
        "{}",
        String::from_utf8_lossy(&run.stderr)
    );
    let m: serde_json::Value =
        serde_json::from_slice(&std::fs::read(out.join("drydig-run.json")).unwrap()).unwrap();
    let dxf = layout("drawings/riverside_site.dxf");
    let listed = m["inputs"]
        .as_array()
        .unwrap()
        .iter()
        .find(|i| i["path"].as_str().unwrap().ends_with("riverside_site.dxf"))
        .unwrap_or_else(|| panic!("the drawing is not among the inputs: {}", m["inputs"]));
    assert_eq!(listed["sha256"].as_str().unwrap(), sha256sum(&dxf));
}

#[test]
fn another_sites_files_are_replaced_not_left_beside_the_new_ones() {
    let d = tempfile::tempdir().unwrap();
    let out = d.path().join("out");
    let o = out.to_str().unwrap();
    let a = layout("riverside_basement.toml");
    let b = layout("deep_shaft.toml");
    let run = drydig(&["design", a.to_str().unwrap(), "-o", o]);
    assert!(
        matches!(run.status.code(), Some(0 | 3)),
        "{}",
        String::from_utf8_lossy(&run.stderr)
    );
    assert_whole(&out);
    let run = drydig(&[
        "sweep",
        b.to_str().unwrap(),
        "--from",
        "4",
        "--to",
        "6",
        "-o",
        o,
    ]);
    assert!(
        matches!(run.status.code(), Some(0 | 3)),
        "{}",
        String::from_utf8_lossy(&run.stderr)
    );
    assert_whole(&out);
    assert!(
        !out.join("wells.csv").exists(),
        "the earlier site's wells.csv is gone"
    );
    no_staging_left(d.path());
}

#[test]
fn a_folder_with_the_users_own_files_keeps_them() {
    let d = tempfile::tempdir().unwrap();
    let work = d.path().join("work");
    std::fs::create_dir(&work).unwrap();
    let design = work.join("shaft.toml");
    std::fs::copy(layout("deep_shaft.toml"), &design).unwrap();
    std::fs::write(work.join("notes.txt"), "mine").unwrap();
    let w = work.to_str().unwrap();
    let run = drydig(&["check", design.to_str().unwrap(), "-o", w]);
    assert_eq!(
        run.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&run.stderr)
    );
    assert!(work.join("map.svg").exists());
    let run = drydig(&[
        "sweep",
        design.to_str().unwrap(),
        "--from",
        "4",
        "--to",
        "5",
        "-o",
        w,
    ]);
    assert!(matches!(run.status.code(), Some(0 | 3)));
    assert_eq!(
        std::fs::read_to_string(work.join("notes.txt")).unwrap(),
        "mine"
    );
    assert!(design.exists());
    assert!(work.join("sweep.csv").exists());
    assert!(
        !work.join("map.svg").exists(),
        "the check's files not in the sweep's set are removed"
    );
    no_staging_left(d.path());
}

#[test]
fn an_output_that_would_overwrite_an_input_is_refused() {
    let d = tempfile::tempdir().unwrap();
    let work = d.path().join("site");
    std::fs::create_dir(&work).unwrap();
    let csv = "name,x,y,rate_l_per_s\nW1,-5,10,2\nW2,35,10,2\nW3,15,-5,2\nW4,15,25,2\n";
    std::fs::write(work.join("wells.csv"), csv).unwrap();
    let design = work.join("pit.toml");
    let body = std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/bad_inputs/negative_margin.toml"),
    )
    .unwrap()
    .replace("\"-0.5 m\"", "\"0.5 m\"")
        + "\n[layout]\nkind = \"csv\"\nfile = \"wells.csv\"\n";
    std::fs::write(&design, body).unwrap();
    let run = drydig(&[
        "check",
        design.to_str().unwrap(),
        "-o",
        work.to_str().unwrap(),
    ]);
    let err = String::from_utf8_lossy(&run.stderr);
    assert_eq!(run.status.code(), Some(2), "{err}");
    assert!(
        err.contains("overwrite") && err.contains("wells.csv"),
        "{err}"
    );
    assert_eq!(
        std::fs::read_to_string(work.join("wells.csv")).unwrap(),
        csv
    );
    assert!(!work.join("summary.json").exists());
    // The same with --wells naming the file the run would write.
    let out = d.path().join("o");
    std::fs::create_dir(&out).unwrap();
    std::fs::write(out.join("wells.csv"), csv).unwrap();
    let shaft = layout("deep_shaft.toml");
    let run = drydig(&[
        "check",
        shaft.to_str().unwrap(),
        "--wells",
        out.join("wells.csv").to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
    ]);
    assert_eq!(run.status.code(), Some(2));
    assert_eq!(std::fs::read_to_string(out.join("wells.csv")).unwrap(), csv);
}

#[test]
fn a_run_killed_at_any_moment_leaves_the_earlier_set_whole() {
    let d = tempfile::tempdir().unwrap();
    let out = d.path().join("out");
    let o = out.to_str().unwrap();
    let f = layout("deep_shaft.toml");
    let args = ["check", f.to_str().unwrap(), "-o", o];
    let start = Instant::now();
    assert_eq!(drydig(&args).status.code(), Some(0));
    let full = start.elapsed();
    assert_whole(&out);
    // Kill at 16 moments spread over the run, more of them near its end where the files go out.
    for k in 0..16u32 {
        let frac = 0.3 + 0.75 * f64::from(k) / 15.0;
        let mut child = Command::new(bin())
            .args(args)
            .stdout(Stdio::null())
            .stderr(Stdio::null())
            .spawn()
            .unwrap();
        std::thread::sleep(full.mul_f64(frac));
        let _ = child.kill();
        let _ = child.wait();
        // Whatever moment it died, the folder is a whole set (the earlier one or the new one),
        // or — between the two renames of the fallback — about to be put back by the next run.
        if out.exists() {
            assert_whole(&out);
        }
    }
    assert_eq!(drydig(&args).status.code(), Some(0));
    assert_whole(&out);
    no_staging_left(d.path());
}
