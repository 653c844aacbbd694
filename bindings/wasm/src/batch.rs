//! Batch evaluation over many altitudes: `batch`, which returns new arrays, and the
//! buffer behind `batchInto` (glue.js), which writes into the caller's. Both run the
//! core's own batch (`aerostrata::batch`: the 1976 standard's layers lane-wise, one
//! column at a time), whose every value is the bits of `state(alt).get(q)`.

use alloc::vec::Vec;

use aerostrata::batch::{self, BatchError};
use aerostrata::quantity::Group;
use aerostrata::{AltitudeKind, Quantity, US1976};
use wasm_bindgen::prelude::*;

use crate::args;
use crate::error::{Failure, Js};
use crate::js;
use crate::model::{AtmosphereModel, Model};
use crate::quantity;
use crate::text::Text;

/// Most altitudes `batchInto` hands the module at once (glue.js's CHUNK): the buffer then
/// holds at most 21 x 16 384 numbers (2.6 MiB), whatever the batch's length.
const MAX_CHUNK: usize = 16_384;

/// `batchInto`'s buffer in the module's memory, kept in the model's handle between
/// calls so that a long run of batches allocates once: a chunk's altitudes, then one
/// column per quantity asked; with the request it was prepared for.
#[derive(Default)]
pub(crate) struct Scratch {
    values: Vec<f64>,
    quantities: Vec<Quantity>,
    geopotential: bool,
}

#[wasm_bindgen]
impl AtmosphereModel {
    /// Batch evaluation: the requested quantities of the state at every altitude of
    /// `altitudesM` (metres of `altitudeKind`), one `Float64Array` per quantity, keyed by
    /// its name (`quantities` lists names of `AtmosphereState`, such as
    /// `["temperatureK", "pressurePa", "densityKgM3"]`). At most 16 777 216 altitudes.
    /// `batchInto` writes into arrays the caller keeps instead, without making new ones.
    ///
    /// All or nothing: the first bad altitude throws (a `RangeError` naming its index), as
    /// does a continuum quantity asked for where the model does not define it (an `Error`
    /// naming the altitude).
    #[wasm_bindgen(js_name = batch, unchecked_return_type = "Record<StateQuantity, Float64Array>")]
    pub fn batch(
        &self,
        #[wasm_bindgen(js_name = altitudesM, unchecked_param_type = "Float64Array | number[]")]
        altitudes: JsValue,
        #[wasm_bindgen(js_name = quantities, unchecked_param_type = "StateQuantity[]")] quantities: JsValue,
        #[wasm_bindgen(js_name = altitudeKind, unchecked_optional_param_type = "AltitudeKind")] kind: JsValue,
    ) -> Result<JsValue, JsValue> {
        let kind = args::altitude_kind("altitudeKind", &kind, true)?;
        let columns = state_quantities(&quantities)?;
        let altitudes = js::numbers("altitudesM", &altitudes)?;
        let values = batch_columns(&self.model, kind, &altitudes, &columns).js()?;
        js::columns(&quantity::keys(columns.iter().copied()), &values, altitudes.len())
    }

    /// `batchInto`'s first step (glue.js): checks the quantities (JS keys) and the kind,
    /// makes the buffer room for `chunk` altitudes and their columns, and returns the
    /// buffer's address in the module's memory (bytes), where glue.js writes each
    /// chunk's altitudes and reads its columns through `Float64Array` views.
    #[wasm_bindgen(js_name = __batchPrepare, skip_typescript)]
    pub fn batch_prepare(
        &mut self,
        quantities: JsValue,
        kind: JsValue,
        chunk: usize,
    ) -> Result<usize, JsValue> {
        let kind = args::altitude_kind("altitudeKind", &kind, true)?;
        let columns = state_quantities(&quantities)?;
        let chunk = chunk.min(MAX_CHUNK);
        let len = chunk * (1 + columns.len());
        let values = &mut self.scratch.values;
        if values.len() < len {
            values.clear();
            if values.try_reserve_exact(len).is_err() {
                return Err(Failure::range(
                    Text::new("batchInto needs ")
                        .u(len)
                        .s(" numbers, more than the module's memory can hold")
                        .done(),
                )
                .into());
            }
            values.resize(len, 0.0);
        }
        self.scratch.quantities = columns;
        self.scratch.geopotential = kind == AltitudeKind::Geopotential;
        Ok(self.scratch.values.as_ptr() as usize)
    }

    /// `batchInto`'s step per chunk (glue.js): the `count` altitudes at the start of the
    /// buffer through the core's batch, each column written after them; an error names
    /// the altitude's index in the caller's whole array (`offset` is the chunk's first).
    #[wasm_bindgen(js_name = __batchRun, skip_typescript)]
    pub fn batch_run(&mut self, count: usize, offset: usize) -> Result<(), JsValue> {
        let Scratch { values, quantities, geopotential } = &mut self.scratch;
        let kind = if *geopotential { AltitudeKind::Geopotential } else { AltitudeKind::Geometric };
        let Some(buffer) = values.get_mut(..count * (1 + quantities.len())) else {
            return Err(Failure::plain("batchInto: a chunk larger than its buffer (glue.js)").into());
        };
        if count == 0 {
            return Ok(());
        }
        let (altitudes, columns) = buffer.split_at_mut(count);
        let mut outputs: Vec<&mut [f64]> = columns.chunks_mut(count).collect();
        core_batch(&self.model, kind, altitudes, quantities, &mut outputs, offset).js()
    }
}

