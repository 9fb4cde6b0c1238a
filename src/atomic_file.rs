//! Writing output files atomically: a temporary file beside the target,
//! then a rename, so a reader never sees half a file and a failed run
//! leaves nothing behind.

use crate::error::{Error, Result};
use std::fs::File;
use std::io::{BufWriter, Write};
use std::path::{Path, PathBuf};

/// Bytes handed to the kernel per `write` call: the capacity of the
/// writer [`write_atomic`] gives out, and the piece size of
/// [`write_in_pieces`].
///
/// Measured on the 2-core VM (Linux, ext4), writing 2.75 GB into the page
/// cache with `dd`, runs interleaved: 1.0–5.3 s of system time (median
/// 2.6 s) in 256 KiB writes against 3.9 s in 1 MiB and 5.2–7.7 s (median
/// 6.1 s) in 4 MiB writes. Small enough for the copy's source to stay in
/// the core's cache, large enough that the calls themselves cost nothing.
pub const WRITE_PIECE_BYTES: usize = 256 << 10;

/// Writes `bytes` in pieces of [`WRITE_PIECE_BYTES`]: the same bytes as
/// one `write_all`. Through the writer of [`write_atomic`] each piece
/// goes straight to the file.
pub fn write_in_pieces(file: &mut impl Write, bytes: &[u8]) -> std::io::Result<()> {
    bytes
        .chunks(WRITE_PIECE_BYTES)
        .try_for_each(|piece| file.write_all(piece))
}

/// Checks that `path` may be written: its folder exists and, unless
/// `force`, no file is there yet. Call this for every output before any
/// work starts, so a refusal costs nothing.
pub fn check_target(path: &Path, force: bool) -> Result<()> {
    let folder = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    if !folder.is_dir() {
        return Err(Error::MissingOutputFolder(path.to_path_buf()));
    }
    if !force && path.exists() {
        return Err(Error::OutputExists(path.to_path_buf()));
    }
    Ok(())
}

/// Writes a file through `fill`, atomically: the bytes go to a hidden
/// temporary file in the same folder, which is renamed over `path` only
/// when `fill` succeeded and the data is handed to the operating system
/// (not forced to the disk: atomic for readers and failed runs, not a
/// guarantee against power loss). On any error the
/// temporary file is removed and `path` is untouched.
pub fn write_atomic<F>(path: &Path, force: bool, fill: F) -> Result<()>
where
    F: FnOnce(&mut BufWriter<File>) -> std::io::Result<()>,
{
    check_target(path, force)?;
    let temp = temp_path(path);
    let write_err = |e: std::io::Error| Error::Write {
        path: path.to_path_buf(),
        message: e.to_string(),
    };
    let result = (|| {
        let file = File::create(&temp)?;
        let mut writer = BufWriter::with_capacity(WRITE_PIECE_BYTES, file);
        fill(&mut writer)?;
        writer.flush()?;
        // No fsync: the rename is what makes the write atomic for readers
        // and for failed runs. Waiting for a catalogue of hundreds of
        // megabytes to reach the disk took seconds, longer than making it.
        Ok(())
    })();
    if let Err(e) = result {
        let _ = std::fs::remove_file(&temp);
        return Err(write_err(e));
    }
    std::fs::rename(&temp, path).map_err(|e| {
        let _ = std::fs::remove_file(&temp);
        write_err(e)
    })
}

/// Writes a byte buffer atomically (see [`write_atomic`]).
pub fn write_bytes(path: &Path, force: bool, bytes: &[u8]) -> Result<()> {
    write_atomic(path, force, |w| write_in_pieces(w, bytes))
}

fn temp_path(path: &Path) -> PathBuf {
    let name = path
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| "output".into());
    let temp_name = format!(".{name}.{}.tmp", std::process::id());
    path.with_file_name(temp_name)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn keeps_existing_file_without_force() {
        let dir = std::env::temp_dir().join(format!("starloom-atomic-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let path = dir.join("a.txt");
        write_bytes(&path, false, b"one").unwrap();
        assert!(matches!(
            write_bytes(&path, false, b"two"),
            Err(Error::OutputExists(_))
        ));
        assert_eq!(std::fs::read(&path).unwrap(), b"one");
        write_bytes(&path, true, b"two").unwrap();
        assert_eq!(std::fs::read(&path).unwrap(), b"two");
        // A failing writer leaves neither the target nor a temporary file.
        let failing = dir.join("b.txt");
        let res = write_atomic(&failing, false, |_| Err(std::io::Error::other("boom")));
        assert!(res.is_err());
        assert!(!failing.exists());
        assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 1);
        std::fs::remove_dir_all(&dir).unwrap();
    }
}
