/*
 * The fuzzing corpus's model specs and values (fuzz/corpus/model_spec, fuzz/corpus/units)
 * through the C library's text entry points, as they are and mutated (cut in half, a
 * control character in the middle, a line end, 70 000 characters, not UTF-8), the same
 * inputs the command line's and the WebAssembly module's replays take
 * (crates/aerostrata-cli/tests/corpus_replay.rs, bindings/wasm/tests/corpus.test.mjs).
 * Under AddressSanitizer, UBSan and Valgrind (c_test.rs) this is the C door's part of the
 * replay. What every call must show: the spreadsheet functions return a finite number or
 * NaN (their documented error), never an infinity; aerostrata_quantity_from_name returns
 * OK or INVALID_ARGUMENT, never PANIC; every message is short and holds no raw control
 * character (docs/robustness.md).
 */
#define _POSIX_C_SOURCE 200809L

#include "check.h"

#include <dirent.h>
#include <stdlib.h>

/* At most this many bytes of a corpus file are read (the corpus's are far smaller). */
#define MAX_INPUT 4096
#define LONG_INPUT 70000

static int calls = 0;

static int no_control_characters(const char *message) {
    for (const unsigned char *c = (const unsigned char *)message; *c; c++) {
        if (*c < 0x20 || *c == 0x7f) {
            return 0;
        }
    }
    return 1;
}

static void check_spec(const char *spec) {
    double valid = aerostrata_xl_model_valid(spec);
    uint32_t id;
    AerostrataErrorDetail detail;
    AerostrataStatus status;
    calls++;
    CHECK(valid == 1.0 || isnan(valid));
    for (uint32_t quantity = 0; quantity < 20; quantity++) {
        double value = aerostrata_xl_state(quantity, 1000.0, spec);
        CHECK(!isinf(value));
        CHECK(!isnan(valid) || isnan(value));
    }
    CHECK(!isinf(aerostrata_xl_dynamic_pressure_at(1000.0, 250.0, spec)));
    CHECK(!isinf(aerostrata_xl_mach_at(1000.0, 250.0, spec)));
    status = aerostrata_quantity_from_name(spec, &id);
    CHECK(status == AEROSTRATA_STATUS_OK || status == AEROSTRATA_STATUS_INVALID_ARGUMENT);
    CHECK(aerostrata_last_error(&detail) == AEROSTRATA_STATUS_OK);
    CHECK(strlen(detail.message) < 400);
    CHECK(no_control_characters(detail.message));
}

/* The input and its mutations. */
static void replay(const char *text, size_t length) {
    char *buffer = malloc(LONG_INPUT + 1);
    size_t half = length / 2;
    if (buffer == NULL) {
        CHECK(buffer != NULL);
        return;
    }
    memcpy(buffer, text, length);
    buffer[length] = '\0';
    check_spec(buffer);
    buffer[half] = '\0';
    check_spec(buffer);
    memcpy(buffer, text, length);
    buffer[length] = '\0';
    if (length > 0) {
        buffer[half] = '\x1b';
        check_spec(buffer);
        buffer[half] = '\n';
        check_spec(buffer);
        buffer[half] = (char)0xff;
        check_spec(buffer);
    }
    memset(buffer, 'k', LONG_INPUT);
    memcpy(buffer, text, length);
    buffer[LONG_INPUT] = '\0';
    check_spec(buffer);
    free(buffer);
}

static void replay_dir(const char *corpus, const char *name) {
    char path[1024];
    DIR *dir;
    struct dirent *entry;
    int files = 0;
    snprintf(path, sizeof path, "%s/%s", corpus, name);
    dir = opendir(path);
    CHECK(dir != NULL);
    if (dir == NULL) {
        printf("FAIL: cannot open %s\n", path);
        return;
    }
    while ((entry = readdir(dir)) != NULL) {
        char file[2048];
        char text[MAX_INPUT];
        size_t length;
        FILE *in;
        if (entry->d_name[0] == '.') {
            continue;
        }
        snprintf(file, sizeof file, "%s/%s", path, entry->d_name);
        in = fopen(file, "rb");
        if (in == NULL) {
            continue;
        }
        length = fread(text, 1, sizeof text - 1, in);
        fclose(in);
        /* Up to the first NUL: a C string is all the library can be handed. */
        text[length] = '\0';
        replay(text, strlen(text));
        files++;
    }
    closedir(dir);
    CHECK(files >= 10);
}

void test_corpus(const char *corpus) {
    replay_dir(corpus, "model_spec");
    replay_dir(corpus, "units");
    CHECK(calls >= 120);
}
