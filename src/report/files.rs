//! Writing the outputs of a run as one set.
//!
//! Every output is rendered in memory first. [`write_set`] then:
//!
//! 1. refuses any file that holds a non-finite number (`NaN`, `inf`) — an internal error, since
//!    validation keeps every input within bounds that keep the formulas finite;
//! 2. refuses (as bad input) an output that would overwrite an input the run read;
//! 3. cleans what an earlier, killed run of drydig left beside the output folder (a staging
//!    folder is removed; an earlier set moved aside and not yet replaced is put back);
//! 4. writes every file and a manifest, [`MANIFEST`] (the run, its inputs' hashes, its files'
//!    hashes), into a fresh staging folder `.drydig-stage-…` beside the output folder;
//! 5. puts the set in place: a new folder is renamed into place; a folder that holds only an
//!    earlier run's files (those its manifest names) is exchanged with the staging folder in one
//!    atomic step (Linux `renameat2(RENAME_EXCHANGE)`; elsewhere two renames, undone by step 3 of
//!    the next run if killed between them); a folder that holds other files too (the design's
//!    own folder) gets each file renamed into place, then the manifest, then the earlier run's
//!    files that this run does not write are removed; the earlier manifest is first marked
//!    `"complete": false`, so a kill half-way leaves no manifest vouching for a mixed set
//!    ([`verify_set`] checks a folder against its manifest).
//!
//! Files and folders are created with the process's umask (0666/0777 masked), like any file the
//! user makes. Hashes are FNV-1a 64-bit (Fowler, Noll & Vo), enough to tell a changed file.

use crate::input::error::InputError;
use crate::input::model::{LayoutKind, Model};
use anyhow::Context;
use std::path::{Path, PathBuf};

/// Name of the manifest written with every set.
pub const MANIFEST: &str = "drydig-run.json";
const STAGE: &str = ".drydig-stage-";
const OLD: &str = ".drydig-old-";

/// SHA-256 of `bytes` (FIPS 180-4), as 64 lower-case hex digits: what `sha256sum FILE` prints,
/// so anyone can check a file against the manifest.
pub fn sha256(bytes: &[u8]) -> String {
    use sha2::{Digest, Sha256};
    Sha256::digest(bytes)
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect()
}

/// Whether `text` holds a non-finite number as Rust, JSON or JavaScript would print it: `NaN`,
/// `inf` or `Infinity` as a whole word (so `info`, `Infirmary` pass).
pub fn has_non_finite(text: &[u8]) -> Option<&'static str> {
    for word in ["NaN", "inf", "Infinity"] {
        let w = word.as_bytes();
        let mut i = 0;
        while i + w.len() <= text.len() {
            if &text[i..i + w.len()] == w {
                let before = i == 0 || !text[i - 1].is_ascii_alphanumeric();
                let e = i + w.len();
                let after = e >= text.len() || !text[e].is_ascii_alphanumeric();
                if before && after {
                    return Some(word);
                }
            }
            i += 1;
        }
    }
    None
}

/// Refuse `text` (a file or the terminal text) when it holds a non-finite number: an internal
/// error (exit 1), never a silent `NaN` in an output.
pub fn ensure_finite(what: &str, text: &[u8]) -> anyhow::Result<()> {
    if let Some(word) = has_non_finite(text) {
        anyhow::bail!("internal error: {what} holds a non-finite number (\"{word}\"); nothing was written — please report this with the design file");
    }
    Ok(())
}

/// The input files a run of `model` reads: the design file, the drawings it names, a layout CSV,
/// and `--wells`.
pub fn inputs_of(model: &Model, wells_csv: Option<&Path>) -> Vec<PathBuf> {
    let mut v = vec![model.file.clone()];
    v.extend(model.drawings.iter().cloned());
    if let Some(LayoutKind::Csv { path }) = model.layout.as_ref().map(|l| &l.kind) {
        v.push(path.clone());
    }
    v.extend(wells_csv.map(Path::to_path_buf));
    v
}

/// Write `files` to `dir` as one set (no inputs to protect).
pub fn write_all(dir: &Path, files: &[(String, Vec<u8>)]) -> anyhow::Result<()> {
    write_set(dir, files, &[])
}

