import { MAX_ATTACHMENTS_PER_REQUEST } from "@/lib/validation/limits";
import { EMPTY_REQUEST_FORM, type RequestFormValues } from "@/lib/validation/request-form";

/** What the storefront keeps in sessionStorage so a request survives sign-in and sign-up. */
interface SavedRequest {
  values: RequestFormValues;
  attachments: UploadedFile[];
  /** the option in focus (see optionId) */
  focus: string | null;
}

export interface UploadedFile {
  id: string;
  fileName: string;
  sizeBytes: number;
}

const keyOf = (slug: string) => `faradsmith:request:${slug}`;

export function loadSavedRequest(slug: string): SavedRequest | null {
  try {
    const raw = window.sessionStorage.getItem(keyOf(slug));
    if (!raw) return null;
    const parsed = JSON.parse(raw) as Partial<SavedRequest>;
    if (!parsed || typeof parsed !== "object" || typeof parsed.values !== "object" || parsed.values === null) return null;
    // keep only known fields, each a string (anything else falls back to the empty form)
    const values = { ...EMPTY_REQUEST_FORM };
    for (const k of Object.keys(EMPTY_REQUEST_FORM) as (keyof RequestFormValues)[]) {
      const v = (parsed.values as Record<string, unknown>)[k];
      if (typeof v === "string") (values as Record<string, string>)[k] = v;
    }
    const attachments = Array.isArray(parsed.attachments)
      ? parsed.attachments
          .filter((a): a is UploadedFile => typeof a?.id === "string" && typeof a.fileName === "string" && typeof a.sizeBytes === "number")
          .slice(0, MAX_ATTACHMENTS_PER_REQUEST)
      : [];
    return { values, attachments, focus: typeof parsed.focus === "string" ? parsed.focus : null };
  } catch {
    return null;
  }
}

export function saveRequest(slug: string, saved: SavedRequest): void {
  try {
    window.sessionStorage.setItem(keyOf(slug), JSON.stringify(saved));
  } catch {
    // storage full or disabled: the form still works, it just will not survive a sign-in
  }
}

export function clearSavedRequest(slug: string): void {
  try {
    window.sessionStorage.removeItem(keyOf(slug));
  } catch {
    // nothing to clear
  }
}
