import { describe, expect, it } from "vitest";
import { GrowingColumn } from "@/server/pipeline/column";

describe("GrowingColumn", () => {
  it("keeps every appended sample in order across growth, and a view taken before growing keeps what it showed", () => {
    const column = new GrowingColumn(3);
    column.append(Float64Array.of(1, 2));
    const early = column.view();
    column.append(Float64Array.of(3, 4, 5, 6, 7));
    column.append(Float64Array.of());
    column.append(Float64Array.of(8));
    expect(Array.from(column.view())).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    expect(Array.from(column.view(2, 5))).toEqual([3, 4, 5]);
    expect(column.length).toBe(8);
    expect(Array.from(early)).toEqual([1, 2]);
  });

  it("starts empty, with room for at least one sample", () => {
    const column = new GrowingColumn(0);
    expect(column.view().length).toBe(0);
    column.append(Float64Array.of(42));
    expect(Array.from(column.view())).toEqual([42]);
  });

  it("reuses its memory after a reset: appends start over at the beginning", () => {
    const column = new GrowingColumn(4);
    column.append(Float64Array.of(1, 2, 3));
    column.reset();
    expect(column.length).toBe(0);
    column.append(Float64Array.of(9));
    expect(Array.from(column.view())).toEqual([9]);
  });
});
