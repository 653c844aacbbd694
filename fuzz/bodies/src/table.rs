//! The table reader (`aerostrata::table::Header::read` and `read_row`, under every
//! flight, sounding and eval file) over arbitrary text: the first line is the header,
//! taking every quantity the catalogue has, and each later line a row.

use aerostrata::table::{is_header, Header};
use aerostrata::Quantity;

use crate::{finite, message, text};

/// The target's body.
pub fn run(data: &[u8]) {
    let text = text(data);
    let mut lines = text.lines();
    let Some(first) = lines.next() else { return };
    let _ = is_header(first);
    for (i, default) in [Quantity::si as fn(Quantity) -> _, Quantity::us].into_iter().enumerate() {
        // The first pass takes every quantity, the second every other one, so that
        // columns are also kept out.
        let header = match Header::read(first, |q| i == 0 || (q as usize) & 1 == 0, default) {
            Ok(header) => header,
            Err(e) => {
                message(&e);
                continue;
            }
        };
        assert!(header.count() <= aerostrata::table::MAX_COLUMNS);
        let mut out = vec![None; header.count()];
        for line in lines.clone() {
            let _ = is_header(line);
            match header.read_row(line, &mut out) {
                Ok(()) => {
                    for (index, value) in out.iter().enumerate() {
                        if let Some(value) = value {
                            finite("a cell", *value);
                            assert!(
                                header.column(index).is_some(),
                                "a value in column {index}, which is not taken"
                            );
                        }
                    }
                }
                Err(e) => message(&e),
            }
        }
    }
}
