/*
 * The documented arithmetic of the CMSIS-DSP filter kernels that Tapwright's exports target, for the
 * compile-and-compare tests (tests/unit/export-cmsis-gcc.test.ts). Written from the library's
 * documentation as we remember it ("Scaling and Overflow Behavior" on each function's page), not from
 * its source, in the plainest C: one sample at a time, exact products, wraps done in unsigned
 * arithmetic (defined in C) and then converted, which GCC defines as modulo 2^N.
 *
 * Biquads (postShift p; the kernels ADD a1*y1 + a2*y2, the coefficients hold our a1, a2 negated):
 *   df1_q15       64-bit accumulator; y = sat16(acc >> (15 - p))
 *   df1_fast_q15  32-bit accumulator, wraps; y = sat16(acc >> (15 - p))
 *   df1_q31       64-bit accumulator (2.62), wraps; y = low 32 bits of acc >> (31 - p)
 *   df1_fast_q31  each product's high 32 bits (2.30), 32-bit accumulator, wraps; y = sat32(acc * 2^(p + 1))
 *   df1_f32, df2T_f32  float arithmetic in the documented order
 * FIR (coefficients time-reversed, state numTaps + blockSize - 1, no post-shift):
 *   fir_q15       64-bit accumulator; y = sat16(acc >> 15)
 *   fir_fast_q15  32-bit accumulator, wraps; y = sat16(acc >> 15)
 *   fir_q31       64-bit accumulator (2.62), wraps; y = sat32(acc >> 31)
 *   fir_fast_q31  products as df1_fast_q31; y = sat32(acc * 2)
 *   fir_f32       float multiply-accumulate, oldest sample first
 * Sizes are checked by touching every state element the documentation sizes (init zeroes it all), so
 * the tests' address sanitizer catches a header whose arrays are too small.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "arm_math.h"

static q15_t sat16(q63_t v) { return (q15_t)(v > 32767 ? 32767 : v < -32768 ? -32768 : v); }
static q31_t sat32(q63_t v) { return (q31_t)(v > INT32_MAX ? INT32_MAX : v < INT32_MIN ? INT32_MIN : v); }

/* ---- initialisation: store the pointers, zero the documented state ---- */

void arm_biquad_cascade_df1_init_q15(arm_biquad_casd_df1_inst_q15 *S, uint8_t numStages, const q15_t *pCoeffs, q15_t *pState, int8_t postShift)
{
    S->numStages = (int8_t)numStages; S->pCoeffs = pCoeffs; S->pState = pState; S->postShift = postShift;
    memset(pState, 0, 4u * numStages * sizeof *pState);
}

void arm_biquad_cascade_df1_init_q31(arm_biquad_casd_df1_inst_q31 *S, uint8_t numStages, const q31_t *pCoeffs, q31_t *pState, int8_t postShift)
{
    S->numStages = numStages; S->pCoeffs = pCoeffs; S->pState = pState; S->postShift = (uint8_t)postShift;
    memset(pState, 0, 4u * numStages * sizeof *pState);
}

void arm_biquad_cascade_df1_init_f32(arm_biquad_casd_df1_inst_f32 *S, uint8_t numStages, const float32_t *pCoeffs, float32_t *pState)
{
    S->numStages = numStages; S->pCoeffs = pCoeffs; S->pState = pState;
    memset(pState, 0, 4u * numStages * sizeof *pState);
}

void arm_biquad_cascade_df2T_init_f32(arm_biquad_cascade_df2T_instance_f32 *S, uint8_t numStages, const float32_t *pCoeffs, float32_t *pState)
{
    S->numStages = numStages; S->pCoeffs = pCoeffs; S->pState = pState;
    memset(pState, 0, 2u * numStages * sizeof *pState);
}

/* The library answers ARM_MATH_ARGUMENT_ERROR for an odd or short Q15 FIR; this stand-in stops the
 * test run instead, so a header with a wrong length cannot pass unseen. */
arm_status arm_fir_init_q15(arm_fir_instance_q15 *S, uint16_t numTaps, const q15_t *pCoeffs, q15_t *pState, uint32_t blockSize)
{
    if (numTaps < 4 || numTaps % 2 != 0) {
        fprintf(stderr, "arm_fir_init_q15: numTaps %u must be even and at least 4\n", (unsigned)numTaps);
        exit(3);
    }
    S->numTaps = numTaps; S->pCoeffs = pCoeffs; S->pState = pState;
    memset(pState, 0, (numTaps + blockSize - 1u) * sizeof *pState);
    return ARM_MATH_SUCCESS;
}

