/**
 * Prices one bank design for an order (DESIGN.md §4).
 *
 * Order of rounding — every amount shown is rounded once, half-up, to the currency's minor unit,
 * and every total is an exact sum or product of amounts already shown, so the quote adds up:
 *  1. Material unit prices are rounded (cell and board unit costs may carry more digits;
 *     bleeder unit price = cost per watt × watts, rounded). Line amount = unit price × count.
 *  2. Labour line amount = rate × minutes / 60, rounded (computed from the minutes, not from the
 *     4-decimal hours shown as the line quantity).
 *  3. materials = Σ material lines; labour = Σ labour lines (exact).
 *  4. overhead = materials × overhead %, rounded.
 *  5. cost = materials + overhead + labour (exact).
 *  6. unitPrice = cost / (1 − margin %), rounded (margin on price).
 *  7. gross = unitPrice × quantity (exact); discount = gross × break %, rounded;
 *     subtotal = gross − discount (exact).
 *  8. tax = subtotal × tax %, rounded; total = subtotal + tax (exact).
 *
 * Enclosure: the smallest enclosure whose maxVolumeM3 ≥ volumeM3 × packing factor (compared in
 * decimal, so a bank exactly at the limit fits); equal volumes → the cheaper one. When none is
 * big enough the bank is NOT auto-priced: priceBank throws a PricingError with code
 * 'no-enclosure-fits' (tryPriceBank returns it as a result) and the request goes to an
 * estimator, who prices a custom enclosure by hand. An empty enclosure list means the shop
 * quotes banks without an enclosure: no enclosure line.
 */
import { minorUnits, roundMoney } from "./currency";
import { Dec, Decimal, isDecimalString } from "./decimal";
import type { BankBill, BankPrice, ExtraLine, ExtraLineInput, PriceBankResult, PriceLine, PricingErrorCode, PricingIssue, PricingRules } from "./types";
import { validateBankBill, validateExtraLines, validatePricingRules } from "./validate";

/** An expected failure to price (bad rules or bill, nothing fits): callers may show it. */
export class PricingError extends Error {
  readonly code: PricingErrorCode;
  readonly issues: PricingIssue[];
  constructor(code: PricingErrorCode, message: string, issues: PricingIssue[] = []) {
    super(message);
    this.name = "PricingError";
    this.code = code;
    this.issues = issues;
  }
}

type Enclosure = PricingRules["enclosures"][number];

/**
 * The smallest enclosure that holds volumeM3 × packingFactor, or null when none does.
 * Throws nothing; the caller decides.
 */
export function selectEnclosure(volumeM3: number, rules: Pick<PricingRules, "enclosures" | "enclosurePackingFactor">): Enclosure | null {
  const needed = new Dec(volumeM3).times(rules.enclosurePackingFactor);
  let best: Enclosure | null = null;
  for (const e of rules.enclosures) {
    if (new Dec(e.maxVolumeM3).lessThan(needed)) continue;
    if (best === null || e.maxVolumeM3 < best.maxVolumeM3 || (e.maxVolumeM3 === best.maxVolumeM3 && new Dec(e.cost).lessThan(best.cost))) {
      best = e;
    }
  }
  return best;
}

/** The discount % for an ordered quantity: the largest break whose minQuantity ≤ quantity, else "0". */
export function selectDiscountPct(quantity: number, breaks: PricingRules["quantityBreaks"]): string {
  let best: PricingRules["quantityBreaks"][number] | null = null;
  for (const b of breaks) {
    if (b.minQuantity <= quantity && (best === null || b.minQuantity > best.minQuantity)) best = b;
  }
  return best === null ? "0" : new Dec(best.discountPct).toString();
}

const SI_PREFIXES: [number, string][] = [
  [1e9, "G"],
  [1e6, "M"],
  [1e3, "k"],
  [1, ""],
  [1e-3, "m"],
];

/** 1000 → "1 kΩ", 2200 → "2.2 kΩ", 330 → "330 Ω" (3 significant digits). */
function formatSi(value: number, unit: string): string {
  const found = SI_PREFIXES.find(([scale]) => Math.abs(value) >= scale);
  const [scale, prefix] = found ?? [1e-3, "m"];
  return `${Number((value / scale).toPrecision(3))} ${prefix}${unit}`;
}

function formatPlain(value: number, unit: string): string {
  return `${Number(value.toPrecision(3))} ${unit}`;
}

function pct(value: string): Decimal {
  return new Dec(value).div(100);
}

/**
 * Prices a bank; throws PricingError for invalid rules or bill, a board with no unit cost and
 * no fallback, or a bank no enclosure holds. See the file header for the order of rounding.
 */
