import { describe, expect, it } from "vitest";
import { CANDIDATE_COLORS, PRODUCTION_COLOR, RAW_COLOR } from "@/lib/bench/colors";

/** The chart canvas (tailwind `canvas`). */
const CANVAS = "#0d1420";

type Lab = [number, number, number];
type Rgb = [number, number, number];

/** sRGB hex to linear RGB (IEC 61966-2-1 transfer function; common practice). */
function linear(hex: string): Rgb {
  const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const [r, g, b] = c.map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return [r, g, b];
}

/** Linear sRGB to CIELAB under D65 (sRGB primaries to XYZ, then the CIE 1976 L*a*b* formulas; common practice). */
function toLab([r, g, b]: Rgb): Lab {
  const x = (0.4124564 * r + 0.3575761 * g + 0.1804375 * b) / 0.95047;
  const y = 0.2126729 * r + 0.7151522 * g + 0.072175 * b;
  const z = (0.0193339 * r + 0.119192 * g + 0.9503041 * b) / 1.08883;
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : ((24389 / 27) * t + 16) / 116);
  return [116 * f(y) - 16, 500 * (f(x) - f(y)), 200 * (f(y) - f(z))];
}

const rad = (deg: number) => (deg * Math.PI) / 180;

/**
 * CIEDE2000 colour difference (kL = kC = kH = 1), as written out in Sharma, Wu & Dalal, "The CIEDE2000
 * color-difference formula: implementation notes, supplementary test data, and mathematical
 * observations", Color Research & Application 30(1), 2005, eqs. 1–22.
 */
function deltaE00([l1, a1, b1]: Lab, [l2, a2, b2]: Lab): number {
  const cBar = (Math.hypot(a1, b1) + Math.hypot(a2, b2)) / 2;
  const g = 0.5 * (1 - Math.sqrt(cBar ** 7 / (cBar ** 7 + 25 ** 7)));
  const [a1p, a2p] = [(1 + g) * a1, (1 + g) * a2];
  const [c1p, c2p] = [Math.hypot(a1p, b1), Math.hypot(a2p, b2)];
  const hue = (a: number, b: number) => (a === 0 && b === 0 ? 0 : ((Math.atan2(b, a) * 180) / Math.PI + 360) % 360);
  const [h1p, h2p] = [hue(a1p, b1), hue(a2p, b2)];
  let dh = h2p - h1p;
  if (c1p * c2p === 0) dh = 0;
  else if (dh > 180) dh -= 360;
  else if (dh < -180) dh += 360;
  const dL = l2 - l1;
  const dC = c2p - c1p;
  const dH = 2 * Math.sqrt(c1p * c2p) * Math.sin(rad(dh / 2));
  const lBar = (l1 + l2) / 2;
  const cBarP = (c1p + c2p) / 2;
  let hBar = h1p + h2p;
  if (c1p * c2p !== 0) hBar = Math.abs(h1p - h2p) <= 180 ? hBar / 2 : hBar < 360 ? (hBar + 360) / 2 : (hBar - 360) / 2;
  const t = 1 - 0.17 * Math.cos(rad(hBar - 30)) + 0.24 * Math.cos(rad(2 * hBar)) + 0.32 * Math.cos(rad(3 * hBar + 6)) - 0.2 * Math.cos(rad(4 * hBar - 63));
  const dTheta = 30 * Math.exp(-(((hBar - 275) / 25) ** 2));
  const rC = 2 * Math.sqrt(cBarP ** 7 / (cBarP ** 7 + 25 ** 7));
  const sL = 1 + (0.015 * (lBar - 50) ** 2) / Math.sqrt(20 + (lBar - 50) ** 2);
  const sC = 1 + 0.045 * cBarP;
  const sH = 1 + 0.015 * cBarP * t;
  const rT = -Math.sin(rad(2 * dTheta)) * rC;
  return Math.sqrt((dL / sL) ** 2 + (dC / sC) ** 2 + (dH / sH) ** 2 + rT * (dC / sC) * (dH / sH));
}

/**
 * Colour-vision deficiency simulation matrices on linear RGB, severity 1.0, from Machado, Oliveira &
 * Fernandes, "A physiologically-based model for simulation of color vision deficiency", IEEE TVCG
 * 15(6), 2009 (the published table — from memory).
 */
const CVD: Record<string, number[][]> = {
  protanopia: [[0.152286, 1.052583, -0.204868], [0.114503, 0.786281, 0.099216], [-0.003882, -0.048116, 1.051998]],
  deuteranopia: [[0.367322, 0.860646, -0.227968], [0.280085, 0.672501, 0.047413], [-0.01182, 0.04294, 0.968881]],
  tritanopia: [[1.255528, -0.076749, -0.178779], [-0.078411, 0.930809, 0.147602], [0.004733, 0.691367, 0.3039]],
};
const seen = (hex: string, m?: number[][]): Lab => {
  const c = linear(hex);
  if (!m) return toLab(c);
  const [r, g, b] = m.map((row) => Math.min(1, Math.max(0, row[0] * c[0] + row[1] * c[1] + row[2] * c[2])));
  return toLab([r, g, b]);
};
const pairs = <T,>(xs: readonly T[]) => xs.flatMap((a, i) => xs.slice(i + 1).map((b) => [a, b] as const));

describe("the CIEDE2000 used to judge the palette", () => {
  it("reproduces Sharma, Wu & Dalal's test pairs (2005, table 1 — from memory)", () => {
    expect(deltaE00([50, 2.6772, -79.7751], [50, 0, -82.7485])).toBeCloseTo(2.0425, 4);
    expect(deltaE00([50, 2.5, 0], [73, 25, -18])).toBeCloseTo(27.1492, 4);
    expect(deltaE00([50, 2.5, 0], [61, -5, 29])).toBeCloseTo(22.8977, 4);
  });
});

describe("six clearly distinct candidate colours", () => {
  // Thresholds: a CIEDE2000 of about 10 or more reads as a different colour at a glance, 20 as clearly
  // different (common practice for categorical palettes); colour-blind viewers get the lower bar.
  it("every pair differs by at least 20 for normal vision, and by at least 11 under each simulated deficiency", () => {
    expect(new Set(CANDIDATE_COLORS).size).toBe(6);
    for (const [a, b] of pairs(CANDIDATE_COLORS)) expect(deltaE00(seen(a), seen(b)), `${a} ${b}`).toBeGreaterThanOrEqual(20);
    for (const [name, m] of Object.entries(CVD)) {
      for (const [a, b] of pairs(CANDIDATE_COLORS)) expect(deltaE00(seen(a, m), seen(b, m)), `${name}: ${a} ${b}`).toBeGreaterThanOrEqual(11);
    }
  });

  it("each stays apart from raw and production (at least 15, 11 under each deficiency) and stands out on the canvas", () => {
    for (const c of CANDIDATE_COLORS) {
      for (const fixed of [RAW_COLOR, PRODUCTION_COLOR]) {
        expect(deltaE00(seen(c), seen(fixed)), `${c} ${fixed}`).toBeGreaterThanOrEqual(15);
        for (const [name, m] of Object.entries(CVD)) expect(deltaE00(seen(c, m), seen(fixed, m)), `${name}: ${c} ${fixed}`).toBeGreaterThanOrEqual(11);
      }
      expect(deltaE00(seen(c), seen(CANVAS)), c).toBeGreaterThanOrEqual(35);
    }
  });
});
