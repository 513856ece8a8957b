//! Streaming input for `annotate`: plain or gzip files and stdin, read line by
//! line as bytes in bounded chunks (never the whole file), with 1-based line
//! numbers, a leading byte-order mark removed, CRLF endings and over-long
//! lines handled.

use std::fs::File;
use std::io::{self, BufRead, BufReader, Read};
use std::path::Path;
use std::sync::atomic::{AtomicU64, Ordering};
use std::sync::Arc;

/// Lines longer than this are cut here and reported as too large; the rest of
/// the line is read and discarded so memory stays bounded.
pub const MAX_LINE_BYTES: usize = 8 << 20;

/// Input layout.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum InputFormat {
    /// SMILES, whitespace, optional id (rest of the line).
    Smi,
    /// Comma-separated with a header line.
    Csv,
    /// Tab-separated with a header line.
    Tsv,
    /// SD file (molfiles separated by `$$$$`, with data items).
    Sdf,
}

impl InputFormat {
    /// Guess from a file name: `.csv`, `.tsv`/`.tab` (optionally `.gz`), else SMILES.
    pub fn from_path(path: &Path) -> InputFormat {
        let name = path
            .file_name()
            .map(|n| n.to_string_lossy().to_ascii_lowercase())
            .unwrap_or_default();
        let name = name.strip_suffix(".gz").unwrap_or(&name);
        if name.ends_with(".sdf") || name.ends_with(".sd") || name.ends_with(".mol") {
            InputFormat::Sdf
        } else if name.ends_with(".csv") {
            InputFormat::Csv
        } else if name.ends_with(".tsv") || name.ends_with(".tab") {
            InputFormat::Tsv
        } else {
            InputFormat::Smi
        }
    }
}

/// One physical line that holds a record (blank and `#` lines are skipped by
/// the reader but still counted).
#[derive(Debug, Clone)]
pub struct RawLine {
    /// 1-based line number.
    pub line: u64,
    /// The bytes without line ending (and without BOM on line 1).
    pub bytes: Vec<u8>,
    /// The line was longer than [`MAX_LINE_BYTES`] and was cut.
    pub truncated: bool,
    /// SD input: 1-based record number (`bytes` then holds the whole
    /// record and `line` its first line); 0 for line input.
    pub record: u64,
}

/// Counts bytes read from the underlying source (for the progress bar).
struct Counting<R> {
    inner: R,
    count: Arc<AtomicU64>,
}

impl<R: Read> Read for Counting<R> {
    fn read(&mut self, buf: &mut [u8]) -> io::Result<usize> {
        let n = self.inner.read(buf)?;
        self.count.fetch_add(n as u64, Ordering::Relaxed);
        Ok(n)
    }
}

/// Line reader over any source.
pub struct LineSource {
    reader: Box<dyn BufRead + Send>,
    line_no: u64,
    /// Bytes consumed from the raw (possibly compressed) source.
    pub consumed: Arc<AtomicU64>,
    /// Size of the raw source if known (a regular file).
    pub total: Option<u64>,
    done: bool,
    /// CSV input: a record whose quotes are not balanced at the end of a
    /// physical line goes on over the next line (RFC 4180 quoted line
    /// breaks); the record keeps the line number where it starts.
    pub csv_quotes: bool,
    /// A read error met after the start of the input (a damaged gzip
    /// stream, a device error): the lines before it were returned, the line
    /// it cut is dropped, and the caller reports it as the last record
    /// (issue 17). (line number where reading stopped, message)
    pub read_error: Option<(u64, String)>,
    /// The next non-blank line is returned even if it starts with `#` (a
    /// CSV/TSV header such as `#id,smiles`); reset once used.
    pub header_next: bool,
}

impl LineSource {
    /// Open a file, or stdin for `-`/None. Gzip is detected by its magic bytes.
    pub fn open(path: Option<&Path>) -> io::Result<LineSource> {
        let consumed = Arc::new(AtomicU64::new(0));
        let (raw, total): (Box<dyn Read + Send>, Option<u64>) = match path {
            None => (Box::new(io::stdin()), None),
            Some(p) if p.as_os_str() == "-" => (Box::new(io::stdin()), None),
            Some(p) => {
                let f = File::open(p)?;
                let meta = f.metadata()?;
                if meta.is_dir() {
                    return Err(io::Error::new(
                        io::ErrorKind::InvalidInput,
                        "is a directory, not a file",
                    ));
                }
                (Box::new(f), Some(meta.len()))
            }
        };
        LineSource::wrap(raw, total, consumed)
    }