void arm_fir_init_q31(arm_fir_instance_q31 *S, uint16_t numTaps, const q31_t *pCoeffs, q31_t *pState, uint32_t blockSize)
{
    S->numTaps = numTaps; S->pCoeffs = pCoeffs; S->pState = pState;
    memset(pState, 0, (numTaps + blockSize - 1u) * sizeof *pState);
}

void arm_fir_init_f32(arm_fir_instance_f32 *S, uint16_t numTaps, const float32_t *pCoeffs, float32_t *pState, uint32_t blockSize)
{
    S->numTaps = numTaps; S->pCoeffs = pCoeffs; S->pState = pState;
    memset(pState, 0, (numTaps + blockSize - 1u) * sizeof *pState);
}

/* ---- biquads: per stage coefficients then state {x1, x2, y1, y2} ---- */

static void df1_q15(const arm_biquad_casd_df1_inst_q15 *S, const q15_t *pSrc, q15_t *pDst, uint32_t n, int fast)
{
    const int shift = 15 - S->postShift;
    for (uint32_t i = 0; i < n; i++) pDst[i] = pSrc[i];
    for (int k = 0; k < S->numStages; k++) {
        const q15_t *c = &S->pCoeffs[6 * k];          /* b0, 0, b1, b2, a1, a2 */
        q15_t *st = &S->pState[4 * k];
        for (uint32_t i = 0; i < n; i++) {
            const q15_t x = pDst[i];
            const q63_t exact = (q63_t)c[0] * x + (q63_t)c[2] * st[0] + (q63_t)c[3] * st[1] + (q63_t)c[4] * st[2] + (q63_t)c[5] * st[3];
            const q63_t acc = fast ? (q63_t)(q31_t)(uint32_t)(uint64_t)exact : exact;
            const q15_t y = sat16(acc >> shift);
            st[1] = st[0]; st[0] = x; st[3] = st[2]; st[2] = y;
            pDst[i] = y;
        }
    }
}

void arm_biquad_cascade_df1_q15(const arm_biquad_casd_df1_inst_q15 *S, const q15_t *pSrc, q15_t *pDst, uint32_t blockSize) { df1_q15(S, pSrc, pDst, blockSize, 0); }
void arm_biquad_cascade_df1_fast_q15(const arm_biquad_casd_df1_inst_q15 *S, const q15_t *pSrc, q15_t *pDst, uint32_t blockSize) { df1_q15(S, pSrc, pDst, blockSize, 1); }

/* High 32 bits of a Q31 product, as the fast kernels keep it (floor, by an arithmetic shift). */
static q31_t high_word(q31_t a, q31_t b) { return (q31_t)(((q63_t)a * b) >> 32); }

static void df1_q31(const arm_biquad_casd_df1_inst_q31 *S, const q31_t *pSrc, q31_t *pDst, uint32_t n, int fast)
{
    for (uint32_t i = 0; i < n; i++) pDst[i] = pSrc[i];
    for (uint32_t k = 0; k < S->numStages; k++) {
        const q31_t *c = &S->pCoeffs[5 * k];          /* b0, b1, b2, a1, a2 */
        q31_t *st = &S->pState[4 * k];
        for (uint32_t i = 0; i < n; i++) {
            const q31_t x = pDst[i];
            const q31_t v[5] = { x, st[0], st[1], st[2], st[3] };
            q31_t y;
            if (fast) {
                uint32_t acc = 0;
                for (int j = 0; j < 5; j++) acc += (uint32_t)high_word(c[j], v[j]);
                y = sat32((q63_t)(q31_t)acc * ((q63_t)1 << (S->postShift + 1)));
            } else {
                uint64_t acc = 0;
                for (int j = 0; j < 5; j++) acc += (uint64_t)((q63_t)c[j] * v[j]);
                y = (q31_t)(uint32_t)(uint64_t)((q63_t)acc >> (31 - S->postShift));
            }
            st[1] = st[0]; st[0] = x; st[3] = st[2]; st[2] = y;
            pDst[i] = y;
        }
    }
}

void arm_biquad_cascade_df1_q31(const arm_biquad_casd_df1_inst_q31 *S, const q31_t *pSrc, q31_t *pDst, uint32_t blockSize) { df1_q31(S, pSrc, pDst, blockSize, 0); }
void arm_biquad_cascade_df1_fast_q31(const arm_biquad_casd_df1_inst_q31 *S, const q31_t *pSrc, q31_t *pDst, uint32_t blockSize) { df1_q31(S, pSrc, pDst, blockSize, 1); }

