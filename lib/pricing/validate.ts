import { isKnownCurrency, minorUnits } from "./currency";
import { Dec, isDecimalString } from "./decimal";
import type { BankBill, ExtraLineInput, PricingIssue, PricingRules } from "./types";

type Issues = PricingIssue[];

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === "object" && value !== null && !Array.isArray(value);
}

/** A money string: plain decimal, ≥ 0, and (when the currency is known) no finer than its minor unit. */
function checkMoney(issues: Issues, path: string, value: unknown, digits: number | null): void {
  if (!isDecimalString(value)) {
    issues.push({ path, message: 'must be a decimal string like "12.50"' });
    return;
  }
  const d = new Dec(value);
  if (d.isNegative() && !d.isZero()) issues.push({ path, message: "must not be negative" });
  if (digits !== null && d.decimalPlaces() > digits) {
    issues.push({ path, message: `must have at most ${digits} decimal places for this currency` });
  }
}

/** A percentage string in [0, max) or [0, max]. */
function checkPct(issues: Issues, path: string, value: unknown, max: number, maxInclusive: boolean): void {
  if (!isDecimalString(value)) {
    issues.push({ path, message: 'must be a decimal string percentage like "12.5"' });
    return;
  }
  const d = new Dec(value);
  if (d.isNegative() && !d.isZero()) issues.push({ path, message: "must not be negative" });
  if (maxInclusive ? d.greaterThan(max) : d.greaterThanOrEqualTo(max)) {
    issues.push({ path, message: `must be ${maxInclusive ? "at most" : "below"} ${max} %` });
  }
}

function checkNumber(issues: Issues, path: string, value: unknown, opts: { min: number; minExclusive?: boolean; integer?: boolean }): void {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    issues.push({ path, message: "must be a finite number" });
    return;
  }
  if (opts.integer && !Number.isInteger(value)) {
    issues.push({ path, message: "must be a whole number" });
  }
  if (opts.minExclusive ? value <= opts.min : value < opts.min) {
    issues.push({
      path,
      message: opts.minExclusive ? `must be greater than ${opts.min}` : `must be at least ${opts.min}`,
    });
  }
}

/**
 * Checks a shop's pricing rules. Returns every issue found (empty list = valid). Money must be
 * decimal strings, non-negative, no finer than the currency's minor unit (so every displayed
 * unit price times its quantity is exactly the line amount).
 */
export function validatePricingRules(rules: PricingRules): PricingIssue[] {
  // rules frozen all the way down (a shop's loaded catalog, db/queries/catalog.ts) cannot change: checked once
  const frozen = isObject(rules) && deeplyFrozen(rules);
  const known = frozen ? checkedRules.get(rules) : undefined;
  if (known) return [...known];
  const issues = checkRules(rules);
  if (frozen) checkedRules.set(rules, issues);
  return [...issues];
}

const checkedRules = new WeakMap<PricingRules, readonly PricingIssue[]>();

function deeplyFrozen(value: unknown): boolean {
  if (typeof value !== "object" || value === null) return true;
  return Object.isFrozen(value) && Object.values(value).every(deeplyFrozen);
}

