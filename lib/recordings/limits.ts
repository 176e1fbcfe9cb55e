/** Largest upload accepted, in samples (product choice: 2,000,000 float64 samples = 16 MB stored). */
export const MAX_SAMPLES = 2_000_000;

/** Largest CSV file accepted, in bytes (20 MB, decimal megabytes as shown to people). */
export const MAX_UPLOAD_BYTES = 20_000_000;

/** Largest relative spread of one time step around the median step before a file is refused (1 %). */
export const MAX_STEP_JITTER = 0.01;

/** Largest relative difference between a recording's sample rate and its channel's (0.1 %). */
export const MAX_RATE_MISMATCH = 0.001;