/// Write `files` to `dir` as one set, never over one of `inputs` (see the module docs).
pub fn write_set(
    dir: &Path,
    files: &[(String, Vec<u8>)],
    inputs: &[PathBuf],
) -> anyhow::Result<()> {
    for (name, bytes) in files {
        if name.is_empty()
            || name.contains(['/', '\\'])
            || name.starts_with('.')
            || name == MANIFEST
        {
            anyhow::bail!("internal error: output name {name:?} is not a plain file name");
        }
        ensure_finite(name, bytes)?;
    }
    let dir = if dir.as_os_str().is_empty() {
        Path::new(".")
    } else {
        dir
    };
    if dir.exists() && !dir.is_dir() {
        return Err(bad(
            dir,
            "the output folder is a file; give a folder with -o".into(),
        ));
    }
    refuse_inputs(dir, files, inputs)?;
    let abs =
        std::path::absolute(dir).with_context(|| format!("cannot resolve {}", dir.display()))?;
    let parent = abs
        .parent()
        .map_or_else(|| PathBuf::from("/"), Path::to_path_buf);
    let base = abs
        .file_name()
        .map_or_else(|| "out".to_string(), |n| n.to_string_lossy().to_string());
    std::fs::create_dir_all(&parent)
        .with_context(|| format!("cannot create {}", parent.display()))?;
    clean_stale(&parent, &base, &abs)?;

    let tag = format!(
        "{base}-{}-{}",
        std::process::id(),
        std::time::SystemTime::now()
            .duration_since(std::time::UNIX_EPOCH)
            .map_or(0, |d| d.as_nanos())
    );
    let stage = parent.join(format!("{STAGE}{tag}"));
    std::fs::create_dir(&stage).with_context(|| format!("cannot write in {}", parent.display()))?;
    let result = stage_and_place(&abs, &parent, &stage, &tag, files, inputs);
    if stage.exists() {
        let _ = std::fs::remove_dir_all(&stage);
    }
    result
}

fn bad(path: &Path, message: String) -> anyhow::Error {
    anyhow::Error::new(InputError {
        file: path.to_path_buf(),
        field: "-o".into(),
        line: None,
        message,
    })
}

/// An output that would land on an input is bad input (exit 2).
fn refuse_inputs(
    dir: &Path,
    files: &[(String, Vec<u8>)],
    inputs: &[PathBuf],
) -> anyhow::Result<()> {
    let canon: Vec<PathBuf> = inputs
        .iter()
        .filter_map(|p| p.canonicalize().ok())
        .collect();
    if let Ok(d) = dir.canonicalize() {
        for (name, _) in files
            .iter()
            .map(|(n, b)| (n.as_str(), b))
            .chain([(MANIFEST, &Vec::new())])
        {
            if let Ok(target) = d.join(name).canonicalize() {
                if canon.contains(&target) {
                    return Err(bad(
                        &target,
                        format!("the output {name} would overwrite this input of the run; give another output folder with -o"),
                    ));
                }
            }
        }
    }
    Ok(())
}

/// Files an earlier run's manifest in `dir` names.
fn manifest_files(dir: &Path) -> Option<Vec<String>> {
    let text = std::fs::read(dir.join(MANIFEST)).ok()?;
    let v: serde_json::Value = serde_json::from_slice(&text).ok()?;
    Some(
        v.get("files")?
            .as_array()?
            .iter()
            .filter_map(|f| f.get("name")?.as_str().map(String::from))
            .collect(),
    )
}

/// Whether a process with this id still runs (Linux `/proc`; elsewhere assumed gone).
fn alive(pid: &str) -> bool {
    pid.parse::<u32>()
        .is_ok_and(|p| p == std::process::id() || Path::new(&format!("/proc/{p}")).exists())
}

/// Remove staging folders of killed runs for this output folder; put back an earlier set that a
/// killed run moved aside.
fn clean_stale(parent: &Path, base: &str, out: &Path) -> anyhow::Result<()> {
    let Ok(entries) = std::fs::read_dir(parent) else {
        return Ok(());
    };
    for entry in entries.flatten() {
        let name = entry.file_name().to_string_lossy().to_string();
        for prefix in [STAGE, OLD] {
            let Some(rest) = name.strip_prefix(prefix).and_then(|r| r.strip_prefix(base)) else {
                continue;
            };
            let Some(pid) = rest.strip_prefix('-').and_then(|r| r.split('-').next()) else {
                continue;
            };
            if alive(pid) {
                continue;
            }
            if prefix == OLD && !out.exists() {
                std::fs::rename(entry.path(), out).with_context(|| {
                    format!("cannot restore the earlier outputs to {}", out.display())
                })?;
            } else {
                let _ = std::fs::remove_dir_all(entry.path());
            }
        }
    }
    Ok(())
}

