/**
 * The quote's engineering sections — one failed cell, tolerance yield, temperature and life,
 * limits and handling — worded from the frozen revision, for the quote page and the PDF alike.
 * Pure: the yield is recomputed from the frozen option (a fixed seed and sample count, the
 * shop's grading and distribution as the option froze them), so the page and the PDF show the
 * same numbers as the storefront did. Revisions frozen before these figures existed say so.
 */
import type { HistogramBin, Requirement } from "@/lib/bank";
import { optionYield } from "@/lib/bank/option-yield";
import type { LabelledValue } from "@/lib/vocabulary";
import { failureLines, handlingRows, hasYieldBasis, lifeHeadline, lifeRows, yieldRows, type DepthOption } from "./option-depth-words";
import type { PricedOption } from "./types";

export interface QuoteEngineering {
  /** the two verdicts in words; null on a revision frozen without them */
  failures: { short: string; open: string } | null;
  tolerance: null | {
    headline: string;
    rows: LabelledValue[];
    histogram: HistogramBin[];
    /** the capacitance a new bank needs for the requirement at end of life (F) */
    required: number | null;
    samples: number;
  };
  life: null | { headline: string; rows: LabelledValue[]; assumptions: string[] };
  /** why there is no life section ("no life data in the catalog", "not recorded") */
  lifeNote: string | null;
  handling: { rows: LabelledValue[]; shipping: string[] };
  /** what a missing section says (NOT_RECORDED, or NOT_COMPUTED_FOR_CUSTOM for a custom bank) */
  absent: string;
}

export const NOT_RECORDED = "not recorded for this revision (made before these figures were computed)";
/** A custom bank from the network editor carries no one-fault, yield or life analysis of its own. */
export const NOT_COMPUTED_FOR_CUSTOM = "not computed for a custom bank built in the network editor; the shop's engineers check it";

/** The sections from a frozen requirement and option. */
export function toQuoteEngineering(requirement: Requirement, option: PricedOption | DepthOption, absent: string = NOT_RECORDED): QuoteEngineering {
  const o = option as PricedOption & DepthOption;
  let tolerance: QuoteEngineering["tolerance"] = null;
  if (hasYieldBasis(o) && o.topology && o.seriesCount && o.parallelCount) {
    try {
      const y = optionYield(o, requirement);
      const { headline, rows } = yieldRows(y, o);
      tolerance = { headline, rows, histogram: y.histogram.capacitance, required: y.requiredCapacitance, samples: y.samples };
    } catch (error) {
      if (!(error instanceof RangeError)) throw error;
    }
  }
  const life = o.life ? { headline: lifeHeadline(o.life), rows: lifeRows(o.life), assumptions: o.life.assumptions } : null;
  return {
    failures: failureLines(o),
    tolerance,
    life,
    lifeNote: life ? null : o.life === null ? lifeHeadline(null) : absent,
    handling: handlingRows(o),
    absent,
  };
}
