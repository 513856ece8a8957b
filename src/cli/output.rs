//! Output files that never destroy their input and never leave a half
//! file under the final name: `-o` and `--html` are refused when they name
//! the input (the same path, a symlink or a hard link to it), and are
//! written through a temporary file in the same folder, renamed into place
//! only when the run has written everything (issue 17).

use anyhow::{bail, Context};
use std::fs::File;
use std::io::{self, Write};
use std::path::{Path, PathBuf};

/// Refuse `out` when it is the same file as `input` (device and inode, so a
/// symlink or hard link is caught too), before anything is opened for
/// writing. `what` names the option in the message.
pub fn refuse_onto_input(input: Option<&Path>, out: &Path, what: &str) -> anyhow::Result<()> {
    let Some(input) = input else {
        return Ok(());
    };
    if same_file(input, out) {
        bail!(
            "{what} {} is the input file {}: writing there would destroy the list before it is read; choose another output file",
            out.display(),
            input.display()
        );
    }
    Ok(())
}

#[cfg(unix)]
fn same_file(a: &Path, b: &Path) -> bool {
    use std::os::unix::fs::MetadataExt;
    match (std::fs::metadata(a), std::fs::metadata(b)) {
        (Ok(x), Ok(y)) => x.dev() == y.dev() && x.ino() == y.ino(),
        _ => false,
    }
}

#[cfg(not(unix))]
fn same_file(a: &Path, b: &Path) -> bool {
    match (a.canonicalize(), b.canonicalize()) {
        (Ok(x), Ok(y)) => x == y,
        _ => false,
    }
}

/// A file written under a temporary name beside its destination and
/// renamed onto it by [`SafeFile::commit`]; dropped without a commit (an
/// error, a panic), the temporary file is removed and the destination is
/// left as it was.
pub struct SafeFile {
    file: Option<io::BufWriter<File>>,
    tmp: PathBuf,
    dest: PathBuf,
}

impl SafeFile {
    /// Create the temporary file beside `dest`.
    pub fn create(dest: &Path) -> anyhow::Result<SafeFile> {
        let dir = match dest.parent() {
            Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
            _ => PathBuf::from("."),
        };
        let name = dest
            .file_name()
            .map(|n| n.to_string_lossy().into_owned())
            .unwrap_or_else(|| "output".into());
        let tmp = dir.join(format!(".{name}.acidsite-{}.part", std::process::id()));
        let file = File::create(&tmp)
            .with_context(|| format!("cannot write {} (in {})", dest.display(), dir.display()))?;
        Ok(SafeFile {
            file: Some(io::BufWriter::with_capacity(1 << 16, file)),
            tmp,
            dest: dest.to_path_buf(),
        })
    }

    /// Flush, and rename the temporary file onto the destination.
    pub fn commit(mut self) -> anyhow::Result<()> {
        if let Some(mut f) = self.file.take() {
            f.flush()
                .with_context(|| format!("cannot write {}", self.dest.display()))?;
            let inner = f
                .into_inner()
                .map_err(|e| e.into_error())
                .with_context(|| format!("cannot write {}", self.dest.display()))?;
            inner
                .sync_all()
                .with_context(|| format!("cannot write {}", self.dest.display()))?;
        }
        std::fs::rename(&self.tmp, &self.dest).with_context(|| {
            format!("cannot move the finished output to {}", self.dest.display())
        })?;
        Ok(())
    }
}

impl Write for SafeFile {
    fn write(&mut self, buf: &[u8]) -> io::Result<usize> {
        match &mut self.file {
            Some(f) => f.write(buf),
            None => Err(io::Error::other("output already committed")),
        }
    }
    fn flush(&mut self) -> io::Result<()> {
        match &mut self.file {
            Some(f) => f.flush(),
            None => Ok(()),
        }
    }
}

impl Drop for SafeFile {
    fn drop(&mut self) {
        if self.file.take().is_some() {
            let _ = std::fs::remove_file(&self.tmp);
        }
    }
}

/// Where `annotate` writes: standard output, or a [`SafeFile`].
pub enum Sink {
    /// Standard output, buffered.
    Stdout(io::BufWriter<io::Stdout>),
    /// A file written through a temporary name.
    File(SafeFile),
}

impl Sink {
    /// Standard output, or `path` through a temporary file.
    pub fn open(path: Option<&Path>) -> anyhow::Result<Sink> {
        Ok(match path {
            Some(p) => Sink::File(SafeFile::create(p)?),
            None => Sink::Stdout(io::BufWriter::with_capacity(1 << 16, io::stdout())),
        })
    }

    /// Flush; a file is renamed into place.
    pub fn finish(self) -> anyhow::Result<()> {
        match self {
            Sink::Stdout(mut s) => Ok(s.flush()?),
            Sink::File(f) => f.commit(),
        }
    }
}

impl Write for Sink {
    fn write(&mut self, buf: &[u8]) -> io::Result<usize> {
        match self {
            Sink::Stdout(s) => s.write(buf),
            Sink::File(f) => f.write(buf),
        }
    }
    fn write_all(&mut self, buf: &[u8]) -> io::Result<()> {
        match self {
            Sink::Stdout(s) => s.write_all(buf),
            Sink::File(f) => f.write_all(buf),
        }
    }
    fn flush(&mut self) -> io::Result<()> {
        match self {
            Sink::Stdout(s) => s.flush(),
            Sink::File(f) => f.flush(),
        }
    }
}
