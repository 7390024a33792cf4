/*
 * The C yardstick for the exact Metropolis kernel (issue 12, item 5): a plain single-spin
 * Metropolis sweep over compressed rows, as a practitioner would write it in C. Built and run
 * only by bench/run_sampler_c.sh (gcc -O3 -march=native), never in CI.
 *
 *   metropolis PROBLEM.txt table|table2|table4|free|free2|free4|exp|bracket SWEEPS
 *
 * PROBLEM.txt (written by org.obverse.bench.SamplerProblemFile): "n terms sweeps", then n + 1
 * row starts, then per term "neighbour coupling", then one beta per sweep of the anneal (hex
 * floats, so every value is the one Java used). Spins start uniformly random; local fields are
 * maintained; a move with dE <= 0 is taken without a draw, an uphill move draws one uniform u
 * (top 53 bits of a xoroshiro128++ word: Blackman & Vigna, ACM TOMS 47(4), 2021) and is taken
 * when u < exp(-beta dE):
 *   table: dE = 2v for integer v (integer problems): exp(-beta 2v) tabulated once per sweep;
 *   table2: the table loop on two reads at once, each with its own spins, local fields and
 *          generator: spin k of the first read, then spin k of the second (the interleaving
 *          obverse's sampler uses on integer problems; counts the attempts of both);
 *   free, free2: obverse's own algorithm for integer problems in C, one read and two reads
 *          interleaved: no branch on the decision, the generator advanced only on an uphill
 *          move by masks, the draw's top 53 bits compared with ceil(exp(-beta 2v) 2^53), the
 *          neighbours' fields changed by zero on a refused move;
 *   table4, free4: four reads interleaved (own spins, fields, generators; the first three
 *          generators are the ones above): table4 the plain table loop, free4 obverse's
 *          four-read kernel: the branch-free step per read and the four local fields of a
 *          spin as 16-bit lanes of one 64-bit word, so one multiply-add per neighbour
 *          updates all four (the lanes are linear: lanes 0-2 stored plus 2^15);
 *   exp:   exp() from libm on every uphill attempt (any couplings);
 *   bracket: a table of exp(-k/32); u below the bracket's lower end accepts, at or above its
 *          upper end refuses, exp() only in between (any couplings).
 * Prints attempts per ns of thread CPU time and of wall time, and a checksum of the spins.
 */
#define _POSIX_C_SOURCE 199309L
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

static uint64_t s0 = 0x243F6A8885A308D3ULL, s1 = 0x13198A2E03707344ULL;

static inline uint64_t rotl(uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }

static inline uint64_t next(void) {
    uint64_t a = s0, b = s1;
    uint64_t r = rotl(a + b, 17) + a;
    b ^= a;
    s0 = rotl(a, 49) ^ b ^ (b << 21);
    s1 = rotl(b, 28);
    return r;
}

static inline double uniform(void) { return (double) (next() >> 11) * 0x1p-53; }

/* The second read's generator (table2). */
static uint64_t t0 = 0xA4093822299F31D0ULL, t1 = 0x082EFA98EC4E6C89ULL;

static inline uint64_t next2(void) {
    uint64_t a = t0, b = t1;
    uint64_t r = rotl(a + b, 17) + a;
    b ^= a;
    t0 = rotl(a, 49) ^ b ^ (b << 21);
    t1 = rotl(b, 28);
    return r;
}

static inline double uniform2(void) { return (double) (next2() >> 11) * 0x1p-53; }

static double now(clockid_t c) {
    struct timespec t;
    clock_gettime(c, &t);
    return t.tv_sec * 1e9 + t.tv_nsec;
}