export function priceBank(bill: BankBill, rules: PricingRules, extraInputs: readonly ExtraLineInput[] = []): BankPrice {
  const ruleIssues = validatePricingRules(rules);
  if (ruleIssues.length > 0) {
    throw new PricingError("invalid-rules", "The pricing rules are not valid", ruleIssues);
  }
  const billIssues = validateBankBill(bill);
  if (billIssues.length > 0) {
    throw new PricingError("invalid-bill", "The bill of materials is not valid", billIssues);
  }
  const extraIssues = validateExtraLines(extraInputs, rules.currency);
  if (extraIssues.length > 0) {
    throw new PricingError("invalid-extras", "The extra lines are not valid", extraIssues);
  }

  const currency = rules.currency;
  const digits = minorUnits(currency);
  const round = (v: Decimal | string): Decimal => roundMoney(v, currency);
  const str = (v: Decimal): string => v.toFixed(digits);

  const materialLines: { line: PriceLine; amount: Decimal }[] = [];
  const addMaterial = (code: PriceLine["code"], description: string, quantity: number, unit: string, unitPriceRaw: Decimal | string): void => {
    if (quantity <= 0) return;
    const unitPrice = round(unitPriceRaw);
    const amount = unitPrice.times(quantity);
    materialLines.push({
      amount,
      line: {
        code,
        kind: "material",
        description,
        quantity,
        unit,
        unitPrice: str(unitPrice),
        amount: str(amount),
      },
    });
  };

  const cellLabel = (c: { sku: string; description: string }) => (c.description ? `${c.sku} — ${c.description}` : c.sku);
  if (bill.mixedCells) for (const c of bill.mixedCells) addMaterial("cells", cellLabel(c), c.count, "pc", c.unitCost);
  else addMaterial("cells", cellLabel(bill.cell), bill.cellCount, "pc", bill.cell.unitCost);

  if (bill.balancingResistors) {
    const r = bill.balancingResistors;
    addMaterial(
      "balancing-resistors",
      `Balancing resistor ${formatSi(r.resistance, "Ω")}, ${formatPlain(r.powerRating, "W")}${r.sku ? ` (${r.sku})` : ""}`,
      r.count,
      "pc",
      r.unitCost,
    );
  }

  if (bill.bleeder) {
    const b = bill.bleeder;
    addMaterial("bleeder", `Bleeder resistor ${formatSi(b.resistance, "Ω")}, ${formatPlain(b.power, "W")}${b.sku ? ` (${b.sku})` : ""}`, 1, "pc", b.unitCost);
  }

  addMaterial("interconnects", "Cell interconnects", bill.cellCount, "pc", rules.interconnectCostPerCell);

  if (bill.activeBoards && bill.activeBoards.count > 0) {
    const a = bill.activeBoards;
    const unitCost = a.unitCost !== "" ? a.unitCost : rules.balancingBoardCost;
    if (unitCost === undefined) {
      throw new PricingError("missing-board-cost", `Active balancing board ${a.sku} has no unit cost and the rules set no balancingBoardCost`, [
        { path: "activeBoards.unitCost", message: "no unit cost and no fallback in the rules" },
      ]);
    }
    addMaterial("balancing-boards", `Active balancing board ${a.sku}`, a.count, "pc", unitCost);
  }

  if (rules.enclosures.length > 0) {
    const enclosure = selectEnclosure(bill.volumeM3, rules);
    if (enclosure === null) {
      const needed = new Dec(bill.volumeM3).times(rules.enclosurePackingFactor);
      const largest = Math.max(...rules.enclosures.map((e) => e.maxVolumeM3));
      throw new PricingError(
        "no-enclosure-fits",
        `The bank needs an enclosure of ${needed.toString()} m³ (cells ${bill.volumeM3} m³ × ` +
          `packing ${rules.enclosurePackingFactor}); the largest enclosure holds ${largest} m³. ` +
          "A custom enclosure must be priced by an estimator.",
        [{ path: "volumeM3", message: "no enclosure in the rules is big enough" }],
      );
    }
    addMaterial("enclosure", enclosure.name, 1, "pc", enclosure.cost);
  }

  addMaterial("terminals", "Terminal set", 1, "set", rules.terminalSetCost);

  const rate = round(rules.labourRatePerHour);
  const labourLines: { line: PriceLine; amount: Decimal }[] = [];
  const addLabour = (code: PriceLine["code"], description: string, minutes: Decimal): void => {
    if (minutes.lessThanOrEqualTo(0)) return;
    const amount = round(rate.times(minutes).div(60));
    labourLines.push({
      amount,
      line: {
        code,
        kind: "labour",
        description,
        quantity: minutes.div(60).toDecimalPlaces(4, Decimal.ROUND_HALF_UP).toNumber(),
        unit: "h",
        unitPrice: str(rate),
        amount: str(amount),
      },
    });
  };
  const setup = new Dec(rules.setupMinutes);
  const assembly = new Dec(rules.minutesPerCell).times(bill.cellCount);
  const test = new Dec(rules.testMinutes);
  addLabour("labour-setup", `Setup, ${setup.toString()} min`, setup);
  addLabour("labour-assembly", `Assembly, ${rules.minutesPerCell} min × ${bill.cellCount} cells = ${assembly.toString()} min`, assembly);
  addLabour("labour-test", `Test, ${test.toString()} min`, test);

  const sum = (xs: { amount: Decimal }[]): Decimal => xs.reduce((acc, x) => acc.plus(x.amount), new Dec(0));
  const materials = sum(materialLines);
  const labour = sum(labourLines);
  const overheadPct = new Dec(rules.overheadPct);
  const overhead = round(materials.times(pct(rules.overheadPct)));
  const cost = materials.plus(overhead).plus(labour);

  const marginPct = new Dec(rules.marginPct);
  const unitPrice = round(cost.div(new Dec(1).minus(pct(rules.marginPct))));

  const quantity = bill.quantity;
  const discountPct = selectDiscountPct(quantity, rules.quantityBreaks);
  const gross = unitPrice.times(quantity);
  const discount = round(gross.times(pct(discountPct)));
  // extra lines are sell prices already: no overhead, no margin, no quantity discount
  const extras: ExtraLine[] = extraInputs.map((e) => {
    const unit = round(e.unitPrice);
    return { description: e.description, quantity: e.quantity, unit: e.unit, unitPrice: str(unit), amount: str(unit.times(e.quantity)) };
  });
  const extrasTotal = extras.reduce((acc, e) => acc.plus(e.amount), new Dec(0));
  const subtotal = gross.minus(discount).plus(extrasTotal);
  const taxPct = new Dec(rules.taxRatePct);
  const tax = round(subtotal.times(pct(rules.taxRatePct)));
  const total = subtotal.plus(tax);

  const lines: PriceLine[] = [...materialLines.map((x) => x.line), ...labourLines.map((x) => x.line)];
  if (!overhead.isZero()) {
    lines.push({
      code: "overhead",
      kind: "overhead",
      description: `Overhead, ${overheadPct.toString()} % of materials ${str(materials)}`,
      quantity: 1,
      unit: "lot",
      unitPrice: str(overhead),
      amount: str(overhead),
    });
  }

  return {
    currency,
    lines,
    materials: str(materials),
    labour: str(labour),
    overhead: str(overhead),
    cost: str(cost),
    marginPct: marginPct.toString(),
    unitPrice: str(unitPrice),
    quantity,
    discountPct,
    discount: str(discount),
    ...(extras.length > 0 ? { extras } : {}),
    subtotal: str(subtotal),
    taxPct: taxPct.toString(),
    tax: str(tax),
    total: str(total),
  };
}