fn stage_and_place(
    out: &Path,
    parent: &Path,
    stage: &Path,
    tag: &str,
    files: &[(String, Vec<u8>)],
    inputs: &[PathBuf],
) -> anyhow::Result<()> {
    for (name, bytes) in files {
        std::fs::write(stage.join(name), bytes).with_context(|| format!("cannot write {name}"))?;
    }
    let manifest = manifest(files, inputs);
    std::fs::write(stage.join(MANIFEST), &manifest).context("cannot write the manifest")?;

    if !out.exists() {
        return std::fs::rename(stage, out)
            .with_context(|| format!("cannot put the outputs in {}", out.display()));
    }
    let earlier = manifest_files(out);
    let entries: Vec<String> = std::fs::read_dir(out)
        .with_context(|| format!("cannot read {}", out.display()))?
        .flatten()
        .map(|e| e.file_name().to_string_lossy().to_string())
        .collect();
    let owned = entries
        .iter()
        .all(|e| e == MANIFEST || earlier.as_ref().is_some_and(|m| m.contains(e)));
    if owned {
        if exchange(stage, out).is_ok() {
            // `stage` now holds the earlier set; the caller removes it.
            return Ok(());
        }
        let old = parent.join(format!("{OLD}{tag}"));
        std::fs::rename(out, &old)
            .with_context(|| format!("cannot move {} aside", out.display()))?;
        std::fs::rename(stage, out)
            .with_context(|| format!("cannot put the outputs in {}", out.display()))?;
        let _ = std::fs::remove_dir_all(&old);
        return Ok(());
    }
    // A folder with other files in it: the earlier manifest marked unfinished (so a kill
    // between the renames leaves no manifest vouching for a mixed set), file by file, then the
    // manifest, then the leftovers.
    if let Some(unfinished) = mark_unfinished(out) {
        let tmp = stage.join(".unfinished");
        std::fs::write(&tmp, unfinished).context("cannot write the manifest")?;
        std::fs::rename(&tmp, out.join(MANIFEST)).context("cannot update the manifest")?;
    }
    for (name, _) in files {
        std::fs::rename(stage.join(name), out.join(name))
            .with_context(|| format!("cannot put {name} in place"))?;
    }
    std::fs::rename(stage.join(MANIFEST), out.join(MANIFEST))
        .context("cannot put the manifest in place")?;
    for name in earlier.unwrap_or_default() {
        let plain = !name.contains(['/', '\\']) && !name.starts_with('.');
        if plain && !files.iter().any(|(n, _)| *n == name) {
            let _ = std::fs::remove_file(out.join(&name));
        }
    }
    Ok(())
}

/// The earlier manifest of `dir` with `"complete": false`: its file list is kept (the next run
/// removes those files it does not write), and [`verify_set`] reports the folder as unfinished.
fn mark_unfinished(dir: &Path) -> Option<Vec<u8>> {
    let text = std::fs::read(dir.join(MANIFEST)).ok()?;
    let mut v: serde_json::Value = serde_json::from_slice(&text).ok()?;
    let map = v.as_object_mut()?;
    map.insert("complete".into(), serde_json::Value::Bool(false));
    map.insert(
        "note".into(),
        serde_json::json!("a later run of drydig was writing this folder and did not finish; the files here may be from either run"),
    );
    let mut out = serde_json::to_vec_pretty(&v).ok()?;
    out.push(b'\n');
    Some(out)
}

/// Check the set in `dir` against its manifest: the manifest is complete and every file it names
/// is there with its length and hash. Returns the number of files, or what does not match.
pub fn verify_set(dir: &Path) -> Result<usize, String> {
    let text = std::fs::read(dir.join(MANIFEST)).map_err(|e| format!("no manifest: {e}"))?;
    let v: serde_json::Value =
        serde_json::from_slice(&text).map_err(|e| format!("the manifest does not parse: {e}"))?;
    if v.get("complete") != Some(&serde_json::Value::Bool(true)) {
        return Err("the manifest is marked unfinished: a run was stopped while writing this folder; run again".into());
    }
    let files = v
        .get("files")
        .and_then(|f| f.as_array())
        .ok_or("the manifest lists no files")?;
    let mut wrong = Vec::new();
    for f in files {
        let name = f.get("name").and_then(|n| n.as_str()).unwrap_or("");
        let want = f.get("sha256").and_then(|h| h.as_str()).unwrap_or("");
        match std::fs::read(dir.join(name)) {
            Ok(b) if sha256(&b) == want => {}
            Ok(_) => wrong.push(format!("{name} differs from the manifest")),
            Err(_) => wrong.push(format!("{name} is missing")),
        }
    }
    if wrong.is_empty() {
        Ok(files.len())
    } else {
        Err(wrong.join("; "))
    }
}

/// Swap two folders in one step.
#[cfg(target_os = "linux")]
fn exchange(a: &Path, b: &Path) -> std::io::Result<()> {
    use rustix::fs::{renameat_with, RenameFlags, CWD};
    renameat_with(CWD, a, CWD, b, RenameFlags::EXCHANGE).map_err(std::io::Error::from)
}

#[cfg(not(target_os = "linux"))]
fn exchange(_a: &Path, _b: &Path) -> std::io::Result<()> {
    Err(std::io::Error::other("no atomic exchange here"))
}

