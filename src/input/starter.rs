//! `drydig new`: a commented starter design file that explains every field and runs unchanged.

use anyhow::{bail, Context};
use std::io::Write;
use std::path::Path;

/// The starter text.
pub const STARTER: &str = include_str!("starter.toml");

/// Write the starter to `path`; refuses to overwrite an existing file.
pub fn write_new(path: &Path) -> anyhow::Result<()> {
    if path.exists() {
        bail!(crate::input::error::InputError {
            file: path.to_path_buf(),
            field: String::new(),
            line: None,
            message: "already exists; drydig never overwrites a design file — choose another name"
                .into(),
        });
    }
    let mut f = std::fs::OpenOptions::new()
        .write(true)
        .create_new(true)
        .open(path)
        .with_context(|| format!("cannot create {}", path.display()))?;
    f.write_all(STARTER.as_bytes())
        .with_context(|| format!("cannot write {}", path.display()))?;
    Ok(())
}
