export { MAX_RATE_MISMATCH, MAX_SAMPLES, MAX_STEP_JITTER, MAX_UPLOAD_BYTES } from "./limits";
export { parseRecordingCsv, RecordingCsvError, type CsvOptions, type ParsedRecording, type TimeKind, type UploadField } from "./parse";
export { inferSampleRate } from "./rate";
export { decodeSamples, encodeSamples } from "./samples";
