/**
 * A quick look at a server-action request before Next.js decodes it. Next.js answers a body it
 * cannot decode (not JSON, an empty body, a broken multipart form, arguments nested deeper than
 * its decoder's stack) with a 500 and a stack trace in the log, before any of our actions can
 * validate anything. What no client of ours would ever send is refused here with a reason (400).
 * Our actions take plain objects a few levels deep; 32 levels leaves room to spare.
 */
export const MAX_ACTION_NESTING = 32;

/** The deepest nesting of arrays and objects in a JSON text (strings skipped), in one pass. */
export function jsonNesting(text: string): number {
  let depth = 0;
  let deepest = 0;
  let inString = false;
  for (let i = 0; i < text.length; i += 1) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 0x5c)
        i += 1; // backslash: skip the escaped character
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x5b || c === 0x7b) deepest = Math.max(deepest, ++depth);
    else if (c === 0x5d || c === 0x7d) depth -= 1;
  }
  return deepest;
}

function jsonArgumentsProblem(text: string): string | null {
  if (text.trim() === "") return "The action's arguments are missing.";
  if (jsonNesting(text) > MAX_ACTION_NESTING) return `The action's arguments are nested more than ${MAX_ACTION_NESTING} deep.`;
  try {
    JSON.parse(text);
  } catch {
    return "The action's arguments are not readable.";
  }
  return null;
}

/** Why a server-action request cannot be one of ours, or null when it may go on to Next.js. */
export async function serverActionBodyProblem(request: Request): Promise<string | null> {
  const type = (request.headers.get("content-type") ?? "").toLowerCase();
  if (type.startsWith("multipart/form-data")) {
    let form: FormData;
    try {
      form = await request.formData();
    } catch {
      return "The action's form data is not readable.";
    }
    const root = form.get("0");
    return typeof root === "string" ? jsonArgumentsProblem(root) : "The action's arguments are missing.";
  }
  if (type.startsWith("application/x-www-form-urlencoded")) return null; // a form posted without JavaScript
  return jsonArgumentsProblem(await request.text());
}
