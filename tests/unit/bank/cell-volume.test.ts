import { describe, expect, it } from "vitest";
import { cellVolume } from "@/lib/bank";

describe("cellVolume (bounding box)", () => {
  it("a cylinder takes d²·h on a square grid (common practice)", () => {
    // 60 mm × 138 mm: 0.06² · 0.138 = 4.968e-4 m³
    expect(cellVolume({ shape: "cylinder", diameterMm: 60, heightMm: 138 })).toBeCloseTo(4.968e-4, 12);
  });
  it("a box takes l·w·h", () => {
    expect(cellVolume({ shape: "box", lengthMm: 100, widthMm: 50, heightMm: 20 })).toBeCloseTo(1e-4, 12);
  });
  it("refuses missing or non-positive dimensions", () => {
    expect(() => cellVolume({ shape: "cylinder", heightMm: 10 })).toThrow(RangeError);
    expect(() => cellVolume({ shape: "box", lengthMm: 10, widthMm: 0, heightMm: 10 })).toThrow(RangeError);
  });
});
