//! Writing output files whole or not at all: each goes to a temporary file in the output folder,
//! then is renamed into place.

use anyhow::Context;
use std::io::Write;
use std::path::Path;

/// Write `bytes` to `dir/name` atomically (temporary file, then rename).
pub fn write_atomic(dir: &Path, name: &str, bytes: &[u8]) -> anyhow::Result<()> {
    std::fs::create_dir_all(dir)
        .with_context(|| format!("cannot create output folder {}", dir.display()))?;
    let mut tmp = tempfile::NamedTempFile::new_in(dir)
        .with_context(|| format!("cannot write in {}", dir.display()))?;
    tmp.write_all(bytes)
        .with_context(|| format!("cannot write {name}"))?;
    tmp.flush()?;
    tmp.persist(dir.join(name))
        .with_context(|| format!("cannot put {name} in place"))?;
    Ok(())
}

/// Render every output in memory first, then write them all; a rendering failure writes nothing.
pub fn write_all(dir: &Path, files: &[(String, Vec<u8>)]) -> anyhow::Result<()> {
    for (name, bytes) in files {
        write_atomic(dir, name, bytes)?;
    }
    Ok(())
}
