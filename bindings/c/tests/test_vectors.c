/*
 * The reference vectors of tests/vectors, read with their own tolerance lines and
 * checked cell by cell through the C functions (the same files the Rust tests read).
 */
#include "check.h"

#include <stdlib.h>

#define MAX_COLUMNS 32
#define MAX_LINE 4096

enum rule { RULE_NONE, RULE_PRINTED, RULE_REL, RULE_ABS };

struct column {
    char name[64];
    enum rule rule;
    double amount;
};

/* Half a unit of the last digit written in `cell` ("1.2250E+00" -> 5e-5). */
static double printed_tolerance(const char *cell) {
    const char *p = cell;
    int decimals = 0;
    int exponent = 0;
    const char *dot;
    const char *e;
    while (*p == ' ' || *p == '+' || *p == '-') {
        p++;
    }
    dot = strchr(p, '.');
    e = strpbrk(p, "eE");
    if (dot != NULL && (e == NULL || dot < e)) {
        const char *end = e != NULL ? e : dot + strlen(dot);
        while (end > dot + 1 && (end[-1] == '\r' || end[-1] == '\n' || end[-1] == ' ')) {
            end--;
        }
        decimals = (int)(end - dot - 1);
    }
    if (e != NULL) {
        exponent = atoi(e + 1);
    }
    return 0.5 * pow(10.0, (double)(exponent - decimals));
}

static int parse_tolerance(const char *text, struct column *columns, int count) {
    char name[64];
    char rule[16];
    double amount = 0.0;
    int i;
    int fields = sscanf(text, "%63s %15s %lf", name, rule, &amount);
    if (fields < 2) {
        return 0;
    }
    for (i = 0; i < count; i++) {
        if (strcmp(columns[i].name, name) == 0) {
            return 0; /* a repeated tolerance line */
        }
    }
    if (count >= MAX_COLUMNS) {
        return 0;
    }
    strcpy(columns[count].name, name);
    if (strcmp(rule, "printed") == 0) {
        columns[count].rule = RULE_PRINTED;
    } else if (strcmp(rule, "rel") == 0 && fields == 3) {
        columns[count].rule = RULE_REL;
    } else if (strcmp(rule, "abs") == 0 && fields == 3) {
        columns[count].rule = RULE_ABS;
    } else {
        return 0;
    }
    columns[count].amount = amount;
    return 1;
}

/* The computed value for a vector column, found through the quantity catalogue (the
 * column is the quantity's SI column name); 0 when the state does not carry it. */
static int state_value(const AerostrataState *s, const char *name, double *value) {
    uint32_t id;
    AerostrataQuantityInfo info;
    for (id = 0; id < aerostrata_quantity_count(); id++) {
        if (aerostrata_quantity_info(id, &info) == AEROSTRATA_STATUS_OK && strcmp(info.si_column, name) == 0) {
            return aerostrata_state_get(s, id, value) == AEROSTRATA_STATUS_OK;
        }
    }
    return 0;
}

static int shock_value(const AerostrataNormalShock *s, const char *name, double *value) {
    if (strcmp(name, "m2") == 0) {
        *value = s->downstream_mach;
    } else if (strcmp(name, "p2_p1") == 0) {
        *value = s->pressure_ratio;
    } else if (strcmp(name, "rho2_rho1") == 0) {
        *value = s->density_ratio;
    } else if (strcmp(name, "t2_t1") == 0) {
        *value = s->temperature_ratio;
    } else if (strcmp(name, "p02_p01") == 0) {
        *value = s->total_pressure_ratio;
    } else if (strcmp(name, "p1_p02") == 0) {
        *value = 1.0 / s->pitot_pressure_ratio; /* the table prints the reciprocal */
    } else {
        return 0;
    }
    return 1;
}

