#![no_main]
libfuzzer_sys::fuzz_target!(|data: &[u8]| aerostrata_fuzz_bodies::units::run(data));