/** priceBank as a result: expected failures come back as { ok: false, code, message, issues }. */
export function tryPriceBank(bill: BankBill, rules: PricingRules, extras: readonly ExtraLineInput[] = []): PriceBankResult {
  try {
    return { ok: true, data: priceBank(bill, rules, extras) };
  } catch (error) {
    if (error instanceof PricingError) {
      return { ok: false, code: error.code, message: error.message, issues: error.issues };
    }
    throw error;
  }
}

/**
 * A quick price from a single cost: cost × (1 + overhead %) / (1 − margin %), rounded once,
 * half-up, to the currency's minor unit. Unlike priceBank, the overhead here applies to the
 * whole cost. quickPrice("72", "0", "28", "EUR") → "100.00".
 */
export function quickPrice(cost: string, overheadPct: string, marginPct: string, currency: string): string {
  const issues: PricingIssue[] = [];
  const digits = minorUnits(currency);
  const check = (path: string, value: string, max: number | null): Decimal | null => {
    if (!isDecimalString(value)) {
      issues.push({ path, message: "must be a decimal string" });
      return null;
    }
    const d = new Dec(value);
    if (d.isNegative() && !d.isZero()) issues.push({ path, message: "must not be negative" });
    if (max !== null && d.greaterThanOrEqualTo(max)) {
      issues.push({ path, message: `must be below ${max} %` });
    }
    return d;
  };
  const c = check("cost", cost, null);
  const o = check("overheadPct", overheadPct, null);
  const m = check("marginPct", marginPct, 100);
  if (issues.length > 0 || c === null || o === null || m === null) {
    throw new PricingError("invalid-rules", "quickPrice: invalid input", issues);
  }
  const price = c.times(new Dec(1).plus(o.div(100))).div(new Dec(1).minus(m.div(100)));
  return roundMoney(price, currency).toFixed(digits);
}
