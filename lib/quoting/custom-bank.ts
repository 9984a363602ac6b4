/**
 * A custom bank from the estimator's network editor: a tree of series and parallel groups of
 * catalog cells, mixed parts allowed, evaluated by the engine (DESIGN §3.1) at the requirement's
 * maximum voltage: each cell's voltage (nominal, and worst case within the shop's matching
 * tolerance), the weakest cell, equivalent capacitance and ESR, stored energy, mass and volume; the
 * safe discharge it needs (§3.4); its bill of materials for the shop's pricing rules; and the
 * option summary a quote revision freezes. Pure (no database, no framework): the editor runs the
 * same functions in the browser as the server runs when the revision is issued.
 */
import {
  constantPowerSeconds,
  evaluateNetwork,
  sizeBleeder,
  storedEnergy,
  usableEnergy,
  type DesignFactors,
  type EngineCell,
  type NetworkNode,
  type Requirement,
} from "@/lib/bank";
import { evaluateFlat, flattenNetwork } from "@/lib/bank/flat-network";
import { formatQuantity } from "@/lib/quantities";
import { MAX_CUSTOM_BANK_CELLS, MAX_CUSTOM_BANK_DEPTH } from "@/lib/validation/limits";
import { billFor, toEngineCell, type BillResult } from "./bill";
import type { CatalogCell, CatalogComponent, CustomBankFigures, CustomCellState, CustomNode, PricedOption } from "./types";

/** Why a tree cannot be evaluated: its place in the tree ("" for the root) and what is wrong. */
export interface CustomTreeIssue {
  at: string;
  message: string;
}

export type CustomBankResult =
  { ok: true; figures: CustomBankFigures; network: NetworkNode; warnings: string[]; problems: string[] } | { ok: false; issues: CustomTreeIssue[] };

/** A node's place as the editor and the quote name it: "" for the root, "2.1" for the root's second child's first. */
const childPlace = (parent: string, index: number) => (parent === "" ? String(index + 1) : `${parent}.${index + 1}`);

/**
 * Walks the tree without recursion: every group has a child, every cell is a part of the catalog,
 * and the tree stays within the editor's bounds. Answers the issues found (empty when fine).
 */
export function checkCustomTree(tree: CustomNode, skus: ReadonlySet<string>): CustomTreeIssue[] {
  const issues: CustomTreeIssue[] = [];
  const stack: { node: CustomNode; at: string; depth: number }[] = [{ node: tree, at: "", depth: 1 }];
  let cells = 0;
  while (stack.length > 0) {
    const { node, at, depth } = stack.pop() as { node: CustomNode; at: string; depth: number };
    if (depth > MAX_CUSTOM_BANK_DEPTH) {
      issues.push({ at, message: `Groups may nest at most ${MAX_CUSTOM_BANK_DEPTH} levels deep.` });
      continue;
    }
    if (node.kind === "cell") {
      cells++;
      if (!skus.has(node.sku)) issues.push({ at, message: node.sku ? `${node.sku} is not in the catalog.` : "Choose a cell." });
      continue;
    }
    if (node.children.length === 0) issues.push({ at, message: `This ${node.kind} group is empty: add a cell or remove it.` });
    if (cells + stack.length > MAX_CUSTOM_BANK_CELLS * 2) break;
    node.children.forEach((child, i) => stack.push({ node: child, at: childPlace(at, i), depth: depth + 1 }));
  }
  if (cells > MAX_CUSTOM_BANK_CELLS) issues.push({ at: "", message: `A custom bank may hold at most ${MAX_CUSTOM_BANK_CELLS.toLocaleString("en-GB")} cells.` });
  return issues;
}

