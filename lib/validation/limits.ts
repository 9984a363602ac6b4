/**
 * Limits on what people and clients may send, each defined once and used by the zod schemas, the
 * forms' hints and the server alike. The engine's physical bounds (voltages, capacitances, energies)
 * live in lib/bank/bounds.ts with their reasons; the most cells in one bank is the engine's
 * own `MAX_CELLS_PER_BANK`, which the network evaluation shares.
 */

export const PASSWORD_MIN_LENGTH = 10;
export const PASSWORD_MAX_LENGTH = 128;

/** Most identical banks one request may ask for (the engine's bound, with its reason in lib/bank/bounds.ts). */
export { MAX_QUANTITY } from "../bank/bounds";
/** Longest note a customer may add to a request. */
export const MAX_NOTES_LENGTH = 4000;

/** Most drawings and specifications attached to one request. */
export const MAX_ATTACHMENTS_PER_REQUEST = 10;
/** Largest attachment accepted: 10 MB (binary megabytes). */
export const MAX_ATTACHMENT_BYTES = 10 * 1024 * 1024;
/**
 * Most files one person may have uploaded in a shop and not yet attached to a request: two
 * requests' worth. Files never attached are deleted after a day (lib/attachments/sweep.ts).
 */
export const MAX_PENDING_ATTACHMENTS_PER_USER = 2 * MAX_ATTACHMENTS_PER_REQUEST;
/** The attachment limit as people read it: "10 MB". */
export const MAX_ATTACHMENT_SIZE_TEXT = `${MAX_ATTACHMENT_BYTES / (1024 * 1024)} MB`;

/** Longest search text a list takes from its URL. */
export const MAX_LIST_SEARCH_LENGTH = 100;

/** Most cells in a bank built in the network editor (a hand-built tree; larger banks come from the engine's options). */
export const MAX_CUSTOM_BANK_CELLS = 1000;
/** Deepest custom bank tree (groups within groups; the root is level 1). */
export const MAX_CUSTOM_BANK_DEPTH = 8;
/** Most extra lines an estimator may add to one quote. */
export const MAX_EXTRA_LINES = 20;
/** Longest text of a quote line, an override reason or a discount reason. */
export const MAX_LINE_TEXT_LENGTH = 200;
/** Longest message in a quote's thread, a decline reason or a note with a revision. */
export const MAX_MESSAGE_LENGTH = 4000;
/** Most days a quote revision may stay open. */
export const MAX_VALIDITY_DAYS = 365;
