/*
 * Test stand-in for the few declarations of the CMSIS-DSP library's arm_math.h that Tapwright's
 * cmsis-df1 and cmsis-df2t exports use, so that an export compiles and runs here exactly as firmware
 * would include it. Written from the library's documentation as we remember it (the pages "Biquad
 * Cascade IIR Filters Using Direct Form I Structure", "Biquad Cascade IIR Filters Using a Direct Form
 * II Transposed Structure" and "Finite Impulse Response (FIR) Filters"), not from its source: names,
 * parameter lists and the instance fields follow the documented API; kernels.c holds the documented
 * arithmetic. Not the library, and no substitute for it in firmware.
 */
#ifndef TW_TEST_ARM_MATH_STANDIN_H
#define TW_TEST_ARM_MATH_STANDIN_H

#include <stdint.h>

typedef int16_t q15_t;
typedef int32_t q31_t;
typedef int64_t q63_t;
typedef float float32_t;

typedef enum { ARM_MATH_SUCCESS = 0, ARM_MATH_ARGUMENT_ERROR = -1 } arm_status;

typedef struct { int8_t numStages; q15_t *pState; const q15_t *pCoeffs; int8_t postShift; } arm_biquad_casd_df1_inst_q15;
typedef struct { uint32_t numStages; q31_t *pState; const q31_t *pCoeffs; uint8_t postShift; } arm_biquad_casd_df1_inst_q31;
typedef struct { uint32_t numStages; float32_t *pState; const float32_t *pCoeffs; } arm_biquad_casd_df1_inst_f32;
typedef struct { uint8_t numStages; float32_t *pState; const float32_t *pCoeffs; } arm_biquad_cascade_df2T_instance_f32;
typedef struct { uint16_t numTaps; q15_t *pState; const q15_t *pCoeffs; } arm_fir_instance_q15;
typedef struct { uint16_t numTaps; q31_t *pState; const q31_t *pCoeffs; } arm_fir_instance_q31;
typedef struct { uint16_t numTaps; float32_t *pState; const float32_t *pCoeffs; } arm_fir_instance_f32;

void arm_biquad_cascade_df1_init_q15(arm_biquad_casd_df1_inst_q15 *S, uint8_t numStages, const q15_t *pCoeffs, q15_t *pState, int8_t postShift);
void arm_biquad_cascade_df1_init_q31(arm_biquad_casd_df1_inst_q31 *S, uint8_t numStages, const q31_t *pCoeffs, q31_t *pState, int8_t postShift);
void arm_biquad_cascade_df1_init_f32(arm_biquad_casd_df1_inst_f32 *S, uint8_t numStages, const float32_t *pCoeffs, float32_t *pState);
void arm_biquad_cascade_df2T_init_f32(arm_biquad_cascade_df2T_instance_f32 *S, uint8_t numStages, const float32_t *pCoeffs, float32_t *pState);
arm_status arm_fir_init_q15(arm_fir_instance_q15 *S, uint16_t numTaps, const q15_t *pCoeffs, q15_t *pState, uint32_t blockSize);
void arm_fir_init_q31(arm_fir_instance_q31 *S, uint16_t numTaps, const q31_t *pCoeffs, q31_t *pState, uint32_t blockSize);
void arm_fir_init_f32(arm_fir_instance_f32 *S, uint16_t numTaps, const float32_t *pCoeffs, float32_t *pState, uint32_t blockSize);

void arm_biquad_cascade_df1_q15(const arm_biquad_casd_df1_inst_q15 *S, const q15_t *pSrc, q15_t *pDst, uint32_t blockSize);
void arm_biquad_cascade_df1_fast_q15(const arm_biquad_casd_df1_inst_q15 *S, const q15_t *pSrc, q15_t *pDst, uint32_t blockSize);
void arm_biquad_cascade_df1_q31(const arm_biquad_casd_df1_inst_q31 *S, const q31_t *pSrc, q31_t *pDst, uint32_t blockSize);
void arm_biquad_cascade_df1_fast_q31(const arm_biquad_casd_df1_inst_q31 *S, const q31_t *pSrc, q31_t *pDst, uint32_t blockSize);
void arm_biquad_cascade_df1_f32(const arm_biquad_casd_df1_inst_f32 *S, const float32_t *pSrc, float32_t *pDst, uint32_t blockSize);
void arm_biquad_cascade_df2T_f32(const arm_biquad_cascade_df2T_instance_f32 *S, const float32_t *pSrc, float32_t *pDst, uint32_t blockSize);
void arm_fir_q15(const arm_fir_instance_q15 *S, const q15_t *pSrc, q15_t *pDst, uint32_t blockSize);
void arm_fir_fast_q15(const arm_fir_instance_q15 *S, const q15_t *pSrc, q15_t *pDst, uint32_t blockSize);
void arm_fir_q31(const arm_fir_instance_q31 *S, const q31_t *pSrc, q31_t *pDst, uint32_t blockSize);
void arm_fir_fast_q31(const arm_fir_instance_q31 *S, const q31_t *pSrc, q31_t *pDst, uint32_t blockSize);
void arm_fir_f32(const arm_fir_instance_f32 *S, const float32_t *pSrc, float32_t *pDst, uint32_t blockSize);

#endif