function checkRules(rules: PricingRules): PricingIssue[] {
  const issues: Issues = [];
  if (!isObject(rules)) return [{ path: "", message: "rules must be an object" }];
  const r = rules as unknown as Record<string, unknown>;

  let digits: number | null = null;
  if (typeof r.currency !== "string" || !isKnownCurrency(r.currency)) {
    issues.push({ path: "currency", message: 'must be an ISO 4217 alphabetic code such as "EUR"' });
  } else {
    digits = minorUnits(r.currency);
  }

  for (const key of ["labourRatePerHour", "interconnectCostPerCell", "terminalSetCost"] as const) {
    checkMoney(issues, key, r[key], digits);
  }
  for (const key of ["balancingBoardCost", "balancingResistorCost", "bleederCostPerWatt"] as const) {
    if (r[key] !== undefined) checkMoney(issues, key, r[key], digits);
  }

  for (const key of ["setupMinutes", "minutesPerCell", "testMinutes"] as const) {
    checkNumber(issues, key, r[key], { min: 0 });
  }

  checkPct(issues, "overheadPct", r.overheadPct, 1000, true);
  // Margin on price: 100 % would divide by zero, above it the price turns negative.
  checkPct(issues, "marginPct", r.marginPct, 100, false);
  checkPct(issues, "taxRatePct", r.taxRatePct, 100, true);

  if (!Array.isArray(r.enclosures)) {
    issues.push({ path: "enclosures", message: "must be a list" });
  } else {
    const names = new Set<string>();
    r.enclosures.forEach((e: unknown, i) => {
      const p = `enclosures[${i}]`;
      if (!isObject(e)) {
        issues.push({ path: p, message: "must be an object" });
        return;
      }
      if (typeof e.name !== "string" || e.name.trim() === "") {
        issues.push({ path: `${p}.name`, message: "must not be empty" });
      } else if (names.has(e.name.trim())) {
        issues.push({ path: `${p}.name`, message: `duplicates another enclosure's name` });
      } else {
        names.add(e.name.trim());
      }
      checkNumber(issues, `${p}.maxVolumeM3`, e.maxVolumeM3, { min: 0, minExclusive: true });
      checkMoney(issues, `${p}.cost`, e.cost, digits);
    });
  }
  checkNumber(issues, "enclosurePackingFactor", r.enclosurePackingFactor, { min: 1 });

  if (!Array.isArray(r.quantityBreaks)) {
    issues.push({ path: "quantityBreaks", message: "must be a list" });
  } else {
    const seen = new Set<number>();
    r.quantityBreaks.forEach((b: unknown, i) => {
      const p = `quantityBreaks[${i}]`;
      if (!isObject(b)) {
        issues.push({ path: p, message: "must be an object" });
        return;
      }
      checkNumber(issues, `${p}.minQuantity`, b.minQuantity, { min: 1, integer: true });
      if (typeof b.minQuantity === "number") {
        if (seen.has(b.minQuantity)) {
          issues.push({ path: `${p}.minQuantity`, message: "duplicates another break" });
        }
        seen.add(b.minQuantity);
      }
      checkPct(issues, `${p}.discountPct`, b.discountPct, 100, false);
    });
  }

  checkNumber(issues, "quoteValidityDays", r.quoteValidityDays, { min: 1, integer: true });
  checkNumber(issues, "depositPercent", r.depositPercent, { min: 0 });
  if (typeof r.depositPercent === "number" && r.depositPercent > 100) issues.push({ path: "depositPercent", message: "must be at most 100 %" });
  return issues;
}

