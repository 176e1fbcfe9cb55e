import { designFilter } from "@/lib/dsp";
import { buildRevisionContent } from "@/lib/coefficients";
function rnd(n: number, seed: number) { let s = seed; return Array.from({ length: n }, () => { s = (s * 1103515245 + 12345) % 2147483648; return s / 2147483648 - 0.5; }); }
const [nb, na] = process.argv.slice(2).map(Number);
const a = na === 1 ? [1] : [1, ...rnd(na - 1, 7).map((v) => v * 0.01)];
const spec = { kind: "coefficients" as const, b: rnd(nb, 3), a, sampleRateHz: 1000 };
let t = performance.now();
buildRevisionContent(spec, "q15");
console.log(nb, na, "content ms", (performance.now() - t).toFixed(0));