/* Checks every cell of one vector file; returns the number of cells checked. */
int check_vector_file(const char *dir, const char *file, enum vector_model model) {
    char path[1024];
    char line[MAX_LINE];
    struct column tolerances[MAX_COLUMNS];
    int tolerance_count = 0;
    char header[MAX_COLUMNS][64];
    int header_count = 0;
    int have_model = 0;
    AerostrataModel *day = NULL;
    int cells = 0;
    int skipped = 0;
    FILE *f;
    snprintf(path, sizeof path, "%s/%s", dir, file);
    f = fopen(path, "r");
    if (f == NULL) {
        printf("FAIL: cannot open %s\n", path);
        failed++;
        return 0;
    }
    while (fgets(line, sizeof line, f) != NULL) {
        char *cell;
        char *save;
        int col;
        line[strcspn(line, "\r\n")] = '\0';
        if (line[0] == '#') {
            if (strncmp(line, "# model: ", 9) == 0) {
                if (model == MODEL_HYDROSTATIC_OFFSET) {
                    /* "hydrostatic_offset offset=K p0=PA": the day the file holds. */
                    double offset_k;
                    double p0_pa;
                    check(sscanf(line + 9, "hydrostatic_offset offset=%lf p0=%lf", &offset_k, &p0_pa) == 2,
                          "the file names a hydrostatic-offset day", __LINE__);
                    STATUS(aerostrata_model_new_hydrostatic_offset(offset_k, p0_pa, &day), AEROSTRATA_STATUS_OK);
                } else {
                    const char *want = model == MODEL_US1976 ? "us1976" : "normal_shock gamma=1.4";
                    check(strcmp(line + 9, want) == 0, "the file's model is the one tested", __LINE__);
                }
                have_model = 1;
            } else if (strncmp(line, "# tolerance: ", 13) == 0) {
                check(parse_tolerance(line + 13, tolerances, tolerance_count), line, __LINE__);
                tolerance_count++;
            }
            continue;
        }
        if (line[0] == '\0') {
            continue;
        }
        if (header_count == 0) {
            /* The header: every column but the first needs a tolerance line. */
            for (cell = strtok(line, ","); cell != NULL && header_count < MAX_COLUMNS; cell = strtok(NULL, ",")) {
                strncpy(header[header_count], cell, 63);
                header[header_count][63] = '\0';
                header_count++;
            }
            check(header_count - 1 == tolerance_count, "one tolerance line per value column", __LINE__);
            for (col = 1; col < header_count; col++) {
                int found = 0;
                int t;
                for (t = 0; t < tolerance_count; t++) {
                    found |= strcmp(tolerances[t].name, header[col]) == 0;
                }
                check(found, header[col], __LINE__);
            }
            continue;
        }
        {
            /* A data row: split keeping empty cells. */
            char *cells_text[MAX_COLUMNS];
            int n = 0;
            double input;
            AerostrataState state;
            AerostrataNormalShock shock;
            AerostrataStatus status;
            cell = line;
            while (n < MAX_COLUMNS) {
                cells_text[n++] = cell;
                save = strchr(cell, ',');
                if (save == NULL) {
                    break;
                }
                *save = '\0';
                cell = save + 1;
            }
            input = strtod(cells_text[0], NULL);
            if (model == MODEL_US1976) {
                status = aerostrata_us1976_state(input, AEROSTRATA_GEOMETRIC, 0.0, &state);
            } else if (model == MODEL_HYDROSTATIC_OFFSET) {
                status = day == NULL ? AEROSTRATA_STATUS_NULL_POINTER
                                     : aerostrata_model_state(day, input, AEROSTRATA_GEOMETRIC, &state);
            } else {
                status = aerostrata_normal_shock(AEROSTRATA_GAMMA_AIR, input, &shock);
            }
            if (status != AEROSTRATA_STATUS_OK) {
                printf("FAIL %s: input %s gives status %d\n", file, cells_text[0], (int)status);
                failed++;
                continue;
            }
            for (col = 1; col < n && col < header_count; col++) {
                double reference;
                double computed;
                double tolerance = 0.0;
                int t;
                int known;
                if (cells_text[col][0] == '\0') {
                    continue;
                }
                known = model == MODEL_SHOCK ? shock_value(&shock, header[col], &computed)
                                             : state_value(&state, header[col], &computed);
                if (!known) {
                    skipped++;
                    continue;
                }
                reference = strtod(cells_text[col], NULL);
                for (t = 0; t < tolerance_count; t++) {
                    if (strcmp(tolerances[t].name, header[col]) == 0) {
                        switch (tolerances[t].rule) {
                        case RULE_PRINTED:
                            tolerance = printed_tolerance(cells_text[col]);
                            break;
                        case RULE_REL:
                            tolerance = tolerances[t].amount * fabs(reference);
                            break;
                        case RULE_ABS:
                            tolerance = tolerances[t].amount;
                            break;
                        case RULE_NONE:
                            break;
                        }
                    }
                }
                cells++;
                if (fabs(computed - reference) <= tolerance) {
                    passed++;
                } else {
                    failed++;
                    printf("FAIL %s: %s at %s: computed %.10g, reference %s, tolerance %.3g\n", file, header[col],
                           cells_text[0], computed, cells_text[col], tolerance);
                }
            }
        }
    }
    fclose(f);
    aerostrata_model_free(day);
    check(have_model, "the file names its model", __LINE__);
    printf("%s: %d cells checked, %d cells of quantities without a C function (species) skipped\n", file, cells,
           skipped);
    return cells;
}