/** The cells of a tree in document order with their places. */
function cellsOf(tree: CustomNode): { at: string; sku: string }[] {
  const out: { at: string; sku: string }[] = [];
  const stack: { node: CustomNode; at: string }[] = [{ node: tree, at: "" }];
  while (stack.length > 0) {
    const { node, at } = stack.pop() as { node: CustomNode; at: string };
    if (node.kind === "cell") out.push({ at: at || "1", sku: node.sku });
    else for (let i = node.children.length - 1; i >= 0; i--) stack.push({ node: node.children[i] as CustomNode, at: childPlace(at, i) });
  }
  return out;
}

/** The engine's network for a tree: each cell carries its part's figures and its place as id. */
function toNetwork(tree: CustomNode, bySku: ReadonlyMap<string, EngineCell>): NetworkNode {
  const build = (node: CustomNode, at: string): NetworkNode => {
    if (node.kind === "cell") {
      const c = bySku.get(node.sku) as EngineCell;
      return {
        kind: "cell",
        id: at || "1",
        capacitance: c.capacitance,
        ratedVoltage: c.ratedVoltage,
        esr: c.esr,
        leakage: c.leakageCurrent,
        surgeVoltage: Math.max(c.surgeVoltage, c.ratedVoltage),
      };
    }
    return { kind: node.kind, children: node.children.map((child, i) => build(child, childPlace(at, i))) };
  };
  // depth is bounded by checkCustomTree (MAX_CUSTOM_BANK_DEPTH), so the recursion is shallow
  return build(tree, "");
}

/**
 * Evaluates a custom bank at the requirement's maximum voltage. Each cell's worst case puts that
 * cell at the low end of the shop's matching tolerance (C_n·(1 − m)) and every other at the high
 * end (C_n·(1 + m)), as the engine's own worst case for a string does (DESIGN §3.2). Problems stop
 * a revision from being issued (a cell past its surge voltage); warnings are for the estimator.
 */
