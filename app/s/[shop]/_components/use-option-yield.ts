"use client";
import { useEffect, useState } from "react";
import type { Requirement } from "@/lib/bank";
import { optionYield, type OptionYield, type YieldOption } from "@/lib/bank/option-yield";
import { optionId } from "@/lib/validation/quote";

/** Yields computed in this page, by option and requirement: focusing or comparing again costs nothing. */
const computed = new Map<string, OptionYield>();

function keyOf(option: YieldOption & { cell: { sku: string } }, requirement: Requirement): string {
  return `${optionId(option)}|${JSON.stringify(option.yieldBasis)}|${JSON.stringify(requirement)}`;
}

/**
 * The options' tolerance yields, computed in the browser (the engine is pure and the sample count
 * keeps each to tens of milliseconds) just after the first paint; null until then. Seeded: the
 * quote page and PDF show the same numbers.
 */
export function useOptionYields(options: readonly YieldOption[], requirement: Requirement): (OptionYield | null)[] {
  const keys = options.map((o) => keyOf(o, requirement));
  const joined = keys.join("\n");
  const [, setDone] = useState(0);
  useEffect(() => {
    if (options.every((_, i) => computed.has(keys[i] as string))) return;
    const timer = setTimeout(() => {
      options.forEach((o, i) => {
        const key = keys[i] as string;
        if (!computed.has(key)) computed.set(key, optionYield(o, requirement));
      });
      setDone((n) => n + 1);
    }, 0);
    return () => clearTimeout(timer);
    // `joined` names everything the yields depend on
  }, [joined]);
  return keys.map((k) => computed.get(k) ?? null);
}

export function useOptionYield(option: YieldOption, requirement: Requirement): OptionYield | null {
  return useOptionYields([option], requirement)[0] ?? null;
}
