import type { DefinedRoute } from "@/lib/api/contract";
import type { z } from "zod";
import { createCell, exportCellsCsv, getCell, getDatasheet, importCellsCsv, listCells, removeDatasheet, updateCell, uploadDatasheet } from "./catalog";
import { openApiDescription } from "./description";
import { analyzeFailures, evaluateNetwork, toleranceYield } from "./networks";
import { checkoutState, listOrders, orderCertificate, orderTraveler, startCheckout } from "./orders";
import { getPricingRules, putPricingRules } from "./pricing";
import { createQuote, getQuote, getQuoteRevision } from "./quotes";
import { downloadAttachment, listMembers, listQuotes, quotePdf, searchArrangements, uploadAttachment } from "./shops";

/**
 * Every route under app/api/v1, once. A new route adds its contract to its area's file in this
 * folder and one entry here; tests/unit/api/contracts.test.ts fails for a route without one.
 */
export const CONTRACTS: readonly DefinedRoute<z.ZodType>[] = [
  evaluateNetwork,
  analyzeFailures,
  toleranceYield,
  searchArrangements,
  listQuotes,
  createQuote,
  getQuote,
  getQuoteRevision,
  quotePdf,
  uploadAttachment,
  downloadAttachment,
  listMembers,
  listCells,
  createCell,
  getCell,
  updateCell,
  getDatasheet,
  uploadDatasheet,
  removeDatasheet,
  exportCellsCsv,
  importCellsCsv,
  getPricingRules,
  putPricingRules,
  startCheckout,
  checkoutState,
  listOrders,
  orderTraveler,
  orderCertificate,
  openApiDescription,
];