export function evaluateCustomBank(tree: CustomNode, catalog: readonly CatalogCell[], requirement: Requirement, factors: DesignFactors): CustomBankResult {
  const bySku = new Map(catalog.map((c) => [c.sku, toEngineCell(c)]));
  const issues = checkCustomTree(tree, new Set(bySku.keys()));
  if (issues.length > 0) return { ok: false, issues };
  const network = toNetwork(tree, bySku);
  const v = requirement.maxVoltage;
  const evaluation = evaluateNetwork(network, v);
  const placed = cellsOf(tree);

  // Worst case of each cell: scaling every capacitance by (1 + m) leaves the voltage shares as they
  // are, so "this cell at C(1 − m), every other at C(1 + m)" is "this cell times (1 − m)/(1 + m), the
  // rest nominal". Changing one cell changes only its ancestors: walk up its path (at most the
  // tree's depth) updating each group's sum, and multiply the series shares on the way.
  const flat = flattenNetwork(network);
  const n = flat.cells.length;
  const m = factors.matchingTolerance;
  const ratio = (1 - m) / (1 + m);
  const caps = Float64Array.from(flat.cells, (c) => c.capacitance);
  const cap = new Float64Array(flat.size);
  const acc = new Float64Array(flat.size);
  evaluateFlat(flat, caps, cap, acc, new Float64Array(flat.size));
  const worstShare = (x: number): number => {
    let child = flat.cellNode[x] as number;
    let childCap = (cap[child] as number) * ratio;
    let share = 1;
    for (let p = flat.parent[child] as number; p >= 0; child = p, p = flat.parent[p] as number) {
      const series = flat.parentSeries[child] === 1;
      const sum = series ? (acc[p] as number) - 1 / (cap[child] as number) + 1 / childCap : (acc[p] as number) - (cap[child] as number) + childCap;
      const parentCap = series ? 1 / sum : sum;
      if (series) share *= parentCap / childCap;
      childCap = parentCap;
    }
    return share;
  };
  const cells: CustomCellState[] = placed.map((p, x) => {
    const part = bySku.get(p.sku) as EngineCell;
    return {
      id: p.at,
      sku: p.sku,
      voltage: evaluation.cells[x]?.voltage ?? 0,
      worstVoltage: worstShare(x) * v,
      ratedVoltage: part.ratedVoltage,
      surgeVoltage: Math.max(part.surgeVoltage, part.ratedVoltage),
    };
  });
  let weakest = cells[0] as CustomCellState;
  for (const c of cells) if (c.worstVoltage / c.ratedVoltage > weakest.worstVoltage / weakest.ratedVoltage) weakest = c;

  let mass = 0;
  let volume = 0;
  for (const p of placed) {
    const part = bySku.get(p.sku) as EngineCell;
    mass += part.mass;
    volume += part.volume;
  }
  const figures: CustomBankFigures = {
    appliedVoltage: v,
    capacitance: evaluation.capacitance,
    esr: evaluation.esr ?? 0,
    maxVoltage: evaluation.maxVoltage,
    energy: evaluation.energy,
    cellCount: n,
    mass,
    volume,
    cells,
    weakest,
  };

  const q = formatQuantity;
  const pastSurge = cells.filter((c) => c.worstVoltage > c.surgeVoltage * (1 + 1e-12));
  const pastRated = cells.filter((c) => c.worstVoltage > c.ratedVoltage * (1 + 1e-12));
  const problems: string[] = [];
  if (pastSurge.length > 0) {
    problems.push(
      `${pastSurge.length} cell${pastSurge.length === 1 ? "" : "s"} would pass the surge voltage while charging to ${q(v, "V")} (cell ${weakest.id}, ${weakest.sku}: up to ${q(weakest.worstVoltage, "V")} against ${q(weakest.surgeVoltage, "V")}).`,
    );
  }
  const warnings: string[] = [];
  if (pastSurge.length === 0 && pastRated.length > 0) {
    warnings.push(
      `${pastRated.length} cell${pastRated.length === 1 ? "" : "s"} may pass the rated voltage while charging (cell ${weakest.id}: up to ${q(weakest.worstVoltage, "V")} against ${q(weakest.ratedVoltage, "V")}): fit balancing that clamps each cell, and price it as a line.`,
    );
  }
  if (evaluation.maxVoltage < v) warnings.push(`With nominal cells the bank is rated ${q(evaluation.maxVoltage, "V")}, below the ${q(v, "V")} asked for.`);
  const capacitanceAsked = requirement.capacitance;
  if (capacitanceAsked !== undefined && evaluation.capacitance < capacitanceAsked) {
    warnings.push(`Capacitance ${q(evaluation.capacitance, "F")} is below the ${q(capacitanceAsked, "F")} asked for.`);
  }
  if (requirement.energy !== undefined) {
    const usable = usableEnergy(evaluation.capacitance, v, requirement.minVoltage ?? 0);
    if (usable < requirement.energy) warnings.push(`Usable energy ${q(usable, "J")} (new cells) is below the ${q(requirement.energy, "J")} asked for.`);
  }
  if (requirement.maxMass !== undefined && mass > requirement.maxMass)
    warnings.push(`Mass ${q(mass, "kg")} is above the ${q(requirement.maxMass, "kg")} limit.`);
  if (requirement.maxVolume !== undefined && volume > requirement.maxVolume)
    warnings.push(`Cell volume ${q(volume, "m³")} is above the ${q(requirement.maxVolume, "m³")} limit.`);
  return { ok: true, figures, network, warnings, problems };
}

/** The part numbers of a tree with how many of each, in the order they first appear. */
export function partsOf(tree: CustomNode): { sku: string; count: number }[] {
  const counts = new Map<string, number>();
  for (const c of cellsOf(tree)) counts.set(c.sku, (counts.get(c.sku) ?? 0) + 1);
  return [...counts].map(([sku, count]) => ({ sku, count }));
}

