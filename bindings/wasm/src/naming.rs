//! JS names of the catalogue's quantities: the machine name and the SI unit's suffix in
//! camelCase (`speed_of_sound` in `m_s` is `speedOfSoundMS`). Names and suffixes are ASCII. Shared by the module and its
//! build script, which writes the TypeScript types from the same names.

use alloc::string::String;

/// The JS key of a quantity named `name` whose SI unit's suffix is `suffix`.
pub fn js_key(name: &str, suffix: &str) -> String {
    let mut out = String::with_capacity(name.len() + suffix.len());
    let words = name.split('_').chain(suffix.split('_')).filter(|w| !w.is_empty());
    for (i, word) in words.enumerate() {
        let mut chars = word.chars();
        if let Some(first) = chars.next() {
            if i == 0 {
                out.push(first);
            } else {
                out.push(first.to_ascii_uppercase());
            }
            out.extend(chars);
        }
    }
    out
}
