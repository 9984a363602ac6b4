import { describe, expect, it } from "vitest";
import { comparePriced, rankPriced, SHOWN, type RankableOption } from "@/lib/quoting/rank";

type Opt = RankableOption & { name: string };

let n = 0;
/** An option with only what ranking reads; the name is for reading the test. */
function opt(perBank: string | null, over: Partial<RankableOption> = {}): Opt {
  n++;
  return {
    name: `o${n}`,
    price: perBank === null ? null : { perBank },
    mass: 10,
    volume: 0.01,
    leadTimeDays: 0,
    cell: { sku: "QZ-100" },
    seriesCount: 19,
    topology: "series-of-parallel-groups",
    ...over,
  };
}

const names = (xs: { name: string }[]) => xs.map((x) => x.name);

describe("rankPriced: exact price order", () => {
  it("orders decimal strings exactly, even where floats cannot tell them apart", () => {
    // 2^53 = 9007199254740992: as doubles both prices are 2^53
    const a = opt("9007199254740992.01", { cell: { sku: "A" } });
    const b = opt("9007199254740992.00", { cell: { sku: "B" } });
    expect(Number(a.price!.perBank)).toBe(Number(b.price!.perBank));
    expect(names(rankPriced([a, b]))).toEqual([b.name, a.name]);
  });

  it("reads 10.10 above 9.99 and 0.3 equal to 0.30", () => {
    const a = opt("10.10", { mass: 1 });
    const b = opt("9.99", { mass: 1 });
    const c = opt("0.3", { mass: 2 });
    const d = opt("0.30", { mass: 1 });
    expect(names(rankPriced([a, b, c, d]))).toEqual([d.name, c.name, b.name, a.name]);
  });

  it("puts options without a price last, in their tie-break order", () => {
    const none1 = opt(null, { mass: 5 });
    const none2 = opt(null, { mass: 1 });
    const dear = opt("99999.00");
    expect(names(rankPriced([none1, dear, none2]))).toEqual([dear.name, none2.name, none1.name]);
  });

  it("breaks equal prices by mass, volume, lead time, part number, N_s, then topology", () => {
    const base = { mass: 10, volume: 0.01, leadTimeDays: 5 };
    const heavier = opt("100.00", { ...base, mass: 11 });
    const bigger = opt("100.00", { ...base, volume: 0.02 });
    const slower = opt("100.00", { ...base, leadTimeDays: 9 });
    const skuB = opt("100.00", { ...base, cell: { sku: "QZ-B" } });
    const skuA20 = opt("100.00", { ...base, cell: { sku: "QZ-A" }, seriesCount: 20 });
    const skuA19strings = opt("100.00", { ...base, cell: { sku: "QZ-A" }, topology: "parallel-of-series-strings" });
    const skuA19groups = opt("100.00", { ...base, cell: { sku: "QZ-A" } });
    const input = [heavier, bigger, slower, skuB, skuA20, skuA19strings, skuA19groups];
    const expected = [skuA19groups, skuA19strings, skuA20, skuB, slower, bigger, heavier].map((o) => o.name);
    expect(names(rankPriced(input))).toEqual(expected);
    // the same whatever order they arrive in
    expect(names(rankPriced([...input].reverse()))).toEqual(expected);
    expect(comparePriced(skuA19groups, skuA19groups)).toBe(0);
  });

  it("returns the best dozen by default, or the limit asked", () => {
    const many = Array.from({ length: 30 }, (_, i) => opt(`${100 + i}.00`));
    expect(rankPriced(many)).toHaveLength(SHOWN);
    expect(rankPriced(many)[0]!.price!.perBank).toBe("100.00");
    expect(rankPriced(many, 3).map((o) => o.price!.perBank)).toEqual(["100.00", "101.00", "102.00"]);
  });
});

describe("rankPriced: the Pareto set over price, mass and volume", () => {
  it("marks an option dominated when another is no dearer, no heavier, no bigger and better in one", () => {
    const cheap = opt("100.00", { mass: 10, volume: 0.01 });
    const dearHeavy = opt("120.00", { mass: 12, volume: 0.01 }); // dominated by cheap
    const dearLight = opt("120.00", { mass: 8, volume: 0.01 }); // lighter: a trade-off
    const samePriceHeavier = opt("100.00", { mass: 11, volume: 0.01 }); // dominated: equal price, heavier
    const r = rankPriced([cheap, dearHeavy, dearLight, samePriceHeavier]);
    const pareto = Object.fromEntries(r.map((o) => [o.name, o.pareto]));
    expect(pareto).toEqual({ [cheap.name]: true, [samePriceHeavier.name]: false, [dearHeavy.name]: false, [dearLight.name]: true });
  });

  it("two options with the same price, mass and volume do not dominate each other", () => {
    const a = opt("50.00", { cell: { sku: "A" } });
    const b = opt("50.00", { cell: { sku: "B" } });
    expect(rankPriced([a, b]).map((o) => o.pareto)).toEqual([true, true]);
  });

  it("a dominating option always ranks ahead of what it dominates, so the dozen is judged among itself and all below", () => {
    const heavy = Array.from({ length: 12 }, (_, i) => opt(`${200 + i}.00`, { mass: 50 }));
    const light = opt("205.00", { mass: 10 });
    const shown = rankPriced([...heavy, light]);
    expect(shown.findIndex((o) => o.name === light.name)).toBeLessThan(shown.findIndex((o) => o.price!.perBank === "205.00" && o.mass === 50));
    // the cheapest heavy one dominates the dearer heavy ones; the light one trades price for mass
    expect(shown.filter((o) => o.pareto).map((o) => [o.price!.perBank, o.mass])).toEqual([
      ["200.00", 50],
      ["205.00", 10],
    ]);
  });

  it("never marks an option without a price", () => {
    expect(rankPriced([opt(null, { mass: 1 })])[0]!.pareto).toBe(false);
  });
});