/** Checks a bill of one bank (counts whole and non-negative, costs decimal strings, volume > 0). */
export function validateBankBill(bill: BankBill): PricingIssue[] {
  const issues: Issues = [];
  if (!isObject(bill)) return [{ path: "", message: "bill must be an object" }];
  const b = bill as unknown as Record<string, unknown>;

  if (!isObject(b.cell)) {
    issues.push({ path: "cell", message: "must be an object" });
  } else {
    if (typeof b.cell.sku !== "string" || b.cell.sku.trim() === "") {
      issues.push({ path: "cell.sku", message: "must not be empty" });
    }
    if (typeof b.cell.description !== "string") {
      issues.push({ path: "cell.description", message: "must be a string" });
    }
    checkMoney(issues, "cell.unitCost", b.cell.unitCost, null);
  }
  checkNumber(issues, "cellCount", b.cellCount, { min: 1, integer: true });
  if (b.mixedCells !== undefined) {
    if (!Array.isArray(b.mixedCells) || b.mixedCells.length === 0) {
      issues.push({ path: "mixedCells", message: "must be a non-empty list when given" });
    } else {
      let sum = 0;
      b.mixedCells.forEach((c: unknown, i) => {
        const p = `mixedCells[${i}]`;
        if (!isObject(c)) {
          issues.push({ path: p, message: "must be an object" });
          return;
        }
        if (typeof c.sku !== "string" || c.sku.trim() === "") issues.push({ path: `${p}.sku`, message: "must not be empty" });
        checkMoney(issues, `${p}.unitCost`, c.unitCost, null);
        checkNumber(issues, `${p}.count`, c.count, { min: 1, integer: true });
        if (typeof c.count === "number") sum += c.count;
      });
      if (sum !== b.cellCount) issues.push({ path: "mixedCells", message: `the counts add up to ${sum}, not the bank's ${String(b.cellCount)} cells` });
    }
  }
  checkNumber(issues, "quantity", b.quantity, { min: 1, integer: true });
  checkNumber(issues, "volumeM3", b.volumeM3, { min: 0, minExclusive: true });

  if (b.balancingResistors !== null) {
    const r = b.balancingResistors;
    if (!isObject(r)) {
      issues.push({ path: "balancingResistors", message: "must be an object or null" });
    } else {
      checkNumber(issues, "balancingResistors.count", r.count, { min: 0, integer: true });
      checkNumber(issues, "balancingResistors.resistance", r.resistance, { min: 0, minExclusive: true });
      checkNumber(issues, "balancingResistors.powerRating", r.powerRating, { min: 0, minExclusive: true });
      checkMoney(issues, "balancingResistors.unitCost", r.unitCost, null);
    }
  }
  if (b.bleeder !== null) {
    const r = b.bleeder;
    if (!isObject(r)) {
      issues.push({ path: "bleeder", message: "must be an object or null" });
    } else {
      checkNumber(issues, "bleeder.resistance", r.resistance, { min: 0, minExclusive: true });
      checkNumber(issues, "bleeder.power", r.power, { min: 0, minExclusive: true });
      checkMoney(issues, "bleeder.unitCost", r.unitCost, null);
    }
  }
  if (b.activeBoards !== null) {
    const a = b.activeBoards;
    if (!isObject(a)) {
      issues.push({ path: "activeBoards", message: "must be an object or null" });
    } else {
      if (typeof a.sku !== "string" || a.sku.trim() === "") {
        issues.push({ path: "activeBoards.sku", message: "must not be empty" });
      }
      checkNumber(issues, "activeBoards.count", a.count, { min: 0, integer: true });
      if (a.unitCost !== "") checkMoney(issues, "activeBoards.unitCost", a.unitCost, null);
    }
  }
  return issues;
}

/** Most extra lines one quote carries. */
export const MAX_EXTRA_LINES = 50;

/** Checks extra lines: a description, a positive quantity, a unit and a non-negative money unit price in the currency. */
export function validateExtraLines(extras: readonly ExtraLineInput[], currency: string): PricingIssue[] {
  const issues: Issues = [];
  if (!Array.isArray(extras)) return [{ path: "extras", message: "must be a list" }];
  if (extras.length > MAX_EXTRA_LINES) issues.push({ path: "extras", message: `must hold at most ${MAX_EXTRA_LINES} lines` });
  const digits = isKnownCurrency(currency) ? minorUnits(currency) : null;
  extras.slice(0, MAX_EXTRA_LINES).forEach((e, i) => {
    const p = `extras[${i}]`;
    if (!isObject(e)) {
      issues.push({ path: p, message: "must be an object" });
      return;
    }
    if (typeof e.description !== "string" || e.description.trim() === "") issues.push({ path: `${p}.description`, message: "must not be empty" });
    if (typeof e.unit !== "string" || e.unit.trim() === "") issues.push({ path: `${p}.unit`, message: "must not be empty" });
    checkNumber(issues, `${p}.quantity`, e.quantity, { min: 0, minExclusive: true });
    checkMoney(issues, `${p}.unitPrice`, e.unitPrice, digits);
  });
  return issues;
}
