/*
 * altimeter: a post-flight pass over a barometer log with the aerostrata C library.
 *
 * Reads CSV lines "time_s,pressure_Pa" (comment lines start with '#', a header line is
 * skipped), takes the pad pressure as the mean of the samples before t = 0, and writes
 * for every sample:
 *
 *   altitude above the pad   aerostrata_barometric_altitude_m with the pad reference
 *   vertical speed           slope of a least-squares line through the altitudes of a
 *                            centred window of WINDOW samples (the smoothed altitude is
 *                            that line's value at the sample)
 *   density                  the standard atmosphere's at the sample's pressure altitude
 *   dynamic pressure         aerostrata_dynamic_pressure_pa(density, vertical speed)
 *
 * as CSV on stdout, and a summary (pad pressure, apogee, maximum dynamic pressure) on
 * stderr. The dynamic pressure assumes a vertical flight and a standard-day temperature.
 *
 * Exit status: 0 on success, 2 for bad input (one line on stderr naming the line and
 * the value), 1 when the log cannot be read.
 *
 * Not certified flight software: a demonstration of the C interface. Verify any number
 * that matters independently.
 */

#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "aerostrata.h"

/* Samples in the centred smoothing window (odd). */
#define WINDOW 11
/* The longest log accepted, samples. */
#define MAX_SAMPLES 1000000

typedef struct {
    double time_s;
    double pressure_pa;
    double altitude_m; /* above the pad, from the barometer */
} Sample;

static int fail_status(const char *what, AerostrataStatus status) {
    AerostrataErrorDetail detail;
    if (aerostrata_last_error(&detail) == AEROSTRATA_STATUS_OK && detail.message[0] != '\0') {
        fprintf(stderr, "altimeter: %s: %s\n", what, detail.message);
    } else {
        fprintf(stderr, "altimeter: %s: %s\n", what, aerostrata_status_message((int)status));
    }
    return 2;
}

/* Reads the log; returns 0, or the exit status after printing one line. */
static int read_log(FILE *in, Sample **out, size_t *count) {
    char line[256];
    size_t n = 0, capacity = 0;
    Sample *samples = NULL;
    unsigned long line_number = 0;
    while (fgets(line, sizeof line, in)) {
        char *end;
        double t, p;
        line_number++;
        if (line[0] == '#' || line[0] == '\n' || line[0] == '\r' || strncmp(line, "time_s", 6) == 0) {
            continue;
        }
        errno = 0;
        t = strtod(line, &end);
        if (end == line || *end != ',' || errno != 0) {
            fprintf(stderr, "altimeter: line %lu: expected time_s,pressure_Pa, got '%.40s'\n", line_number, line);
            free(samples);
            return 2;
        }
        p = strtod(end + 1, &end);
        if (errno != 0 || (*end != '\n' && *end != '\r' && *end != '\0')) {
            fprintf(stderr, "altimeter: line %lu: the pressure is not a number\n", line_number);
            free(samples);
            return 2;
        }
        if (n > 0 && !(t > samples[n - 1].time_s)) {
            fprintf(stderr, "altimeter: line %lu: time %g s does not follow %g s\n", line_number, t,
                    samples[n - 1].time_s);
            free(samples);
            return 2;
        }
        if (n == capacity) {
            Sample *grown;
            if (capacity >= MAX_SAMPLES) {
                fprintf(stderr, "altimeter: more than %d samples\n", MAX_SAMPLES);
                free(samples);
                return 2;
            }
            capacity = capacity ? 2 * capacity : 1024;
            grown = realloc(samples, capacity * sizeof *samples);
            if (!grown) {
                free(samples);
                fprintf(stderr, "altimeter: out of memory\n");
                return 1;
            }
            samples = grown;
        }
        samples[n].time_s = t;
        samples[n].pressure_pa = p;
        n++;
    }
    if (ferror(in)) {
        free(samples);
        fprintf(stderr, "altimeter: cannot read the log\n");
        return 1;
    }
    *out = samples;
    *count = n;
    return 0;
}

/* Least-squares line through the samples [first, last] (altitude against time),
 * evaluated at time t: writes the value and the slope. */
