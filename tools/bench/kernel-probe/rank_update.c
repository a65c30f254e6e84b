/*
 * Measurement probe, not part of the build: how fast a register-tiled AVX2 kernel computes the block
 * co-moment update that lariat.moments.RankUpdate computes in Java, C_ij += sum_r x_ri x_rj for
 * 4*floor(i/4) <= j < d, each entry as one chain of fused multiply-adds over panel rows r = 0..k-1 in
 * order (the same arithmetic, so the same bits; the probe checks that against a plain loop).
 *
 * Tile: 4 rows of C by 12 columns (twelve 4-wide accumulators) kept in registers over all k panel rows;
 * the 4 row values of each panel row are copied to a small contiguous buffer first. Column ranges start
 * at 4*floor(i/4) as in the Java kernel, so both write the same entries. Usage:
 *   rank_update WIDTH [PANEL_ROWS [REPEATS]]   prints one line: width, us per panel, G multiply-adds/s
 */
#include <immintrin.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

static void plain(const double *x, int k, int d, double *c) {
    for (int i = 0; i < d; i++) {
        for (int j = i & ~3; j < d; j++) {
            double s = c[i * d + j];
            for (int r = 0; r < k; r++) {
                s = fma(x[r * d + i], x[r * d + j], s);
            }
            c[i * d + j] = s;
        }
    }
}

/* Rows i..i+3 of C (c0 points at row i, column j), NV 4-wide column groups; a holds x_r[i..i+3] for each
   panel row r, contiguously. */
#define TILE(NV)                                                                                      \
    static inline void tile##NV(const double *a, const double *x, int k, int ldx, int j, double *c0,  \
                                int ldc) {                                                            \
        __m256d acc[4][NV];                                                                           \
        for (int u = 0; u < 4; u++)                                                                   \
            for (int v = 0; v < NV; v++) acc[u][v] = _mm256_loadu_pd(c0 + u * ldc + 4 * v);           \
        const double *p = x + j;                                                                      \
        for (int r = 0; r < k; r++, p += ldx, a += 4) {                                               \
            __m256d y[NV];                                                                            \
            for (int v = 0; v < NV; v++) y[v] = _mm256_loadu_pd(p + 4 * v);                           \
            for (int u = 0; u < 4; u++) {                                                             \
                __m256d b = _mm256_broadcast_sd(a + u);                                               \
                for (int v = 0; v < NV; v++) acc[u][v] = _mm256_fmadd_pd(b, y[v], acc[u][v]);         \
            }                                                                                         \
        }                                                                                             \
        for (int u = 0; u < 4; u++)                                                                   \
            for (int v = 0; v < NV; v++) _mm256_storeu_pd(c0 + u * ldc + 4 * v, acc[u][v]);           \
    }
TILE(3)
TILE(2)
TILE(1)

/* One column j of rows i..i+3, scalar. */
static inline void column4(const double *a, const double *x, int k, int ldx, int j, double *c0, int ldc) {
    double s0 = c0[0], s1 = c0[ldc], s2 = c0[2 * ldc], s3 = c0[3 * ldc];
    const double *p = x + j;
    for (int r = 0; r < k; r++, p += ldx, a += 4) {
        double y = *p;
        s0 = fma(a[0], y, s0);
        s1 = fma(a[1], y, s1);
        s2 = fma(a[2], y, s2);
        s3 = fma(a[3], y, s3);
    }
    c0[0] = s0;
    c0[ldc] = s1;
    c0[2 * ldc] = s2;
    c0[3 * ldc] = s3;
}

static double rows4[4 * 4096];

static inline __attribute__((always_inline)) void fast(const double *x, int k, int ldx, int d, double *c,
                                                       int ldc) {
    int i = 0;
    for (; i + 4 <= d; i += 4) {
        for (int r = 0; r < k; r++) {
            const double *q = x + r * ldx + i;
            rows4[4 * r] = q[0];
            rows4[4 * r + 1] = q[1];
            rows4[4 * r + 2] = q[2];
            rows4[4 * r + 3] = q[3];
        }
        int j = i;
        for (; j + 12 <= d; j += 12) tile3(rows4, x, k, ldx, j, c + i * ldc + j, ldc);
        if (j + 8 <= d) { tile2(rows4, x, k, ldx, j, c + i * ldc + j, ldc); j += 8; }
        if (j + 4 <= d) { tile1(rows4, x, k, ldx, j, c + i * ldc + j, ldc); j += 4; }
        for (; j < d; j++) column4(rows4, x, k, ldx, j, c + i * ldc + j, ldc);
    }
    for (; i < d; i++) {
        for (int j = i & ~3; j < d; j++) {
            double s = c[i * ldc + j];
            for (int r = 0; r < k; r++) s = fma(x[r * ldx + i], x[r * ldx + j], s);
            c[i * ldc + j] = s;
        }
    }
}

/* gcc keeps the twelve accumulators in registers only when the panel row count is a constant it can see
   (with a run-time count it spills them every row), so the usual block size has its own copy. */
static void update(const double *x, int k, int d, double *c) {
    if (k == 256) {
        fast(x, 256, d, d, c, d);
    } else {
        fast(x, k, d, d, c, d);
    }
}

static double seconds(void) {
    struct timespec t;
    clock_gettime(CLOCK_MONOTONIC, &t);
    return t.tv_sec + t.tv_nsec * 1e-9;
}

int main(int argc, char **argv) {
    if (argc < 2) {
        fprintf(stderr, "usage: %s WIDTH [PANEL_ROWS [REPEATS]]\n", argv[0]);
        return 2;
    }
    int d = atoi(argv[1]);
    int k = argc > 2 ? atoi(argv[2]) : 256;
    int repeats = argc > 3 ? atoi(argv[3]) : 0;
    if (d < 1 || k < 1 || k > 4096) {
        fprintf(stderr, "width must be >= 1 and panel rows 1..4096\n");
        return 2;
    }
    double *x = malloc(sizeof(double) * (size_t) k * d);
    double *c1 = calloc((size_t) d * d, sizeof(double));
    double *c2 = calloc((size_t) d * d, sizeof(double));
    srand(1);
    for (long i = 0; i < (long) k * d; i++) x[i] = rand() / (double) RAND_MAX - 0.5;
    plain(x, k, d, c1);
    update(x, k, d, c2);
    long differ = 0;
    for (int i = 0; i < d; i++)
        for (int j = i & ~3; j < d; j++)
            if (memcmp(&c1[i * d + j], &c2[i * d + j], sizeof(double)) != 0) differ++;
    if (differ != 0) {
        fprintf(stderr, "width %d: %ld entries differ from the plain loop\n", d, differ);
        return 1;
    }
    double work = 0;
    for (int i = 0; i < d; i++) work += d - (i & ~3);
    work *= k;
    if (repeats < 1) repeats = (int) (2e9 / work) + 1;
    for (int q = 0; q < repeats / 4 + 1; q++) update(x, k, d, c2);
    double t = seconds();
    for (int q = 0; q < repeats; q++) update(x, k, d, c2);
    t = seconds() - t;
    printf("%d %.1f %.2f\n", d, t / repeats * 1e6, work * repeats / t / 1e9);
    return 0;
}