/// The state quantities named (by JS key) in `quantities`: at least one, none twice.
fn state_quantities(quantities: &JsValue) -> Result<Vec<Quantity>, JsValue> {
    let state: Vec<Quantity> = Quantity::of_group(Group::State).collect();
    let indices = js::choices("quantities", quantities, &quantity::keys(state.iter().copied()))?;
    if indices.is_empty() || indices.len() > state.len() {
        return Err(Failure::range(
            Text::new("quantities lists ")
                .u(indices.len())
                .s(" names; the allowed range is 1 to ")
                .u(state.len())
                .done(),
        )
        .into());
    }
    let mut out: Vec<Quantity> = Vec::with_capacity(indices.len());
    for (i, &index) in indices.iter().enumerate() {
        let Some(&q) = state.get(index as usize) else { continue };
        if out.contains(&q) {
            return Err(Failure::plain(
                Text::new(&args::place("quantities", i))
                    .s(": ")
                    .s(&quantity::key(q))
                    .s(" is listed twice")
                    .done(),
            )
            .into());
        }
        out.push(q);
    }
    Ok(out)
}

/// The core's batch into `outputs` (one column per quantity, each as long as the
/// altitudes): the 1976 standard's own (`US1976.batch`: its layers lane-wise), any other
/// model's through `batch::evaluate`. The first bad element's error names it
/// `altitudesM[offset + i]`, the error `state(alt).get(q)` gives there.
fn core_batch(
    model: &Model,
    kind: AltitudeKind,
    altitudes: &[f64],
    quantities: &[Quantity],
    outputs: &mut [&mut [f64]],
    offset: usize,
) -> Result<(), Failure> {
    let result = match model {
        Model::Us1976 => US1976.batch(kind, altitudes, quantities, outputs),
        other => batch::evaluate(other, kind, altitudes, quantities, outputs),
    };
    result.map_err(|error| match error {
        BatchError::Element { index, error } => {
            Failure::from(error).at(&args::place("altitudesM", offset + index))
        }
        // The request is checked before (state quantities only, one column each, of the
        // altitudes' length), so none of these is reachable.
        _ => Failure::plain("batch: a malformed request (the door's own error)"),
    })
}

/// The batch itself, without JS: the columns one after the other in one vector
/// (`columns.len()` times `altitudes.len()` values).
pub(crate) fn batch_columns(
    model: &Model,
    kind: AltitudeKind,
    altitudes: &[f64],
    columns: &[Quantity],
) -> Result<Vec<f64>, Failure> {
    let count = altitudes.len();
    let mut out = args::zeroed(columns.len() * count)?;
    if count == 0 {
        return Ok(out);
    }
    let mut outputs: Vec<&mut [f64]> = out.chunks_mut(count).collect();
    core_batch(model, kind, altitudes, columns, &mut outputs, 0)?;
    drop(outputs);
    Ok(out)
}

#[cfg(test)]
mod tests {
    extern crate std;
    use aerostrata::{Altitude, Atmosphere};

    use super::*;
    use crate::model::standard;

    /// Every value is the scalar path's bits (the core's promise for its batch, checked
    /// here through the door), and an error names the element: common practice, no source.
    #[test]
    fn the_batch_gives_the_bits_of_single_states_and_names_a_bad_element() {
        // 300 km needs the upper atmosphere's tables (build.rs writes their file).
        aerostrata::model::upper::load_tables(include_bytes!(concat!(
            env!("OUT_DIR"),
            "/aerostrata_upper.bin"
        )))
        .unwrap();
        for offset_k in [0.0, 15.0] {
            let model = standard(offset_k).unwrap();
            let altitudes = [0.0, 5_000.5, 86_000.0, 300_000.0, 11_000.0, -4_999.0];
            let columns = [Quantity::Temperature, Quantity::Density, Quantity::NumberDensity];
            let values = batch_columns(&model, AltitudeKind::Geometric, &altitudes, &columns).unwrap();
            let n = altitudes.len();
            for (i, &z) in altitudes.iter().enumerate() {
                let state = model.state(Altitude::geometric_m(z).unwrap()).unwrap();
                assert_eq!(values[i].to_bits(), state.temperature_k.to_bits());
                assert_eq!(values[n + i].to_bits(), state.density_kg_m3.to_bits());
                assert_eq!(values[2 * n + i].to_bits(), state.number_density_m3.to_bits());
            }
        }
        let model = standard(0.0).unwrap();
        let bad = batch_columns(&model, AltitudeKind::Geometric, &[0.0, f64::NAN], &[Quantity::Temperature])
            .unwrap_err();
        assert!(
            bad.message.starts_with("altitudesM[1]: geometric altitude must be a finite number"),
            "{}",
            bad.message
        );
        let undefined =
            batch_columns(&model, AltitudeKind::Geometric, &[0.0, 100_000.0], &[Quantity::SpeedOfSound])
                .unwrap_err();
        assert_eq!(undefined.class, crate::error::Class::Plain);
        assert!(undefined.message.contains("speed of sound is not defined"), "{}", undefined.message);
    }

    /// A chunk's error names the index in the caller's whole array (hand-worked).
    #[test]
    fn an_offset_moves_the_index_of_the_error() {
        let mut column = [0.0; 2];
        let error = core_batch(
            &Model::Us1976,
            AltitudeKind::Geometric,
            &[0.0, 2.0e6],
            &[Quantity::Pressure],
            &mut [&mut column],
            16_384,
        )
        .unwrap_err();
        assert!(
            error.message.starts_with("altitudesM[16385]: geometric altitude 2000000 m"),
            "{}",
            error.message
        );
    }
}