    /// Read from bytes held in memory (an upload to `acidsite serve`); gzip
    /// is detected by its magic bytes as for files.
    pub fn from_bytes(bytes: Vec<u8>) -> io::Result<LineSource> {
        let total = Some(bytes.len() as u64);
        LineSource::wrap(
            Box::new(io::Cursor::new(bytes)),
            total,
            Arc::new(AtomicU64::new(0)),
        )
    }

    fn wrap(
        raw: Box<dyn Read + Send>,
        total: Option<u64>,
        consumed: Arc<AtomicU64>,
    ) -> io::Result<LineSource> {
        let mut buffered = BufReader::with_capacity(
            1 << 16,
            Counting {
                inner: raw,
                count: consumed.clone(),
            },
        );
        let head = buffered.fill_buf()?;
        let gz = head.len() >= 2 && head[0] == 0x1f && head[1] == 0x8b;
        let reader: Box<dyn BufRead + Send> = if gz {
            Box::new(BufReader::with_capacity(
                1 << 16,
                flate2::bufread::MultiGzDecoder::new(buffered),
            ))
        } else {
            Box::new(buffered)
        };
        Ok(LineSource {
            reader,
            line_no: 0,
            consumed,
            total,
            done: false,
            csv_quotes: false,
            read_error: None,
            header_next: false,
        })
    }

    /// Build from any reader (tests).
    #[cfg(test)]
    pub fn from_reader(r: impl BufRead + Send + 'static) -> LineSource {
        LineSource {
            reader: Box::new(r),
            line_no: 0,
            consumed: Arc::new(AtomicU64::new(0)),
            total: None,
            done: false,
            csv_quotes: false,
            read_error: None,
            header_next: false,
        }
    }

    /// The first bytes of the (decompressed) input, without consuming them
    /// (format sniffing).
    pub fn peek(&mut self) -> io::Result<&[u8]> {
        self.reader.fill_buf()
    }

    /// The next physical line (blank lines included), without its line
    /// ending; None at the end of input. Returns (1-based line, bytes, cut).
    pub fn next_physical_line(&mut self) -> io::Result<Option<(u64, Vec<u8>, bool)>> {
        if self.done {
            return Ok(None);
        }
        let mut buf = Vec::new();
        let (read_any, truncated) = read_line_capped(&mut self.reader, &mut buf)?;
        if !read_any {
            self.done = true;
            return Ok(None);
        }
        self.line_no += 1;
        strip_line_end(&mut buf);
        if self.line_no == 1 && buf.starts_with(&[0xEF, 0xBB, 0xBF]) {
            buf.drain(..3);
        }
        Ok(Some((self.line_no, buf, truncated)))
    }

    /// The next line that holds a record, skipping blank and `#` lines.
    pub fn next_record_line(&mut self) -> io::Result<Option<RawLine>> {
        loop {
            if self.done {
                return Ok(None);
            }
            let mut buf = Vec::new();
            let (read_any, truncated) = read_line_capped(&mut self.reader, &mut buf)?;
            if !read_any {
                self.done = true;
                return Ok(None);
            }
            self.line_no += 1;
            let start_line = self.line_no;
            strip_line_end(&mut buf);
            let mut truncated = truncated;
            // A quoted CSV field with line breaks: join the physical lines
            // (kept as \n) until the quotes balance, the input ends or the
            // record reaches the line cap.
            if self.csv_quotes {
                while odd_quotes(&buf) && !truncated {
                    let mut more = Vec::new();
                    let (any, cut) = read_line_capped(&mut self.reader, &mut more)?;
                    if !any {
                        break;
                    }
                    self.line_no += 1;
                    strip_line_end(&mut more);
                    if buf.len() + 1 + more.len() > MAX_LINE_BYTES {
                        truncated = true;
                        break;
                    }
                    buf.push(b'\n');
                    buf.extend_from_slice(&more);
                    truncated |= cut;
                }
            }
            if self.line_no == 1 && buf.starts_with(&[0xEF, 0xBB, 0xBF]) {
                buf.drain(..3);
            }
            // Vertical tab and form feed are whitespace like space and tab.
            let first = buf
                .iter()
                .position(|&b| !(b.is_ascii_whitespace() || b == 0x0b));
            match first {
                None => continue,
                Some(i) if buf[i] == b'#' && !self.header_next => continue,
                Some(_) => {}
            }
            self.header_next = false;
            return Ok(Some(RawLine {
                line: start_line,
                bytes: buf,
                truncated,
                record: 0,
            }));
        }
    }