/// The manifest: tool and version, when, the inputs with their hashes, the files with theirs.
fn manifest(files: &[(String, Vec<u8>)], inputs: &[PathBuf]) -> Vec<u8> {
    let when = std::time::SystemTime::now()
        .duration_since(std::time::UNIX_EPOCH)
        .map_or(0, |d| d.as_secs());
    let inputs: Vec<serde_json::Value> = inputs
        .iter()
        .map(|p| {
            let hash = std::fs::read(p).map(|b| sha256(&b)).unwrap_or_default();
            serde_json::json!({"path": p.display().to_string(), "sha256": hash})
        })
        .collect();
    let files: Vec<serde_json::Value> = files
        .iter()
        .map(|(n, b)| serde_json::json!({"name": n, "bytes": b.len(), "sha256": sha256(b)}))
        .collect();
    let v = serde_json::json!({
        "tool": "drydig",
        "version": env!("CARGO_PKG_VERSION"),
        "written_unix_s": when,
        "command": std::env::args().skip(1).collect::<Vec<_>>(),
        "inputs": inputs,
        "files": files,
        "complete": true,
    });
    let mut text = serde_json::to_vec_pretty(&v).unwrap_or_default();
    text.push(b'\n');
    text
}

#[cfg(test)]
mod tests {
    use super::*;

    // SHA-256 test vectors: NIST FIPS 180-2, Appendix B.1 ("abc") and the empty message
    // (NIST CSRC example values, SHA256.pdf).
    #[test]
    fn sha256_matches_the_published_vectors() {
        assert_eq!(
            sha256(b"abc"),
            "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"
        );
        assert_eq!(
            sha256(b""),
            "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855"
        );
    }

    // Rust prints f64::NAN as "NaN" and f64::INFINITY as "inf" (std docs, `impl Display for
    // f64`); JavaScript prints "Infinity" (ECMA-262, Number::toString). common practice (no source)
    // that words like "info" are text.
    #[test]
    fn non_finite_tokens_are_found_and_words_pass() {
        assert!(has_non_finite(format!("x,{}", f64::NAN).as_bytes()).is_some());
        assert!(has_non_finite(format!("<text>{}</text>", f64::INFINITY).as_bytes()).is_some());
        assert!(has_non_finite(format!("{}", f64::NEG_INFINITY).as_bytes()).is_some());
        assert!(has_non_finite(b"Infinity").is_some());
        assert!(has_non_finite(b"info Infirmary NaNa inflow").is_none());
    }

    // A folder that holds the user's own files gets the set file by file; the earlier manifest
    // is marked unfinished before the first rename, so a kill half-way leaves no manifest
    // vouching for a mixed set, and verify_set tells a changed file.
    #[test]
    fn mixed_folder_manifest_is_marked_unfinished_before_files_move() {
        let d = tempfile::tempdir().unwrap();
        let out = d.path().join("site");
        std::fs::create_dir(&out).unwrap();
        std::fs::write(out.join("my_notes.txt"), b"mine\n").unwrap();
        let v1 = vec![("a.csv".to_string(), b"1\n".to_vec())];
        write_all(&out, &v1).unwrap();
        assert_eq!(verify_set(&out), Ok(1));
        // What a killed second run leaves after its first rename: the manifest is the earlier
        // one, marked unfinished, beside a new a.csv.
        let marked = mark_unfinished(&out).unwrap();
        std::fs::write(out.join(MANIFEST), marked).unwrap();
        std::fs::write(out.join("a.csv"), b"2\n").unwrap();
        let e = verify_set(&out).unwrap_err();
        assert!(e.contains("unfinished"), "{e}");
        // The next run completes the set and keeps the user's file.
        let v2 = vec![("a.csv".to_string(), b"3\n".to_vec())];
        write_all(&out, &v2).unwrap();
        assert_eq!(verify_set(&out), Ok(1));
        assert!(out.join("my_notes.txt").exists());
        std::fs::write(out.join("a.csv"), b"4\n").unwrap();
        assert!(verify_set(&out).unwrap_err().contains("a.csv differs"));
    }

    #[test]
    fn a_file_with_nan_is_an_internal_error_and_nothing_is_written() {
        let d = tempfile::tempdir().unwrap();
        let out = d.path().join("out");
        let files = vec![
            ("a.csv".to_string(), b"1,2\n".to_vec()),
            ("b.csv".to_string(), format!("{}\n", f64::NAN).into_bytes()),
        ];
        let e = write_all(&out, &files).unwrap_err();
        assert!(e.downcast_ref::<InputError>().is_none());
        assert!(e.to_string().contains("non-finite"), "{e}");
        assert!(!out.exists());
    }
}
