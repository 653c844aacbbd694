//! A large batch of the 1976 standard shared among rayon's threads: the altitudes and every
//! output column are cut into the same chunks, each chunk is the serial batch of its
//! altitudes, so every value is the serial batch's (and the scalar path's) bits.

use rayon::prelude::*;
use std::vec::Vec;

use crate::altitude::AltitudeKind;
use crate::model::Us1976;
use crate::quantity::Quantity;

use super::standard::run_standard;
use super::{check_request, BatchError, BLOCK};

/// Altitudes per chunk: large enough that handing a chunk to a thread costs nothing next
/// to its work (about 1 ms at 40 ns an altitude), small enough that two or more threads
/// share a million altitudes evenly.
pub const CHUNK: usize = 256 * BLOCK;

impl Us1976 {
    /// As [`Us1976::batch`], the altitudes shared in chunks of [`CHUNK`] among the
    /// threads of rayon's global pool (`RAYON_NUM_THREADS` sets their number); a batch of
    /// at most two chunks runs on the calling thread. Every value is bit for bit the serial
    /// batch's. Allocates one small list of the chunks' column pieces.
    ///
    /// # Errors
    /// As [`Us1976::batch`]: the error of the lowest failing index. The elements before
    /// it are written; elements after it may be written too (other threads' chunks).
    pub fn batch_parallel(
        &self,
        kind: AltitudeKind,
        altitudes_m: &[f64],
        quantities: &[Quantity],
        outputs: &mut [&mut [f64]],
    ) -> Result<(), BatchError> {
        check_request(altitudes_m.len(), quantities, outputs)?;
        if altitudes_m.len() <= 2 * CHUNK {
            return run_standard(kind, altitudes_m, quantities, outputs, 0);
        }
        let chunks = altitudes_m.len().div_ceil(CHUNK);
        let mut pieces: Vec<Vec<&mut [f64]>> =
            (0..chunks).map(|_| Vec::with_capacity(outputs.len())).collect();
        for column in outputs.iter_mut() {
            for (piece, list) in column.chunks_mut(CHUNK).zip(pieces.iter_mut()) {
                list.push(piece);
            }
        }
        let results: Vec<Result<(), BatchError>> = altitudes_m
            .par_chunks(CHUNK)
            .zip(pieces.par_iter_mut())
            .enumerate()
            .map(|(number, (altitudes, columns))| {
                run_standard(kind, altitudes, quantities, columns, number * CHUNK)
            })
            .collect();
        // In chunk order, so the first error is the lowest index's.
        results.into_iter().find(Result::is_err).unwrap_or(Ok(()))
    }
}
