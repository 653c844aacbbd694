/*
 * What the C test files share: the tally of checks, CHECK and STATUS, and the test
 * groups main() runs. Every check counts once in the closing "N passed, N failed".
 */
#ifndef AEROSTRATA_TESTS_CHECK_H
#define AEROSTRATA_TESTS_CHECK_H

#include "aerostrata.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* The tally (test_aerostrata.c). */
extern int passed;
extern int failed;

/* Counts `ok` as passed or failed; a failure prints `what` and the line. */
void check(int ok, const char *what, int line);
#define CHECK(cond) check((cond) ? 1 : 0, #cond, __LINE__)

/* The status a call returned, and that the thread's detail agrees with it. */
int status_is(AerostrataStatus got, AerostrataStatus want, int line);
#define STATUS(call, want) check(status_is((call), (want), __LINE__), #call, __LINE__)

/* The reference vectors (test_vectors.c): checks every cell of one file of `dir`
 * against the model it names and returns the number of cells checked. */
enum vector_model { MODEL_US1976, MODEL_HYDROSTATIC_OFFSET, MODEL_SHOCK };
int check_vector_file(const char *dir, const char *file, enum vector_model model);

/* Statuses and the error detail (test_status.c). */
void test_status_messages(void);
void test_detail(void);
void test_every_status(void);

/* Model handles and batches (test_models.c). */
void test_models(void);
void test_batches(void);

/* The fuzzing corpus's specs and values through the text entry points (test_corpus.c);
 * `corpus` is fuzz/corpus. */
void test_corpus(const char *corpus);

/* Handle misuse: used after free, freed twice, of another type, no handle (test_handles.c). */
void test_handles(void);

/* Aerodynamics, compressible flow, airspeeds, altimetry, drag curves and the flight
 * scan (test_aero.c). */
void test_helpers(void);
void test_flight(void);

/* Winds aloft, the vector flight scan, q-alpha and limit exceedances (test_loads.c). */
void test_loads(void);

/* The spreadsheet functions, the species and the quantity catalogue (test_catalogue.c). */
void test_spreadsheet(void);
void test_species(void);
void test_catalogue(void);

/* The spreadsheet add-in's functions against the status-returning ones
 * (test_spreadsheet_addin.c). */
void test_spreadsheet_addin(void);

#endif
