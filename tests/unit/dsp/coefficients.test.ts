import { describe, expect, it } from "vitest";
import { stability } from "@/lib/dsp/analysis";
import { CoefficientParseError, parseCoefficientText } from "@/lib/dsp/coefficients";
import { designFilter } from "@/lib/dsp/design";
import { filterSignal } from "@/lib/dsp/engine";
import { MAX_DIRECT_FORM_ORDER } from "@/lib/dsp/transfer";

describe("parseCoefficientText: realistic pastes", () => {
  it("numpy repr of b", () => {
    expect(parseCoefficientText("array([0.06745527, 0.13491055, 0.06745527])")).toEqual([0.06745527, 0.13491055, 0.06745527]);
  });

  it("one sos row stays a row; a 1-D numpy array stays a list", () => {
    expect(parseCoefficientText("array([[1., 2., 1., 1., -0.5, 0.25]])")).toEqual([[1, 2, 1, 1, -0.5, 0.25]]);
    expect(parseCoefficientText("np.array([1., 2., 1.])")).toEqual([1, 2, 1]);
    expect(parseCoefficientText("b = [1 -2 1];")).toEqual([1, -2, 1]);
  });

  it("numpy repr of an sos array with dtype, scientific notation and line breaks", () => {
    const text = `array([[ 1.80989330e-02,  3.61978660e-02,  1.80989330e-02,  1.00000000e+00,
         -5.09525449e-01,  0.00000000e+00],
       [ 1.00000000e+00,  1.00000000e+00,  0.00000000e+00,  1.00000000e+00,
         -1.25051643e+00,  5.45723316e-01]], dtype=float32)`;
    expect(parseCoefficientText(text)).toEqual([
      [1.8098933e-2, 3.6197866e-2, 1.8098933e-2, 1, -5.09525449e-1, 0],
      [1, 1, 0, 1, -1.25051643, 5.45723316e-1],
    ]);
  });

  it("numpy 2 scalar reprs inside a Python list", () => {
    expect(parseCoefficientText("[np.float64(0.5), np.float64(-0.25), np.float64(1e-3)]")).toEqual([0.5, -0.25, 0.001]);
  });

  it("C initialiser with declaration, f suffixes, comments and a nested sos", () => {
    const text = `/* 2nd-order Butterworth, fs = 1 kHz */
static const float32_t sos[2][6] = {
  { 0.0674553f, 0.1349105f, 0.0674553f, 1.0f, -1.1429805f, 0.4128016f }, // stage 1
  { 1.0F, 2.0F, 1.0F, 1.0F, -0.5F, 0.25F },
};`;
    expect(parseCoefficientText(text)).toEqual([
      [0.0674553, 0.1349105, 0.0674553, 1, -1.1429805, 0.4128016],
      [1, 2, 1, 1, -0.5, 0.25],
    ]);
  });

  it("flat C array of 5-per-stage coefficients", () => {
    expect(parseCoefficientText("const float coeffs[] = {0.1f, 0.2f, 0.1f, 1.14f, -0.41f};")).toEqual([0.1, 0.2, 0.1, 1.14, -0.41]);
  });

  it("rows separated by semicolons and a % comment", () => {
    expect(parseCoefficientText("sos = [1 2 1 1 -0.5 0.25; 1 -2 1 1 0.1 0.2]; % two sections")).toEqual([
      [1, 2, 1, 1, -0.5, 0.25],
      [1, -2, 1, 1, 0.1, 0.2],
    ]);
  });

  it("plain whitespace rows (one section per line) and a plain column", () => {
    expect(parseCoefficientText("1 2 1 1 -0.5 0.25\n1 -2 1 1 0.1 0.2\n")).toEqual([
      [1, 2, 1, 1, -0.5, 0.25],
      [1, -2, 1, 1, 0.1, 0.2],
    ]);
    expect(parseCoefficientText("0.25\n0.5\n0.25\n")).toEqual([0.25, 0.5, 0.25]);
  });

  it("a comma-continued list across lines and a Python tuple", () => {
    expect(parseCoefficientText("0.1, 0.2,\n0.3, 0.4")).toEqual([0.1, 0.2, 0.3, 0.4]);
    expect(parseCoefficientText("(1.0, -0.5)")).toEqual([1, -0.5]);
  });
});

describe("parseCoefficientText: garbage is refused with the position", () => {
  const refuse = (text: string, message: RegExp, line: number, column: number) => {
    try {
      parseCoefficientText(text);
      expect.unreachable(`accepted ${text}`);
    } catch (e) {
      expect(e).toBeInstanceOf(CoefficientParseError);
      const err = e as CoefficientParseError;
      expect(err.message).toMatch(message);
      expect([err.line, err.column]).toEqual([line, column]);
    }
  };

  it("an unknown word", () => refuse("[1, 2, x3]", /unexpected 'x3'/, 1, 8));
  it("a malformed number", () => refuse("[1, 2.5.1]", /unexpected '2.5.1'/, 1, 5));
  it("NaN and Infinity", () => {
    refuse("[1, nan]", /must be finite/, 1, 5);
    refuse("1,\n-inf", /must be finite/, 2, 1);
  });
  it("an out-of-range literal", () => refuse("1e999", /out of the double-precision range/, 1, 1));
  it("unbalanced or mismatched brackets", () => {
    refuse("[1, 2", /'\[' is never closed/, 1, 1);
    refuse("[1, 2}", /unexpected '}'/, 1, 6);
  });
  it("ragged rows", () => refuse("[[1, 2, 3], [4, 5]]", /row 2 has 2 number\(s\) but row 1 has 3/, 1, 13));
  it("numbers beside rows and deep nesting", () => {
    refuse("[1, [2, 3]]", /beside rows/, 1, 2);
    refuse("[[[1, 2]], [[3, 4]]]", /nested more than two deep/, 1, 3);
  });
  it("empty text", () => refuse("  \n", /no numbers found/, 1, 1));
});

