import { buildRevisionContent } from "@/lib/coefficients";
import { designFilter } from "@/lib/dsp";
function rnd(n: number, seed: number) { let s = seed; return Array.from({ length: n }, () => { s = (s * 1103515245 + 12345) % 2147483648; return s / 2147483648 - 0.5; }); }
function time(label: string, spec: any) { const t = performance.now(); try { buildRevisionContent(spec, "q15"); } catch (e) { console.log("ERR", (e as Error).message.slice(0,100)); } console.log(label, (performance.now() - t).toFixed(0), "ms"); }
const which = process.argv[2];
if (which === "sos") for (const n of [8, 16, 32, 64]) {
  const r = rnd(4 * n, 5);
  const sos = Array.from({ length: n }, (_, i) => { const rad = 0.5 + 0.4 * Math.abs(r[i]); const th = 3 * Math.abs(r[n + i]); return [1, -2 * Math.cos(th + 0.1), 1, 1, -2 * rad * Math.cos(th), rad * rad]; });
  time(`sos ${n}`, { kind: "coefficients", sos, sampleRateHz: 1000 });
}
if (which === "iir") for (const order of [6, 12]) time(`ellip bp ${order}`, { kind: "iir", family: "elliptic", response: "bandpass", order: 6, cutoffHz: [100, 200], passbandRippleDb: 1, stopbandAttenuationDb: 60, sampleRateHz: 1000 });
if (which === "fir") for (const taps of [255, 511, 1023]) time(`fir ${taps}`, { kind: "fir", response: "lowpass", window: "hamming", taps, cutoffHz: 100, sampleRateHz: 1000 });
if (which === "ma") for (const length of [256, 1024, 4096]) time(`ma ${length}`, { kind: "moving-average", length, sampleRateHz: 1000 });
if (which === "chain") {
  const st = { kind: "iir", family: "elliptic", response: "bandpass", order: 6, cutoffHz: [100, 200], passbandRippleDb: 1, stopbandAttenuationDb: 60, sampleRateHz: 1000 };
  for (const k of [2, 4, 8]) time(`chain ${k} ellip bp6`, { kind: "chain", sampleRateHz: 1000, stages: Array(k).fill(st) });
  const f = { kind: "fir", response: "lowpass", window: "hamming", taps: 1023, cutoffHz: 100, sampleRateHz: 1000 };
  for (const k of [2, 4]) time(`chain ${k} fir1023`, { kind: "chain", sampleRateHz: 1000, stages: Array(k).fill(f) });
}