static void fit(const Sample *s, size_t first, size_t last, double t, double *value, double *slope) {
    double mean_t = 0.0, mean_h = 0.0, stt = 0.0, sth = 0.0;
    size_t i, n = last - first + 1;
    for (i = first; i <= last; i++) {
        mean_t += s[i].time_s;
        mean_h += s[i].altitude_m;
    }
    mean_t /= (double)n;
    mean_h /= (double)n;
    for (i = first; i <= last; i++) {
        stt += (s[i].time_s - mean_t) * (s[i].time_s - mean_t);
        sth += (s[i].time_s - mean_t) * (s[i].altitude_m - mean_h);
    }
    *slope = stt > 0.0 ? sth / stt : 0.0;
    *value = mean_h + *slope * (t - mean_t);
}

int main(int argc, char **argv) {
    FILE *in = stdin;
    Sample *samples = NULL;
    size_t n = 0, i, pad_count = 0;
    double pad_pa = 0.0;
    double apogee_m = -1.0e300, apogee_t = 0.0, max_q = -1.0, max_q_t = 0.0;
    int status;

    if (argc > 2 || (argc == 2 && strcmp(argv[1], "--help") == 0)) {
        fprintf(stderr, "usage: altimeter [LOG.csv]   (reads stdin without a file)\n");
        return 2;
    }
    if (argc == 2 && !(in = fopen(argv[1], "r"))) {
        fprintf(stderr, "altimeter: cannot open %s\n", argv[1]);
        return 1;
    }
    status = read_log(in, &samples, &n);
    if (in != stdin) {
        fclose(in);
    }
    if (status != 0) {
        return status;
    }
    for (i = 0; i < n && samples[i].time_s < 0.0; i++) {
        pad_pa += samples[i].pressure_pa;
        pad_count++;
    }
    if (pad_count == 0 || n < WINDOW) {
        fprintf(stderr, "altimeter: the log needs samples before t = 0 (on the pad) and at least %d samples\n",
                WINDOW);
        free(samples);
        return 2;
    }
    pad_pa /= (double)pad_count;

    for (i = 0; i < n; i++) {
        AerostrataStatus st = aerostrata_barometric_altitude_m(samples[i].pressure_pa, AEROSTRATA_REFERENCE_PAD,
                                                               pad_pa, &samples[i].altitude_m);
        if (st != AEROSTRATA_STATUS_OK) {
            char what[64];
            snprintf(what, sizeof what, "sample %lu", (unsigned long)i + 1);
            free(samples);
            return fail_status(what, st);
        }
    }

    printf("time_s,pressure_Pa,altitude_above_pad_m,smoothed_altitude_m,vertical_speed_m_s,density_kg_m3,"
           "dynamic_pressure_Pa\n");
    for (i = 0; i < n; i++) {
        size_t half = WINDOW / 2;
        size_t first = i < half ? 0 : i - half;
        size_t last = i + half >= n ? n - 1 : i + half;
        double smoothed, speed, pressure_altitude, q;
        AerostrataState air;
        AerostrataStatus st;
        fit(samples, first, last, samples[i].time_s, &smoothed, &speed);
        st = aerostrata_pressure_altitude_m(samples[i].pressure_pa, &pressure_altitude);
        if (st == AEROSTRATA_STATUS_OK) {
            st = aerostrata_us1976_state(pressure_altitude, AEROSTRATA_GEOPOTENTIAL, 0.0, &air);
        }
        if (st == AEROSTRATA_STATUS_OK) {
            st = aerostrata_dynamic_pressure_pa(air.density_kg_m3, speed, &q);
        }
        if (st != AEROSTRATA_STATUS_OK) {
            char what[64];
            snprintf(what, sizeof what, "sample %lu", (unsigned long)i + 1);
            free(samples);
            return fail_status(what, st);
        }
        printf("%.3f,%.2f,%.3f,%.3f,%.3f,%.6f,%.1f\n", samples[i].time_s, samples[i].pressure_pa,
               samples[i].altitude_m, smoothed, speed, air.density_kg_m3, q);
        if (smoothed > apogee_m) {
            apogee_m = smoothed;
            apogee_t = samples[i].time_s;
        }
        if (q > max_q) {
            max_q = q;
            max_q_t = samples[i].time_s;
        }
    }
    fprintf(stderr, "pad pressure: %.1f Pa (mean of %lu samples before t = 0)\n", pad_pa, (unsigned long)pad_count);
    fprintf(stderr, "apogee: %.2f m above the pad at t = %.3f s\n", apogee_m, apogee_t);
    fprintf(stderr, "maximum dynamic pressure: %.1f Pa at t = %.3f s\n", max_q, max_q_t);
    free(samples);
    return 0;
}