    /// Up to `max_lines` record lines or about `max_bytes`, whichever first.
    pub fn next_chunk(&mut self, max_lines: usize, max_bytes: usize) -> io::Result<Vec<RawLine>> {
        let mut chunk = Vec::new();
        let mut bytes = 0usize;
        while chunk.len() < max_lines && bytes < max_bytes {
            match self.next_record_line() {
                Ok(Some(l)) => {
                    bytes += l.bytes.len();
                    chunk.push(l);
                }
                Ok(None) => break,
                Err(e) => {
                    // Keep what was read; the damage is reported once, after
                    // the records before it.
                    self.done = true;
                    self.read_error = Some((self.line_no + 1, e.to_string()));
                    break;
                }
            }
        }
        Ok(chunk)
    }
}

/// Drop the line end (`\n`, `\r\n` or a lone `\r`).
fn strip_line_end(buf: &mut Vec<u8>) {
    if buf.last() == Some(&b'\n') {
        buf.pop();
    }
    if buf.last() == Some(&b'\r') {
        buf.pop();
    }
}

/// An odd number of `"` bytes: a quoted field is still open.
fn odd_quotes(buf: &[u8]) -> bool {
    buf.iter().filter(|&&b| b == b'"').count() % 2 == 1
}

/// Read one line (through `\n`, a lone `\r` (old Mac line ends) or end of
/// input) into `buf`, keeping at most
/// [`MAX_LINE_BYTES`] and discarding the rest. Returns (anything read, cut).
fn read_line_capped(r: &mut dyn BufRead, buf: &mut Vec<u8>) -> io::Result<(bool, bool)> {
    let mut any = false;
    let mut truncated = false;
    loop {
        let avail = match r.fill_buf() {
            Ok(a) => a,
            Err(e) if e.kind() == io::ErrorKind::Interrupted => continue,
            Err(e) => return Err(e),
        };
        if avail.is_empty() {
            return Ok((any, truncated));
        }
        any = true;
        let (take, found) = match avail.iter().position(|&b| b == b'\n' || b == b'\r') {
            Some(i) => (i + 1, true),
            None => (avail.len(), false),
        };
        let lone_cr = found && avail[take - 1] == b'\r';
        let room = MAX_LINE_BYTES.saturating_sub(buf.len());
        if take > room {
            buf.extend_from_slice(&avail[..room]);
            truncated = true;
        } else {
            buf.extend_from_slice(&avail[..take]);
        }
        r.consume(take);
        if lone_cr {
            // CR LF: the LF belongs to this line end.
            loop {
                match r.fill_buf() {
                    Ok(next) => {
                        if next.first() == Some(&b'\n') {
                            if buf.len() < MAX_LINE_BYTES {
                                buf.push(b'\n');
                            }
                            r.consume(1);
                        }
                        break;
                    }
                    Err(e) if e.kind() == io::ErrorKind::Interrupted => continue,
                    Err(e) => return Err(e),
                }
            }
        }
        if found {
            return Ok((true, truncated));
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn next_record_line_given_bom_crlf_blank_and_comment_lines() {
        let data = b"\xEF\xBB\xBFCCO a\r\n\n# note\n  \nCC(=O)C\r\nlast".to_vec();
        let mut src = LineSource::from_reader(io::Cursor::new(data));
        let l = src.next_record_line().unwrap().unwrap();
        assert_eq!((l.line, l.bytes.as_slice()), (1, &b"CCO a"[..]));
        let l = src.next_record_line().unwrap().unwrap();
        assert_eq!((l.line, l.bytes.as_slice()), (5, &b"CC(=O)C"[..]));
        let l = src.next_record_line().unwrap().unwrap();
        assert_eq!((l.line, l.bytes.as_slice()), (6, &b"last"[..]));
        assert!(src.next_record_line().unwrap().is_none());
    }

    #[test]
    fn next_chunk_given_more_lines_than_chunk() {
        let data: Vec<u8> = (0..10)
            .flat_map(|i| format!("C{i}\n").into_bytes())
            .collect();
        let mut src = LineSource::from_reader(io::Cursor::new(data));
        assert_eq!(src.next_chunk(4, 1 << 20).unwrap().len(), 4);
        assert_eq!(src.next_chunk(4, 1 << 20).unwrap().len(), 4);
        assert_eq!(src.next_chunk(4, 1 << 20).unwrap().len(), 2);
        assert!(src.next_chunk(4, 1 << 20).unwrap().is_empty());
    }

    #[test]
    fn from_path_given_compressed_and_plain_names() {
        assert_eq!(
            InputFormat::from_path(Path::new("a.CSV.gz")),
            InputFormat::Csv
        );
        assert_eq!(InputFormat::from_path(Path::new("a.tsv")), InputFormat::Tsv);
        assert_eq!(
            InputFormat::from_path(Path::new("a.smi.gz")),
            InputFormat::Smi
        );
    }
}
