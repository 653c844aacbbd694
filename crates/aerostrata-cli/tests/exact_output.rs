//! The fast path of `eval` and `flight` (the cell reader, the state, the number writer)
//! against the slow one: 10 000 rows of each through the binary, compared byte for byte
//! with the core's scalar path on the same cells read by `str::parse` and written by
//! std's formatting (`{}` from 1e-3 to 1e7, `{:e}` outside: the shortest text that reads
//! back, from memory of std's float formatting). Common practice, no source.

mod common;

use aerostrata::flight::{FlightPoint, FlightScan, Sample};
use aerostrata::quantity::Group;
use aerostrata::{Altitude, Atmosphere, Quantity, US1976};
use common::stdout_of;

/// std's exact text of `value`, as the CLI promises to write it.
fn std_text(value: f64) -> String {
    let magnitude = value.abs();
    if magnitude != 0.0 && !(1e-3..1e7).contains(&magnitude) {
        format!("{value:e}")
    } else {
        format!("{value}")
    }
}

/// A small generator (xorshift64), so that every run reads the same cells.
struct Cells(u64);

impl Cells {
    fn next(&mut self) -> u64 {
        self.0 ^= self.0 << 13;
        self.0 ^= self.0 >> 7;
        self.0 ^= self.0 << 17;
        self.0
    }

    /// A number in [low, high) written as a file may hold it: a whole number, a short
    /// decimal, every digit of an f64, an exponent, a leading `+` or zeros, a point at
    /// either end.
    fn number(&mut self, low: f64, high: f64) -> String {
        let value = low + (self.next() >> 11) as f64 / (1u64 << 53) as f64 * (high - low);
        match self.next() % 9 {
            0 => format!("{}", value.round()),
            1 => format!("{value:.1}"),
            2 => format!("{value:.3}"),
            3 => format!("{value}"),
            4 => format!("{value:e}"),
            5 => format!("{:E}", value.round()),
            6 if value >= 0.0 => format!("+{value:.2}"),
            7 if value >= 0.0 => format!("00{value:.4}"),
            8 if value >= 1.0 => format!("{}.", value.round()),
            _ => format!("{value:.6}"),
        }
    }
}

const ROWS: usize = 10_000;

#[test]
fn eval_writes_the_scalar_paths_numbers_in_stds_text() {
    let mut cells = Cells(0x2545_f491_4f6c_dd1d);
    // Through every layer of the standard, above 86 km (empty cells) up to 1000 km.
    let altitudes: Vec<String> =
        (0..ROWS)
            .map(|i| {
                if i % 5 == 0 {
                    cells.number(86_000.0, 1_000_000.0)
                } else {
                    cells.number(-5_000.0, 86_000.0)
                }
            })
            .collect();
    let input = altitudes.join("\n") + "\n";
    let output = stdout_of(&["eval"], &input);
    let mut lines = output.lines();
    let header = lines.next().unwrap();
    let quantities: Vec<Quantity> = Quantity::of_group(Group::State).collect();
    assert_eq!(header.split(',').count(), quantities.len());
    let mut compared = 0;
    for (text, line) in altitudes.iter().zip(lines) {
        let altitude = Altitude::geometric_m(text.parse().unwrap()).unwrap();
        let state = US1976.state(altitude).unwrap();
        let expected: Vec<String> =
            quantities.iter().map(|q| state.get(*q).map(std_text).unwrap_or_default()).collect();
        assert_eq!(line, expected.join(","), "altitude {text}");
        compared += 1;
    }
    assert_eq!(compared, ROWS);
}

#[test]
fn flight_writes_the_scalar_paths_numbers_in_stds_text() {
    let mut cells = Cells(0x9e37_79b9_7f4a_7c15);
    let rows: Vec<[String; 3]> = (0..ROWS)
        .map(|i| {
            let time = format!("{}", i as f64 * 0.01);
            [time, cells.number(0.0, 80_000.0), cells.number(0.0, 2_000.0)]
        })
        .collect();
    let input: String = rows.iter().map(|r| r.join(",") + "\n").collect();
    let output = stdout_of(&["flight", "-", "--summary", "none"], &input);
    let mut lines = output.lines();
    let header = lines.next().unwrap();
    // A speed without direction: the flight point's first thirteen quantities.
    let quantities = &FlightPoint::QUANTITIES[..13];
    assert_eq!(header.split(',').count(), quantities.len());
    let mut scan = FlightScan::new(&US1976, None);
    let mut compared = 0;
    for (cells, line) in rows.iter().zip(lines) {
        let [time_s, altitude_m, velocity_m_s] = [0, 1, 2].map(|i| cells[i].parse::<f64>().unwrap());
        let point = scan.push(Sample { time_s, altitude_m, velocity_m_s }).unwrap();
        let expected: Vec<String> =
            quantities.iter().map(|q| point.get(*q).map(|v| std_text(v + 0.0)).unwrap_or_default()).collect();
        assert_eq!(line, expected.join(","), "row {cells:?}");
        compared += 1;
    }
    assert_eq!(compared, ROWS);
}