int main(int argc, char **argv) {
    if (argc != 4) {
        fprintf(stderr, "usage: metropolis PROBLEM.txt table|table2|table4|free|free2|free4|exp|bracket SWEEPS\n");
        return 2;
    }
    FILE *f = fopen(argv[1], "r");
    if (!f) { perror(argv[1]); return 2; }
    int table = strcmp(argv[2], "table") == 0;
    int table2 = strcmp(argv[2], "table2") == 0;
    int free1 = strcmp(argv[2], "free") == 0;
    int free2 = strcmp(argv[2], "free2") == 0;
    int table4 = strcmp(argv[2], "table4") == 0;
    int free4 = strcmp(argv[2], "free4") == 0;
    int reads = table2 || free2 ? 2 : table4 || free4 ? 4 : 1;
    int bracket = strcmp(argv[2], "bracket") == 0;
    double ex[1027];
    for (int k = 0; k <= 1024; k++) ex[k] = exp(-k / 32.0);
    ex[1025] = ex[1024]; /* x >= 32: the bracket [0, exp(-32)] */
    ex[1026] = 0.0;
    long sweeps = atol(argv[3]);
    int n, m, nb;
    if (fscanf(f, "%d %d %d", &n, &m, &nb) != 3) return 2;
    int *start = malloc((n + 1) * sizeof(int));
    int *nbr = malloc(m * sizeof(int));
    double *J = malloc(m * sizeof(double));
    double *betas = malloc(nb * sizeof(double));
    char buf[64];
    for (int k = 0; k <= n; k++) if (fscanf(f, "%d", &start[k]) != 1) return 2;
    for (int q = 0; q < m; q++) {
        if (fscanf(f, "%d %63s", &nbr[q], buf) != 2) return 2;
        J[q] = strtod(buf, NULL);
    }
    for (int i = 0; i < nb; i++) {
        if (fscanf(f, "%63s", buf) != 1) return 2;
        betas[i] = strtod(buf, NULL);
    }
    fclose(f);

    signed char *s = malloc(n);
    double *lf = calloc(n, sizeof(double));
    int *ilf = calloc(n, sizeof(int));
    int *iJ = malloc(m * sizeof(int));
    int bound = 0;
    for (int k = 0; k < n; k++) {
        s[k] = (next() >> 63) ? 1 : -1;
        int tot = 0;
        for (int q = start[k]; q < start[k + 1]; q++) tot += (int) fabs(J[q]);
        if (tot > bound) bound = tot;
    }
    for (int q = 0; q < m; q++) iJ[q] = (int) J[q];
    for (int k = 0; k < n; k++) {
        double h = 0; int ih = 0;
        for (int q = start[k]; q < start[k + 1]; q++) { h += J[q] * s[nbr[q]]; ih += iJ[q] * s[nbr[q]]; }
        lf[k] = h; ilf[k] = ih;
    }
    double *p = malloc((bound + 1) * sizeof(double));
    uint64_t *th = malloc((bound + 1) * sizeof(uint64_t));
    /* Four reads (table4, free4): spins s4[4k + i], int fields ilf4[4k + i], packed fields pf. */
    uint64_t g4[8] = {s0, s1, t0, t1, 0x452821E638D01377ULL, 0xBE5466CF34E90C6CULL,
                      0xC0AC29B7C97C50DDULL, 0x3F84D5B5B5470917ULL};
    signed char *s4 = malloc(4 * n);
    int *ilf4 = calloc(4 * n, sizeof(int));
    int64_t *pf = calloc(n, sizeof(int64_t));
    for (int i = 0; i < 4; i++) {
        uint64_t a = g4[2 * i], b = g4[2 * i + 1];
        for (int k = 0; k < n; k++) {
            uint64_t r = rotl(a + b, 17) + a;
            b ^= a; a = rotl(a, 49) ^ b ^ (b << 21); b = rotl(b, 28);
            s4[4 * k + i] = (r >> 63) ? 1 : -1;
        }
        g4[2 * i] = a; g4[2 * i + 1] = b;
    }
    for (int k = 0; k < n; k++) {
        for (int i = 0; i < 4; i++) {
            int ih = 0;
            for (int q = start[k]; q < start[k + 1]; q++) ih += iJ[q] * s4[4 * nbr[q] + i];
            ilf4[4 * k + i] = ih;
        }
        pf[k] = (int64_t) ilf4[4 * k] + ((int64_t) ilf4[4 * k + 1] << 16) + ((int64_t) ilf4[4 * k + 2] << 32)
                + ((int64_t) ilf4[4 * k + 3] << 48) + 0x0000800080008000LL;
    }
    signed char *s2 = malloc(n);
    int *ilf2 = calloc(n, sizeof(int));
    for (int k = 0; k < n; k++) s2[k] = (next2() >> 63) ? 1 : -1;
    for (int k = 0; k < n; k++) {
        int ih = 0;
        for (int q = start[k]; q < start[k + 1]; q++) ih += iJ[q] * s2[nbr[q]];
        ilf2[k] = ih;
    }

    double c0 = now(CLOCK_THREAD_CPUTIME_ID), w0 = now(CLOCK_MONOTONIC);
    for (long t = 0; t < sweeps; t++) {
        double beta = betas[t % nb];
        if (table) {
            for (int v = 0; v <= bound; v++) p[v] = exp(-beta * 2.0 * v);
            for (int k = 0; k < n; k++) {
                int v = s[k] * ilf[k];            /* dE = -2 v */
                if (v < 0 && !(uniform() < p[-v])) continue;
                int d = -2 * s[k];
                s[k] = (signed char) -s[k];
                for (int q = start[k]; q < start[k + 1]; q++) ilf[nbr[q]] += d * iJ[q];
            }
        } else if (free1 || free2) {
            th[0] = 1ULL << 53;
            for (int v = 1; v <= bound; v++) th[v] = (uint64_t) ceil(exp(-beta * 2.0 * v) * 0x1p53);
            uint64_t a0 = s0, a1 = s1, b0 = t0, b1 = t1;
            for (int k = 0; k < n; k++) {
                int sa = s[k], va = sa * ilf[k], ua = va >> 31;
                uint64_t ka = (uint64_t) (int64_t) ua;
                uint64_t ra = rotl(a0 + a1, 17) + a0, ta = a1 ^ a0;
                a0 = ((rotl(a0, 49) ^ ta ^ (ta << 21)) & ka) | (a0 & ~ka);
                a1 = (rotl(ta, 28) & ka) | (a1 & ~ka);
                int da = -2 * sa & (int) ((int64_t) ((ra >> 11) - th[-va & ua]) >> 63);
                s[k] = (signed char) (sa + da);
                if (free2) {
                    int sb = s2[k], vb = sb * ilf2[k], ub = vb >> 31;
                    uint64_t kb = (uint64_t) (int64_t) ub;
                    uint64_t rb = rotl(b0 + b1, 17) + b0, tb = b1 ^ b0;
                    b0 = ((rotl(b0, 49) ^ tb ^ (tb << 21)) & kb) | (b0 & ~kb);
                    b1 = (rotl(tb, 28) & kb) | (b1 & ~kb);
                    int db = -2 * sb & (int) ((int64_t) ((rb >> 11) - th[-vb & ub]) >> 63);
                    s2[k] = (signed char) (sb + db);
                    for (int q = start[k]; q < start[k + 1]; q++) {
                        ilf[nbr[q]] += da * iJ[q];
                        ilf2[nbr[q]] += db * iJ[q];
                    }
                } else {
                    for (int q = start[k]; q < start[k + 1]; q++) ilf[nbr[q]] += da * iJ[q];
                }
            }
            s0 = a0; s1 = a1; t0 = b0; t1 = b1;
        } else if (table4) {
            for (int v = 0; v <= bound; v++) p[v] = exp(-beta * 2.0 * v);
            for (int k = 0; k < n; k++) {
                for (int i = 0; i < 4; i++) {
                    int v = s4[4 * k + i] * ilf4[4 * k + i];
                    if (v < 0) {
                        uint64_t a = g4[2 * i], b = g4[2 * i + 1];
                        uint64_t r = rotl(a + b, 17) + a;
                        b ^= a; g4[2 * i] = rotl(a, 49) ^ b ^ (b << 21); g4[2 * i + 1] = rotl(b, 28);
                        if (!((double) (r >> 11) * 0x1p-53 < p[-v])) continue;
                    }
                    int d = -2 * s4[4 * k + i];
                    s4[4 * k + i] = (signed char) -s4[4 * k + i];
                    for (int q = start[k]; q < start[k + 1]; q++) ilf4[4 * nbr[q] + i] += d * iJ[q];
                }
            }
        } else if (free4) {
            th[0] = 1ULL << 53;
            for (int v = 1; v <= bound; v++) th[v] = (uint64_t) ceil(exp(-beta * 2.0 * v) * 0x1p53);
            uint64_t a0 = g4[0], a1 = g4[1], b0 = g4[2], b1 = g4[3], c0 = g4[4], c1 = g4[5], e0 = g4[6], e1 = g4[7];
#define STEP(I, X0, X1, F) \
            int s##I = s4[4 * k + I], v##I = s##I * (F), u##I = v##I >> 31; \
            uint64_t m##I = (uint64_t) (int64_t) u##I, r##I = rotl(X0 + X1, 17) + X0, t##I = X1 ^ X0; \
            X0 = ((rotl(X0, 49) ^ t##I ^ (t##I << 21)) & m##I) | (X0 & ~m##I); \
            X1 = (rotl(t##I, 28) & m##I) | (X1 & ~m##I); \
            int d##I = -2 * s##I & (int) ((int64_t) ((r##I >> 11) - th[-v##I & u##I]) >> 63); \
            s4[4 * k + I] = (signed char) (s##I + d##I);
            for (int k = 0; k < n; k++) {
                uint64_t f = (uint64_t) pf[k];
                STEP(0, a0, a1, (int) (f & 0xffff) - 0x8000)
                STEP(1, b0, b1, (int) ((f >> 16) & 0xffff) - 0x8000)
                STEP(2, c0, c1, (int) ((f >> 32) & 0xffff) - 0x8000)
                STEP(3, e0, e1, (int) ((int64_t) f >> 48))
                int64_t step = (int64_t) d0 + ((int64_t) d1 << 16) + ((int64_t) d2 << 32) + ((int64_t) d3 << 48);
                for (int q = start[k]; q < start[k + 1]; q++) pf[nbr[q]] += iJ[q] * step;
            }
#undef STEP
            g4[0] = a0; g4[1] = a1; g4[2] = b0; g4[3] = b1; g4[4] = c0; g4[5] = c1; g4[6] = e0; g4[7] = e1;
        } else if (table2) {
            for (int v = 0; v <= bound; v++) p[v] = exp(-beta * 2.0 * v);
            for (int k = 0; k < n; k++) {
                int v = s[k] * ilf[k];
                if (v >= 0 || uniform() < p[-v]) {
                    int d = -2 * s[k];
                    s[k] = (signed char) -s[k];
                    for (int q = start[k]; q < start[k + 1]; q++) ilf[nbr[q]] += d * iJ[q];
                }
                int w = s2[k] * ilf2[k];
                if (w >= 0 || uniform2() < p[-w]) {
                    int d = -2 * s2[k];
                    s2[k] = (signed char) -s2[k];
                    for (int q = start[k]; q < start[k + 1]; q++) ilf2[nbr[q]] += d * iJ[q];
                }
            }
        } else if (bracket) {
            for (int k = 0; k < n; k++) {
                double dE = -2.0 * s[k] * lf[k];
                if (dE > 0.0) {
                    double x = beta * dE, u = uniform();
                    int i = x < 32.0 ? (int) (x * 32.0) : 1025;
                    if (!(u < ex[i + 1]) && (u >= ex[i] || !(u < exp(-x)))) continue;
                }
                double d = -2.0 * s[k];
                s[k] = (signed char) -s[k];
                for (int q = start[k]; q < start[k + 1]; q++) lf[nbr[q]] += d * J[q];
            }
        } else {
            for (int k = 0; k < n; k++) {
                double dE = -2.0 * s[k] * lf[k];
                if (dE > 0.0 && !(uniform() < exp(-beta * dE))) continue;
                double d = -2.0 * s[k];
                s[k] = (signed char) -s[k];
                for (int q = start[k]; q < start[k + 1]; q++) lf[nbr[q]] += d * J[q];
            }
        }
    }
    double c1 = now(CLOCK_THREAD_CPUTIME_ID), w1 = now(CLOCK_MONOTONIC);
    long sum = 0;
    for (int k = 0; k < n; k++) sum = sum * 31 + s[k];
    if (table2 || free2) for (int k = 0; k < n; k++) sum = sum * 31 + s2[k];
    if (table4 || free4) for (int k = 0; k < 4 * n; k++) sum = sum * 31 + s4[k];
    double attempts = (double) sweeps * n * reads;
    printf("%s attempts/cpu-ns %.4f attempts/ns %.4f (checksum %ld)\n", argv[2], attempts / (c1 - c0),
           attempts / (w1 - w0), sum);
    return 0;
}