describe("pasted coefficients as designs", () => {
  it("normalises a0 to 1 and keeps the transfer function exactly, in direct form", () => {
    const d = designFilter({ kind: "coefficients", b: [2, 4, 2], a: [2, -1, 0.5], sampleRateHz: 100 });
    expect(d.gain).toBe(1);
    expect(d.ba).toEqual({ b: [1, 2, 1], a: [1, -0.5, 0.25] });
    expect(d.sos).toBeUndefined();
  });

  it(`keeps the direct form up to order ${MAX_DIRECT_FORM_ORDER} of a and factors higher orders into sections`, () => {
    const a = (order: number) => [1, ...new Array<number>(order - 1).fill(0), 0.5];
    const kept = designFilter({ kind: "coefficients", b: [1], a: a(MAX_DIRECT_FORM_ORDER), sampleRateHz: 100 });
    expect(kept.ba?.a).toEqual(a(MAX_DIRECT_FORM_ORDER));
    const factored = designFilter({ kind: "coefficients", b: [1], a: a(MAX_DIRECT_FORM_ORDER + 1), sampleRateHz: 100 });
    expect(factored.ba).toBeUndefined();
    expect(factored.sos).toHaveLength(Math.ceil((MAX_DIRECT_FORM_ORDER + 1) / 2));
    // trailing zeros of a do not count towards its order
    expect(designFilter({ kind: "coefficients", b: [1], a: [...a(2), 0, 0, 0, 0, 0, 0, 0, 0], sampleRateHz: 100 }).ba).toBeDefined();
  });

  it("b with a = [1] (or no a) is an FIR with taps", () => {
    const d = designFilter({ kind: "coefficients", b: [0.25, 0.5, 0.25], sampleRateHz: 100 });
    expect(d.taps).toEqual([0.25, 0.5, 0.25]);
    expect(d.sos).toBeUndefined();
    expect(designFilter({ kind: "coefficients", b: [1, 1], a: [2], sampleRateHz: 100 }).taps).toEqual([0.5, 0.5]);
  });

  it("keeps a leading zero of b as a one-sample delay (e.g. a ZOH result b = [0, b1])", () => {
    const d = designFilter({ kind: "coefficients", b: [0, 0.5], a: [1, -0.5], sampleRateHz: 100 });
    const impulse = new Float64Array(5);
    impulse[0] = 1;
    expect(Array.from(filterSignal(d, impulse))).toEqual([0, 0.5, 0.25, 0.125, 0.0625]);
    expect(d.zeros).toEqual([]);
    expect(d.poles).toEqual([[0.5, 0]]);
  });

  it("a higher-order b/a runs with the same impulse response as the difference equation", () => {
    const b = [0.02, 0.01, -0.03, 0.005];
    const a = [1, -1.9, 1.43, -0.4];
    const d = designFilter({ kind: "coefficients", b, a, sampleRateHz: 100 });
    const n = 40;
    const x = new Float64Array(n);
    x[0] = 1;
    const y = filterSignal(d, x);
    const direct: number[] = [];
    for (let k = 0; k < n; k++) {
      let acc = b[k] ?? 0;
      for (let i = 1; i < a.length; i++) acc -= a[i] * (direct[k - i] ?? 0);
      direct.push(acc);
    }
    y.forEach((v, k) => expect(v).toBeCloseTo(direct[k], 12));
  });

  it("unstable pasted coefficients are designed exactly as given, and the analysis marks them unstable", () => {
    const d = designFilter({ kind: "coefficients", b: [1], a: [1, -1.5], sampleRateHz: 100 });
    expect(d.poles).toEqual([[1.5, 0]]);
    expect(stability(d).stable).toBe(false);
    const s = designFilter({ kind: "coefficients", sos: [[1, 0, 0, 1, 0, -1.21]], sampleRateHz: 100 });
    expect(s.sos).toEqual([[1, 0, 0, 1, 0, -1.21]]);
    expect(stability(s).stable).toBe(false);
  });

  it("sos rows are normalised by their a0; zeros and poles come from each row", () => {
    const d = designFilter({ kind: "coefficients", sos: [[2, 0, -2, 2, 0, 0.5], [1, 1, 0, 1, -0.5, 0]], sampleRateHz: 100 });
    expect(d.sos).toEqual([[1, 0, -1, 1, 0, 0.25], [1, 1, 0, 1, -0.5, 0]]);
    expect(d.zeros).toHaveLength(4);
    expect(d.poles).toHaveLength(4);
    expect(d.gain).toBe(1);
  });

  it("a parsed paste feeds the spec directly", () => {
    const sos = parseCoefficientText("[[1, 2, 1, 1, -0.5, 0.25]]") as number[][];
    expect(designFilter({ kind: "coefficients", sos, sampleRateHz: 1000 }).sos).toEqual(sos);
  });
});
