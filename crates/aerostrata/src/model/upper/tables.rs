//! Where the upper part's two tables (ln n and its slopes at the nodes) come from: compiled
//! in with the `upper` feature, or, with `upper-loadable` alone, read once at run time
//! from the tables' file, so that a program (the web module) can ship them apart and load
//! them only when an altitude above 86 km is asked for. The same bytes give the same bits.
//!
//! The file: [`TABLES_MAGIC`], [`TABLES_FORMAT`] (u32), then every ln n (f64) and every
//! slope (f32), little-endian in table order, and nothing else ([`TABLES_FILE_BYTES`]).
//! A file is accepted only when its length is exact and its 64-bit FNV-1a digest
//! ([`tables_digest`]) equals [`TABLES_DIGEST`], which `cargo xtask upper-table` writes
//! beside the table, so a loaded table is this build's table to the last bit.

use crate::error::{Error, Result};

use super::upper_layout::NODES;
pub use super::upper_layout::TABLES_DIGEST;
#[cfg(feature = "upper")]
use super::upper_table::{LN_DENSITY, SLOPE};

/// ln n of N2, O, O2, Ar, He, H at each node (n in 1/m^3).
pub(super) type LnDensity = [[f64; 6]; NODES];
/// d(ln n)/dZ at each node, per metre.
pub(super) type Slope = [[f32; 6]; NODES];

/// The first bytes of the tables' file.
pub const TABLES_MAGIC: [u8; 8] = *b"aeroUPPR";
/// The file's format version, after the magic (u32, little-endian).
pub const TABLES_FORMAT: u32 = 1;
const HEADER_BYTES: usize = TABLES_MAGIC.len() + 4;
const VALUES_BYTES: usize = NODES * 6 * 8;
/// The length of the tables' file, bytes (header, ln n as f64, slopes as f32).
pub const TABLES_FILE_BYTES: usize = HEADER_BYTES + VALUES_BYTES + NODES * 6 * 4;

/// The 64-bit FNV-1a digest of `bytes` (offset basis 0xcbf29ce484222325, prime
/// 0x100000001b3; the published FNV parameters, from memory).
pub fn tables_digest(bytes: &[u8]) -> u64 {
    bytes
        .iter()
        .fold(0xcbf2_9ce4_8422_2325, |hash, &b| (hash ^ u64::from(b)).wrapping_mul(0x0000_0100_0000_01b3))
}

/// Checks that `bytes` is this build's tables' file.
fn check(bytes: &[u8]) -> Result<()> {
    let refuse =
        |problem| Err(Error::UpperTablesRefused { problem, len: bytes.len(), expected: TABLES_FILE_BYTES });
    if !bytes.starts_with(&TABLES_MAGIC) {
        return refuse("it does not start as an aerostrata upper-atmosphere tables file does");
    }
    if bytes.get(TABLES_MAGIC.len()..HEADER_BYTES) != Some(&TABLES_FORMAT.to_le_bytes()[..]) {
        return refuse("its format version is not the one this build reads");
    }
    if bytes.len() != TABLES_FILE_BYTES {
        return refuse("its length is wrong (a cut or padded file, or one of another version)");
    }
    if tables_digest(bytes) != TABLES_DIGEST {
        return refuse("its digest is not this build's (a damaged file, or one of another version)");
    }
    Ok(())
}

/// Loads the upper atmosphere's tables from their file (the one `cargo xtask wasm` ships
/// as `aerostrata_upper.bin`, or `tables_file` writes with `upper` and `alloc`), so that altitudes above 86 km
/// can be answered in a build with the `upper-loadable` feature and without `upper`.
/// Loading twice is harmless; with `upper` the tables are compiled in and a good file
/// changes nothing.
///
/// # Errors
/// [`Error::UpperTablesRefused`] when `bytes` is not this build's file: another magic or
/// format version, a wrong length, or a digest other than [`TABLES_DIGEST`].
pub fn load_tables(bytes: &[u8]) -> Result<()> {
    check(bytes)?;
    #[cfg(not(feature = "upper"))]
    loaded::set(bytes);
    Ok(())
}

/// Whether the tables can be read: always with `upper`, after a successful
/// [`load_tables`] with `upper-loadable` alone.
pub fn tables_loaded() -> bool {
    #[cfg(feature = "upper")]
    return true;
    #[cfg(not(feature = "upper"))]
    loaded::get().is_some()
}

/// The tables, or [`Error::UpperNotLoaded`] naming `z_m` (the altitude that needed them).
pub(super) fn tables(z_m: f64) -> Result<(&'static LnDensity, &'static Slope)> {
    #[cfg(feature = "upper")]
    {
        let _ = z_m;
        Ok((&LN_DENSITY, &SLOPE))
    }
    #[cfg(not(feature = "upper"))]
    loaded::get().ok_or(Error::UpperNotLoaded { altitude_m: z_m })
}