/** The series positions along the longest path (a cell is 1, a series group adds, a parallel group takes its longest child). */
function seriesLength(tree: CustomNode): number {
  if (tree.kind === "cell") return 1;
  const lengths = tree.children.map(seriesLength);
  return tree.kind === "series" ? lengths.reduce((a, b) => a + b, 0) : Math.max(...lengths);
}

/**
 * The option summary a revision freezes for a custom bank, in the engine's option shape so the
 * quote page, PDF and lists read it as they read any option. For a mixed bank `cell` is the weakest
 * cell's part, `seriesCount` the series positions along the longest path and `parallelCount` the
 * cells per position on average (rounded up); `topology` follows the root group. The bank's real
 * shape is the tree recorded in the revision's design (RevisionDesign "custom"). Balancing is not
 * sized for an arbitrary tree: the estimator prices it as a line; the discharge is sized for the
 * bank as a whole with no balancing chain (DESIGN §3.4).
 */
export function customBankOption(
  tree: CustomNode,
  figures: CustomBankFigures,
  catalog: readonly CatalogCell[],
  requirement: Requirement,
  factors: DesignFactors,
  extra: { warnings: string[] },
): Omit<PricedOption, "price" | "pareto"> {
  const bySku = new Map(catalog.map((c) => [c.sku, toEngineCell(c)]));
  const weak = bySku.get(figures.weakest.sku) as EngineCell;
  const quantity = requirement.quantity ?? 1;
  const vMax = requirement.maxVoltage;
  const vMin = requirement.minVoltage ?? 0;
  // design capacitance: each cell at its lower tolerance and end-of-life fade, evaluated as a tree
  const designTree = evaluateNetwork(
    scaleTree(tree, bySku, (c) => c.capacitance * (1 - c.toleranceMinus) * (1 - factors.capacitanceFade)),
    vMax,
  );
  const upperTree = evaluateNetwork(
    scaleTree(tree, bySku, (c) => c.capacitance * (1 + c.tolerancePlus)),
    vMax,
  );
  const cDesign = designTree.capacitance;
  const esrEol = figures.esr * (1 + factors.esrGrowth);
  const discharge = sizeBleeder({
    capacitance: upperTree.capacitance,
    maxVoltage: vMax,
    chainResistance: Infinity,
    safeVoltage: factors.safeVoltage,
    safeTime: factors.safeTime,
    resistorSeries: factors.resistorSeries,
  });
  const ns = seriesLength(tree);
  const lead = partsOf(tree).reduce((days, p) => {
    const c = bySku.get(p.sku) as EngineCell;
    return Math.max(days, c.stock >= p.count * quantity ? 0 : c.leadTimeDays);
  }, 0);
  const stored = storedEnergy(figures.capacitance, vMax);
  const q = formatQuantity;
  const warnings = [...extra.warnings];
  if (discharge.bleeder?.switched)
    warnings.push(`A continuous bleeder would dissipate ${q(discharge.bleeder.power, "W")}: a switched discharge circuit is needed instead.`);
  const cautions: string[] = [];
  if (vMax > factors.safeVoltage)
    cautions.push(`Shock hazard: the bank works at up to ${q(vMax, "V")}, above the ${q(factors.safeVoltage, "V")} safe voltage.`);
  if (stored > 10) cautions.push(`Burn and arc hazard: the bank stores about ${q(stored, "J")} at ${q(vMax, "V")}.`);
  cautions.push(
    "A charged bank keeps its energy after the supply is removed: discharge it and short its terminals before handling.",
    "Ship discharged, with a shorting link fitted across the terminals.",
    "These figures are an engineering estimate; local electrical codes and licensed practice decide.",
  );
  // A custom bank carries no one-fault, life, handling or yield analysis of the engine's regular
  // arrangements: those fields are left out, and the quote's engineering sections read them as not
  // recorded (lib/quoting/quote-engineering.ts handles options frozen without them).
  const option = {
    cell: {
      sku: weak.sku,
      technology: weak.technology,
      minVoltage: weak.minVoltage ?? null,
      capacitance: weak.capacitance,
      toleranceMinus: weak.toleranceMinus,
      tolerancePlus: weak.tolerancePlus,
      ratedVoltage: weak.ratedVoltage,
      surgeVoltage: weak.surgeVoltage,
      esr: weak.esr,
      leakageCurrent: weak.leakageCurrent,
      peakCurrent: weak.peakCurrent,
      mass: weak.mass,
      volume: weak.volume,
    },
    topology: tree.kind === "parallel" ? "parallel-of-series-strings" : "series-of-parallel-groups",
    seriesCount: ns,
    parallelCount: Math.max(1, Math.ceil(figures.cellCount / ns)),
    cellCount: figures.cellCount,
    longerLife: false,
    capacitance: { nominal: figures.capacitance, design: cDesign },
    maxVoltage: figures.maxVoltage,
    storedEnergy: stored,
    usableEnergy: usableEnergy(cDesign, vMax, vMin),
    esr: { new: figures.esr, endOfLife: esrEol },
    peakDrop: requirement.peakCurrent ? requirement.peakCurrent.current * esrEol : null,
    mass: figures.mass,
    volume: figures.volume,
    worstCellVoltage: figures.weakest.worstVoltage,
    balancing: { resistance: null, power: 0, powerRating: null, count: 0, standbyLoss: 0, timeConstant: Infinity, activeBoard: null },
    discharge: {
      secondsToSafe: discharge.secondsToSafe,
      capacitance: upperTree.capacitance,
      chainResistance: null,
      resistance: discharge.bleeder?.resistance ?? null,
      bleeder: discharge.bleeder,
    },
    leadTimeDays: lead,
    warnings,
    cautions,
  } as Omit<PricedOption, "price" | "pareto">;
  if (requirement.backup && requirement.backup.power > 0) option.backupSeconds = constantPowerSeconds(cDesign, esrEol, vMax, requirement.backup.power, vMin);
  return option;
}

