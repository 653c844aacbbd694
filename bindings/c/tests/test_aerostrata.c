/*
 * C tests of libaerostrata: the reference vectors of tests/vectors (the same files the
 * Rust tests read), every status, NULL arguments, bad arrays, outputs written only on
 * success, handle lifetimes and handle misuse. Built as C99 with -Wall -Wextra -Werror -pedantic
 * against the static and the shared library, and run under AddressSanitizer with
 * UBSan and under Valgrind by `cargo xtask test` (crates/xtask/src/c/c_test.rs).
 *
 * This file holds the tally and main(); the checks are in the other test_*.c files, by
 * subject (check.h lists them).
 *
 * Usage: test_aerostrata VECTOR_DIR        Ends with "N passed, N failed".
 */
#include "check.h"

int passed = 0;
int failed = 0;

void check(int ok, const char *what, int line) {
    if (ok) {
        passed++;
    } else {
        failed++;
        printf("FAIL line %d: %s\n", line, what);
    }
}

int status_is(AerostrataStatus got, AerostrataStatus want, int line) {
    AerostrataErrorDetail d;
    int ok = got == want;
    if (!ok) {
        printf("FAIL line %d: status %d (%s), want %d\n", line, (int)got, aerostrata_status_message((int)got),
               (int)want);
    }
    if (aerostrata_last_error(&d) != AEROSTRATA_STATUS_OK || d.status != got) {
        printf("FAIL line %d: the detail's status %d differs from the returned %d\n", line, (int)d.status,
               (int)got);
        ok = 0;
    }
    return ok;
}

int main(int argc, char **argv) {
    const char *dir = argc > 1 ? argv[1] : "tests/vectors";
    int cells = 0;
    test_status_messages();
    test_detail();
    test_every_status();
    test_models();
    test_batches();
    test_handles();
    test_helpers();
    test_flight();
    test_loads();
    test_spreadsheet();
    test_species();
    test_catalogue();
    test_spreadsheet_addin();
    {
        char corpus[1024];
        snprintf(corpus, sizeof corpus, "%s/../../fuzz/corpus", dir);
        test_corpus(corpus);
    }
    cells += check_vector_file(dir, "usa76_lower.csv", MODEL_US1976);
    cells += check_vector_file(dir, "usa76_upper.csv", MODEL_US1976);
    cells += check_vector_file(dir, "usa76_upper_high.csv", MODEL_US1976);
    cells += check_vector_file(dir, "hydrostatic_offset_hot.csv", MODEL_HYDROSTATIC_OFFSET);
    cells += check_vector_file(dir, "hydrostatic_offset_cold.csv", MODEL_HYDROSTATIC_OFFSET);
    cells += check_vector_file(dir, "naca1135_normal_shock.csv", MODEL_SHOCK);
    check(cells > 300, "the vector files hold the cells they should", __LINE__);
    printf("%d passed, %d failed\n", passed, failed);
    return failed == 0 ? 0 : 1;
}