/// The compiled-in tables as their file: what `cargo xtask wasm` ships beside the web
/// module ([`TABLES_FILE_BYTES`] bytes; its digest is [`TABLES_DIGEST`]).
#[cfg(all(feature = "upper", feature = "alloc"))]
pub fn tables_file() -> alloc::vec::Vec<u8> {
    let mut file = alloc::vec::Vec::with_capacity(TABLES_FILE_BYTES);
    file.extend_from_slice(&TABLES_MAGIC);
    file.extend_from_slice(&TABLES_FORMAT.to_le_bytes());
    LN_DENSITY.iter().flatten().for_each(|v| file.extend_from_slice(&v.to_le_bytes()));
    SLOPE.iter().flatten().for_each(|v| file.extend_from_slice(&v.to_le_bytes()));
    file
}

/// The tables read from a file, set once for the life of the program (leaked: they are
/// needed until it ends). `once_cell`'s `race::OnceRef` needs neither `unsafe` here nor
/// std; two threads loading at once may each read the file, and one copy is then unused.
#[cfg(not(feature = "upper"))]
mod loaded {
    use alloc::boxed::Box;

    use once_cell::race::OnceRef;

    use super::{LnDensity, Slope, HEADER_BYTES, NODES, VALUES_BYTES};

    struct Loaded {
        ln_density: LnDensity,
        slope: Slope,
    }

    static LOADED: OnceRef<'static, Loaded> = OnceRef::new();

    pub(super) fn get() -> Option<(&'static LnDensity, &'static Slope)> {
        LOADED.get().map(|t| (&t.ln_density, &t.slope))
    }

    /// Reads the values of a file that passed `check`.
    pub(super) fn set(bytes: &[u8]) {
        if LOADED.get().is_some() {
            return;
        }
        let mut tables = Box::new(Loaded { ln_density: [[0.0; 6]; NODES], slope: [[0.0; 6]; NODES] });
        let values = bytes.get(HEADER_BYTES..HEADER_BYTES + VALUES_BYTES).unwrap_or_default();
        let slopes = bytes.get(HEADER_BYTES + VALUES_BYTES..).unwrap_or_default();
        for (slot, chunk) in tables.ln_density.iter_mut().flatten().zip(values.chunks_exact(8)) {
            let mut word = [0; 8];
            word.copy_from_slice(chunk);
            *slot = f64::from_le_bytes(word);
        }
        for (slot, chunk) in tables.slope.iter_mut().flatten().zip(slopes.chunks_exact(4)) {
            let mut word = [0; 4];
            word.copy_from_slice(chunk);
            *slot = f32::from_le_bytes(word);
        }
        let _ = LOADED.set(Box::leak(tables));
    }
}

#[cfg(all(test, feature = "upper", feature = "alloc"))]
mod tests {
    use super::*;

    /// The compiled-in table, written as its file, has the digest `cargo xtask
    /// upper-table` wrote beside it: table and digest cannot drift apart.
    #[test]
    fn the_compiled_in_table_has_the_generated_digest() {
        let file = tables_file();
        assert_eq!(file.len(), TABLES_FILE_BYTES);
        assert_eq!(tables_digest(&file), TABLES_DIGEST);
    }

    /// FNV-1a 64 of "" and "a" are the published check values 0xcbf29ce484222325 and
    /// 0xaf63dc4c8601ec8c (from memory of the FNV reference).
    #[test]
    fn the_digest_is_fnv_1a() {
        assert_eq!(tables_digest(b""), 0xcbf2_9ce4_8422_2325);
        assert_eq!(tables_digest(b"a"), 0xaf63_dc4c_8601_ec8c);
    }

    /// The file is accepted; a cut one, one with a byte changed, one with another magic or
    /// format version, and one padded are refused, each with its reason (hand-worked).
    #[test]
    fn only_the_exact_file_is_accepted() {
        let file = tables_file();
        assert_eq!(load_tables(&file), Ok(()));
        let problem = |bytes: &[u8]| match load_tables(bytes) {
            Err(Error::UpperTablesRefused { problem, len, expected }) => {
                assert_eq!((len, expected), (bytes.len(), TABLES_FILE_BYTES));
                problem
            }
            other => panic!("{other:?}"),
        };
        assert!(problem(&file[..file.len() - 1]).contains("length"));
        assert!(problem(&file[..5]).contains("does not start"));
        assert!(problem(&[]).contains("does not start"));
        let mut changed = file.clone();
        changed[HEADER_BYTES + 1000] ^= 1;
        assert!(problem(&changed).contains("digest"));
        let mut magic = file.clone();
        magic[0] = b'A';
        assert!(problem(&magic).contains("does not start"));
        let mut version = file.clone();
        version[TABLES_MAGIC.len()] = 2;
        assert!(problem(&version).contains("format version"));
        let mut padded = file.clone();
        padded.push(0);
        assert!(problem(&padded).contains("length"));
        let message =
            Error::UpperTablesRefused { problem: "x", len: 3, expected: TABLES_FILE_BYTES }.to_string();
        assert!(message.contains("upper-atmosphere tables") && message.contains('3'), "{message}");
    }
}
