//! The model grammar (`aerostrata::model::ModelSpec::parse`, what `--model`, the web
//! page and the spreadsheet functions read) over arbitrary text; a spec that parses and
//! names no file is built (`AnyModel::from_spec`) and evaluated across its range.

use aerostrata::model::ModelSpec;
use aerostrata::AnyModel;

use crate::{message, probe, text};

/// The target's body.
pub fn run(data: &[u8]) {
    let spec = text(data);
    match ModelSpec::parse(spec) {
        Ok(parsed) => match AnyModel::from_spec(&parsed) {
            Some(Ok(model)) => probe(&model, &[]),
            Some(Err(e)) => message(&e),
            None => {}
        },
        Err(e) => message(&e),
    }
}