void arm_biquad_cascade_df1_f32(const arm_biquad_casd_df1_inst_f32 *S, const float32_t *pSrc, float32_t *pDst, uint32_t blockSize)
{
    for (uint32_t i = 0; i < blockSize; i++) pDst[i] = pSrc[i];
    for (uint32_t k = 0; k < S->numStages; k++) {
        const float32_t *c = &S->pCoeffs[5 * k];
        float32_t *st = &S->pState[4 * k];
        for (uint32_t i = 0; i < blockSize; i++) {
            const float32_t x = pDst[i];
            const float32_t y = c[0] * x + c[1] * st[0] + c[2] * st[1] + c[3] * st[2] + c[4] * st[3];
            st[1] = st[0]; st[0] = x; st[3] = st[2]; st[2] = y;
            pDst[i] = y;
        }
    }
}

void arm_biquad_cascade_df2T_f32(const arm_biquad_cascade_df2T_instance_f32 *S, const float32_t *pSrc, float32_t *pDst, uint32_t blockSize)
{
    for (uint32_t i = 0; i < blockSize; i++) pDst[i] = pSrc[i];
    for (uint32_t k = 0; k < S->numStages; k++) {
        const float32_t *c = &S->pCoeffs[5 * k];
        float32_t *d = &S->pState[2 * k];
        for (uint32_t i = 0; i < blockSize; i++) {
            const float32_t x = pDst[i];
            const float32_t y = c[0] * x + d[0];
            d[0] = c[1] * x + c[3] * y + d[1];
            d[1] = c[2] * x + c[4] * y;
            pDst[i] = y;
        }
    }
}

/* ---- FIR: state = the last numTaps - 1 inputs (oldest first), then the new block ---- */

#define FIR_BODY(T, ACC)                                                                  \
    const uint16_t N = S->numTaps;                                                        \
    T *s = S->pState;                                                                     \
    for (uint32_t i = 0; i < blockSize; i++) s[N - 1u + i] = pSrc[i];                     \
    for (uint32_t i = 0; i < blockSize; i++) { ACC }                                      \
    memmove(s, &s[blockSize], (N - 1u) * sizeof *s);

static void fir_q15(const arm_fir_instance_q15 *S, const q15_t *pSrc, q15_t *pDst, uint32_t blockSize, int fast)
{
    FIR_BODY(q15_t, {
        q63_t exact = 0;
        for (uint16_t k = 0; k < N; k++) exact += (q63_t)S->pCoeffs[k] * s[i + k];
        const q63_t acc = fast ? (q63_t)(q31_t)(uint32_t)(uint64_t)exact : exact;
        pDst[i] = sat16(acc >> 15);
    })
}

void arm_fir_q15(const arm_fir_instance_q15 *S, const q15_t *pSrc, q15_t *pDst, uint32_t blockSize) { fir_q15(S, pSrc, pDst, blockSize, 0); }
void arm_fir_fast_q15(const arm_fir_instance_q15 *S, const q15_t *pSrc, q15_t *pDst, uint32_t blockSize) { fir_q15(S, pSrc, pDst, blockSize, 1); }

static void fir_q31(const arm_fir_instance_q31 *S, const q31_t *pSrc, q31_t *pDst, uint32_t blockSize, int fast)
{
    FIR_BODY(q31_t, {
        if (fast) {
            uint32_t acc = 0;
            for (uint16_t k = 0; k < N; k++) acc += (uint32_t)high_word(S->pCoeffs[k], s[i + k]);
            pDst[i] = sat32((q63_t)(q31_t)acc * 2);
        } else {
            uint64_t acc = 0;
            for (uint16_t k = 0; k < N; k++) acc += (uint64_t)((q63_t)S->pCoeffs[k] * s[i + k]);
            pDst[i] = sat32((q63_t)acc >> 31);
        }
    })
}

void arm_fir_q31(const arm_fir_instance_q31 *S, const q31_t *pSrc, q31_t *pDst, uint32_t blockSize) { fir_q31(S, pSrc, pDst, blockSize, 0); }
void arm_fir_fast_q31(const arm_fir_instance_q31 *S, const q31_t *pSrc, q31_t *pDst, uint32_t blockSize) { fir_q31(S, pSrc, pDst, blockSize, 1); }

void arm_fir_f32(const arm_fir_instance_f32 *S, const float32_t *pSrc, float32_t *pDst, uint32_t blockSize)
{
    FIR_BODY(float32_t, {
        float32_t acc = 0.0f;
        for (uint16_t k = 0; k < N; k++) acc += S->pCoeffs[k] * s[i + k];
        pDst[i] = acc;
    })
}