/** The same tree with each cell's capacitance from `capacitanceOf`. */
function scaleTree(tree: CustomNode, bySku: ReadonlyMap<string, EngineCell>, capacitanceOf: (c: EngineCell) => number): NetworkNode {
  const build = (node: CustomNode, at: string): NetworkNode => {
    if (node.kind === "cell") {
      const c = bySku.get(node.sku) as EngineCell;
      return { kind: "cell", id: at || "1", capacitance: capacitanceOf(c), ratedVoltage: c.ratedVoltage };
    }
    return { kind: node.kind, children: node.children.map((child, i) => build(child, childPlace(at, i))) };
  };
  return build(tree, "");
}

/**
 * The bill of materials of a custom bank for the shop's pricing rules: one cell line per part, no
 * balancing resistors, the bleeder (a catalog resistor of its power class) when a continuous one
 * will do — billFor's bill with the mixed cells in place of one cell.
 */
export function customBankBill(
  tree: CustomNode,
  option: Pick<PricedOption, "discharge" | "volume" | "cellCount" | "balancing">,
  catalog: readonly CatalogCell[],
  components: readonly CatalogComponent[],
  quantity: number,
): BillResult {
  const bySku = new Map(catalog.map((c) => [c.sku, c]));
  const cells = partsOf(tree).map((p) => ({ cell: bySku.get(p.sku) as CatalogCell, count: p.count }));
  const first = (cells[0] as (typeof cells)[number]).cell;
  const noBalancing = { ...option.balancing, resistance: null, count: 0, activeBoard: null };
  const made = billFor({ ...option, balancing: noBalancing }, first, components, quantity);
  if (!made.ok) return made;
  const mixedCells = cells.map(({ cell, count }) => ({ sku: cell.sku, description: `${cell.manufacturer} ${cell.series}`, unitCost: cell.unitCost, count }));
  return { ok: true, bill: { ...made.bill, mixedCells } };
}
