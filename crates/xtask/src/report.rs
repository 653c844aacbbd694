//! docs/performance.md is written by several commands (`bench`, `wasm-bench`, `icount`, `batch-bench`, `cli-bench`),
//! each owning one section between a pair of HTML comment markers; a command rewrites its
//! own section and keeps the others.

/// A section of the report: its begin and end markers.
#[derive(Clone, Copy)]
pub struct Section {
    pub begin: &'static str,
    pub end: &'static str,
}

/// The section `wasm-bench` writes.
pub const WASM: Section = Section {
    begin: "<!-- wasm-bench: begin (written by `cargo xtask wasm-bench`) -->",
    end: "<!-- wasm-bench: end -->",
};

/// The section `icount` writes.
pub const ICOUNT: Section = Section {
    begin: "<!-- icount: begin (written by `cargo xtask icount`) -->",
    end: "<!-- icount: end -->",
};

/// The section `batch-bench` writes.
pub const BATCH: Section = Section {
    begin: "<!-- batch-bench: begin (written by `cargo xtask batch-bench`) -->",
    end: "<!-- batch-bench: end -->",
};

/// The section `cli-bench` writes.
pub const CLI: Section = Section {
    begin: "<!-- cli-bench: begin (written by `cargo xtask cli-bench`) -->",
    end: "<!-- cli-bench: end -->",
};

/// Every section another command owns, in the order they follow `bench`'s text.
pub const KEPT: [Section; 4] = [ICOUNT, WASM, BATCH, CLI];

impl Section {
    /// Replaces this section of `report` with `text` (markers included), or appends it.
    pub fn splice(self, report: &str, text: &str) -> String {
        match (report.find(self.begin), report.find(self.end)) {
            (Some(begin), Some(end)) if end > begin => {
                format!("{}{text}{}", &report[..begin], &report[end + self.end.len()..])
            }
            _ => format!("{}\n\n{text}\n", report.trim_end()),
        }
    }

    /// This section of `report`, markers included, if it has one.
    pub fn of(self, report: &str) -> Option<&str> {
        let begin = report.find(self.begin)?;
        let end = report[begin..].find(self.end)? + begin;
        Some(&report[begin..end + self.end.len()])
    }
}

/// `fresh` with every section of `old` that another command owns carried over.
pub fn keep_others(fresh: &str, old: &str) -> String {
    KEPT.iter().fold(fresh.to_owned(), |report, section| match section.of(old) {
        Some(text) => section.splice(&report, text),
        None => report,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn sections_are_replaced_appended_and_kept() {
        let text = format!("{}\nnew\n{}", WASM.begin, WASM.end);
        let appended = WASM.splice("# Performance\n\nold text\n", &text);
        assert!(appended.ends_with(&format!("{text}\n")));
        let replaced = WASM.splice(&format!("head\n{}\nold\n{}\ntail\n", WASM.begin, WASM.end), &text);
        assert_eq!(replaced, format!("head\n{text}\ntail\n"));
        assert_eq!(WASM.of(&replaced), Some(text.as_str()));
        assert_eq!(WASM.of("no markers"), None);
        let counts = format!("{}\ncounts\n{}", ICOUNT.begin, ICOUNT.end);
        let old = format!("# old\n\n{counts}\n\n{text}\n");
        let kept = keep_others("# fresh\n", &old);
        assert!(kept.starts_with("# fresh") && kept.contains(&counts) && kept.contains(&text));
    }
}
