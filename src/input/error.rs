//! Input errors: what is wrong with a design file, where, and what would be valid.

use std::fmt;
use std::ops::Range;
use std::path::{Path, PathBuf};

/// A problem with the user's input. Rendered as `file:line: field: message`.
#[derive(Debug, Clone)]
pub struct InputError {
    /// The file the problem is in.
    pub file: PathBuf,
    /// Dotted path of the field (`aquifer.conductivity`, `excavation[2].outline`), or empty.
    pub field: String,
    /// 1-based line, when known.
    pub line: Option<usize>,
    /// What is wrong and what would be valid.
    pub message: String,
}

impl fmt::Display for InputError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}", self.file.display())?;
        if let Some(line) = self.line {
            write!(f, ":{line}")?;
        }
        if !self.field.is_empty() {
            write!(f, ": {}", self.field)?;
        }
        write!(f, ": {}", self.message)
    }
}

impl std::error::Error for InputError {}

impl InputError {
    /// An error in `file` at `field` (no line known).
    pub fn at(file: &Path, field: impl Into<String>, message: impl Into<String>) -> InputError {
        InputError {
            file: file.to_path_buf(),
            field: field.into(),
            line: None,
            message: message.into(),
        }
    }
}

/// 1-based line of a byte offset in `source`.
pub fn line_of(source: &str, offset: usize) -> usize {
    source[..offset.min(source.len())]
        .bytes()
        .filter(|b| *b == b'\n')
        .count()
        + 1
}

/// Collects input errors against one file's text.
pub struct Reporter<'a> {
    file: &'a Path,
    source: &'a str,
}

impl<'a> Reporter<'a> {
    /// A reporter for `file` whose text is `source`.
    pub fn new(file: &'a Path, source: &'a str) -> Self {
        Reporter { file, source }
    }

    /// An error at `field`, located by `span` when given.
    pub fn error(
        &self,
        field: impl Into<String>,
        span: Option<Range<usize>>,
        message: impl Into<String>,
    ) -> InputError {
        InputError {
            file: self.file.to_path_buf(),
            field: field.into(),
            line: span.map(|s| line_of(self.source, s.start)),
            message: message.into(),
        }
    }
}
