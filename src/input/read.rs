//! Reading an input file safely: every reader of the user's files (design file, DXF and GeoJSON
//! drawings, wells CSV, prices, pumping-test CSV) goes through [`read_capped`].
//!
//! - Only a regular file is read. A FIFO would block the reader for ever, `/dev/zero` never
//!   ends, a directory is not a file: each is refused with a message naming the path. The file
//!   is opened non-blocking (so opening a FIFO cannot hang) and checked with `fstat` on the
//!   opened descriptor (so a path swapped between a check and the open changes nothing).
//! - At most `max + 1` bytes are read: a longer file is refused naming the cap, without reading
//!   the rest.

use crate::input::error::InputError;
use std::io::Read;
use std::path::Path;

/// Largest design file read, bytes (16 MiB): a design file of 10⁵-vertex outlines is a few MiB.
pub const MAX_DESIGN_BYTES: u64 = 16 << 20;
/// Largest DXF drawing read, bytes (64 MiB): a site plan exported with the layers drydig reads
/// is a few MiB; a whole survey with every layer can be tens.
pub const MAX_DXF_BYTES: u64 = 64 << 20;
/// Largest GeoJSON file read, bytes (64 MiB).
pub const MAX_GEOJSON_BYTES: u64 = 64 << 20;
/// Largest wells CSV read, bytes (16 MiB: far more rows than the most wells drydig builds).
pub const MAX_WELLS_CSV_BYTES: u64 = 16 << 20;
/// Largest prices file read, bytes (1 MiB: a price list is a few dozen rows).
pub const MAX_PRICES_BYTES: u64 = 1 << 20;
/// Largest pumping-test CSV read, bytes (64 MiB: about 10⁶ logger rows).
pub const MAX_PUMPING_TEST_BYTES: u64 = 64 << 20;

fn fail(path: &Path, message: String) -> InputError {
    InputError::at(path, "", message)
}

/// What a non-regular file is, in words, for the message.
fn kind_of(meta: &std::fs::Metadata) -> &'static str {
    use std::os::unix::fs::FileTypeExt;
    let t = meta.file_type();
    if t.is_dir() {
        "a folder"
    } else if t.is_fifo() {
        "a named pipe (FIFO)"
    } else if t.is_char_device() {
        "a character device"
    } else if t.is_block_device() {
        "a block device"
    } else if t.is_socket() {
        "a socket"
    } else {
        "not a regular file"
    }
}

/// Read at most `max` bytes of the regular file at `path` (`what` names it in messages: "design
/// file", "DXF drawing"). Refused: a path that is not a regular file (folder, FIFO, device,
/// socket), and a file longer than `max` (found after reading `max + 1` bytes and no more).
pub fn read_capped(path: &Path, max: u64, what: &str) -> Result<Vec<u8>, InputError> {
    use rustix::fs::{Mode, OFlags};
    let fd = rustix::fs::open(
        path,
        OFlags::RDONLY | OFlags::NONBLOCK | OFlags::CLOEXEC,
        Mode::empty(),
    )
    .map_err(|e| {
        fail(
            path,
            format!("cannot read the {what}: {}", std::io::Error::from(e)),
        )
    })?;
    let file = std::fs::File::from(fd);
    let meta = file
        .metadata()
        .map_err(|e| fail(path, format!("cannot read the {what}: {e}")))?;
    if !meta.is_file() {
        return Err(fail(
            path,
            format!(
                "this is {}, not a regular file; give the path of the {what} itself",
                kind_of(&meta)
            ),
        ));
    }
    let mut bytes = Vec::with_capacity(meta.len().min(max + 1) as usize);
    file.take(max + 1)
        .read_to_end(&mut bytes)
        .map_err(|e| fail(path, format!("cannot read the {what}: {e}")))?;
    if bytes.len() as u64 > max {
        return Err(fail(
            path,
            format!(
                "the {what} is larger than {}, the most drydig reads; is it the right file?",
                size_in_words(max)
            ),
        ));
    }
    Ok(bytes)
}

/// As [`read_capped`], the bytes as UTF-8 text; invalid UTF-8 is refused naming the byte.
pub fn read_text_capped(path: &Path, max: u64, what: &str) -> Result<String, InputError> {
    let bytes = read_capped(path, max, what)?;
    String::from_utf8(bytes).map_err(|e| {
        fail(
            path,
            format!(
                "the {what} is not text (invalid UTF-8 at byte {})",
                e.utf8_error().valid_up_to()
            ),
        )
    })
}

fn size_in_words(bytes: u64) -> String {
    if bytes >= 1 << 20 {
        format!("{} MiB", bytes >> 20)
    } else {
        format!("{} KiB", bytes >> 10)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // A FIFO, /dev/zero and a folder are refused at once (none is read); the FIFO has no writer,
    // so a blocking open would hang here.
    #[test]
    fn read_refuses_non_regular_files() {
        let dir = tempfile::tempdir().unwrap();
        let fifo = dir.path().join("pipe.dxf");
        rustix::fs::mkfifoat(rustix::fs::CWD, &fifo, Mode::from_raw_mode(0o600)).unwrap();
        let e = read_capped(&fifo, 1 << 20, "DXF drawing").unwrap_err();
        assert!(e.message.contains("named pipe"), "{e}");
        let e = read_capped(Path::new("/dev/zero"), 1 << 20, "prices file").unwrap_err();
        assert!(e.message.contains("character device"), "{e}");
        let e = read_capped(dir.path(), 1 << 20, "design file").unwrap_err();
        assert!(e.message.contains("a folder"), "{e}");
        assert_eq!(e.file, dir.path());
    }
    use rustix::fs::Mode;

    #[test]
    fn read_caps_the_size() {
        let dir = tempfile::tempdir().unwrap();
        let p = dir.path().join("big.csv");
        std::fs::write(&p, vec![b'a'; 2049]).unwrap();
        let e = read_capped(&p, 2048, "prices file").unwrap_err();
        assert!(e.message.contains("larger than 2 KiB"), "{e}");
        assert_eq!(read_capped(&p, 2049, "prices file").unwrap().len(), 2049);
        std::fs::write(&p, [0xff, 0xfe]).unwrap();
        let e = read_text_capped(&p, 2048, "prices file").unwrap_err();
        assert!(e.message.contains("not text"), "{e}");
    }
}
