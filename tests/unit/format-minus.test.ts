import { describe, expect, it } from "vitest";
import { valueText } from "@/components/charts/chart-options";
import { withUnit } from "@/lib/bench/format";
import { signedTrim, withMinus } from "@/lib/format/units";

describe("numbers people read carry true minus signs, in the exponent too", () => {
  it("signedTrim and withMinus", () => {
    expect(signedTrim(-0.000123456)).toBe("−0.0001235");
    expect(signedTrim(2.5e-15)).toBe("2.5e−15");
    expect(signedTrim(-2.5e-15)).toBe("−2.5e−15");
    expect(withMinus("-1e-7")).toBe("−1e−7");
  });

  it("chart readouts and bench figures", () => {
    expect(valueText(-4.2e-15, "dB")).toBe("−4.2e−15 dB");
    expect(valueText(null, "dB")).toBe("—");
    expect(withUnit(-3.21e-9, "s")).toBe("−3.21e−9 s");
  });
});
