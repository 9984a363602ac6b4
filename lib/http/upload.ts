import { jsonError } from "./json-error";
import { readBodyLimited } from "./read-json";

/** Room for the multipart boundaries and part headers around one file. */
const MULTIPART_OVERHEAD = 64 * 1024;

/**
 * Reads one file from a multipart/form-data body (field `file`) of at most `maxBytes`, cutting the
 * stream off beyond it; answers the file's bytes and name, or the 400 to send back.
 */
export async function readUploadedFile(
  request: Request,
  maxBytes: number,
  sizeText: string,
): Promise<{ ok: true; bytes: Uint8Array; name: string } | { ok: false; response: Response }> {
  const tooLarge = () => ({
    ok: false as const,
    response: jsonError(400, `A file may be at most ${sizeText}.`, [{ path: "file", message: `The file is larger than ${sizeText}.` }]),
  });
  const contentType = request.headers.get("content-type") ?? "";
  if (!contentType.toLowerCase().startsWith("multipart/form-data"))
    return {
      ok: false,
      response: jsonError(400, "Send the file as multipart/form-data in a field named file.", [{ path: "file", message: "Expected multipart/form-data" }]),
    };
  const body = await readBodyLimited(request, maxBytes + MULTIPART_OVERHEAD);
  if (body === null) return tooLarge();
  let form: FormData;
  try {
    form = await new Response(body, { headers: { "content-type": contentType } }).formData();
  } catch {
    return { ok: false, response: jsonError(400, "The upload could not be read.", [{ path: "file", message: "Malformed multipart body" }]) };
  }
  const file = form.get("file");
  if (!(file instanceof File)) return { ok: false, response: jsonError(400, "Choose a file to upload.", [{ path: "file", message: "No file" }]) };
  if (file.size > maxBytes) return tooLarge();
  return { ok: true, bytes: new Uint8Array(await file.arrayBuffer()), name: file.name };
}
