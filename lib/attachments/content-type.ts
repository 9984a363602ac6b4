/** Attachments: what an uploaded file is, judged by its content, and the names it is stored and sent under. */
import { fileTypeFromBuffer } from "file-type";

export const ALLOWED_ATTACHMENT_TYPES = ["application/pdf", "image/png", "image/jpeg", "image/vnd.dxf"] as const;
export type AttachmentContentType = (typeof ALLOWED_ATTACHMENT_TYPES)[number];

export type AttachmentTypeResult = { ok: true; contentType: AttachmentContentType; extension: string } | { ok: false; reason: string };

/**
 * ASCII DXF: the file is a list of group-code / value line pairs and starts with group 0 and the
 * value SECTION (optionally after blank lines and padding of the group code). The DXF reference's
 * file structure (from memory). Binary DXF is not accepted.
 */
export function looksLikeAsciiDxf(bytes: Uint8Array): boolean {
  const head = Buffer.from(bytes.subarray(0, 256)).toString("latin1");
  if (!/^\s*0\r?\nSECTION\r?\n/.test(head)) return false;
  // a text format: no NUL bytes in what we looked at
  return !head.includes("\u0000");
}

/** An executable in disguise: Windows PE ("MZ"), ELF (0x7F "ELF"), Mach-O, or a "#!" script. */
export function looksExecutable(bytes: Uint8Array): boolean {
  const b = (i: number) => bytes[i] ?? -1;
  if (b(0) === 0x4d && b(1) === 0x5a) return true; // MZ — PE/COFF (Microsoft PE format specification)
  if (b(0) === 0x7f && b(1) === 0x45 && b(2) === 0x4c && b(3) === 0x46) return true; // ELF (System V ABI, e_ident)
  const magic = ((b(0) << 24) | (b(1) << 16) | (b(2) << 8) | b(3)) >>> 0;
  if ([0xfeedface, 0xfeedfacf, 0xcefaedfe, 0xcffaedfe, 0xcafebabe].includes(magic)) return true; // Mach-O and universal (from memory)
  return b(0) === 0x23 && b(1) === 0x21; // "#!"
}

/**
 * What a file is, judged by its content and never by its name: PDF, PNG and JPEG by their
 * signatures (file-type), ASCII DXF by its first group. Anything else is refused with a reason.
 */
export async function detectAttachmentType(bytes: Uint8Array): Promise<AttachmentTypeResult> {
  if (bytes.byteLength === 0) return { ok: false, reason: "The file is empty." };
  if (looksExecutable(bytes)) return { ok: false, reason: "Programs and scripts cannot be attached." };
  const found = await fileTypeFromBuffer(bytes);
  if (found) {
    if (found.mime === "application/pdf") return { ok: true, contentType: "application/pdf", extension: "pdf" };
    if (found.mime === "image/png") return { ok: true, contentType: "image/png", extension: "png" };
    if (found.mime === "image/jpeg") return { ok: true, contentType: "image/jpeg", extension: "jpg" };
    return { ok: false, reason: `This file is ${found.ext.toUpperCase()}; attach a PDF, PNG, JPEG or DXF file.` };
  }
  if (looksLikeAsciiDxf(bytes)) return { ok: true, contentType: "image/vnd.dxf", extension: "dxf" };
  return { ok: false, reason: "Attach a PDF, PNG, JPEG or DXF file; this file is none of these." };
}

/** The file-name extensions each accepted type may carry; the first is the one we give it. */
const EXTENSIONS: Record<AttachmentContentType, readonly string[]> = {
  "application/pdf": ["pdf"],
  "image/png": ["png"],
  "image/jpeg": ["jpg", "jpeg"],
  "image/vnd.dxf": ["dxf"],
};

/**
 * Characters a file name never keeps: control characters (C0 and C1), format characters — among them
 * the bidirectional overrides and isolates (U+202A–U+202E, U+2066–U+2069) that make
 * "invoice\u202Efdp.exe" look like "invoiceexe.pdf", and zero-width characters — line and paragraph
 * separators, and the quote that would end a header's quoted string (Unicode general categories
 * Cc, Cf, Zl, Zp; Unicode Standard Annex #9 for the bidirectional controls).
 */
const UNSAFE_IN_NAME = /[\p{Cc}\p{Cf}\p{Zl}\p{Zp}"]/gu;

/**
 * A file name safe to store and to send back in a header: no folders, no control, bidirectional or
 * invisible characters, and an extension that says what the content is (judged by
 * `detectAttachmentType`): "drawing.exe" holding a PDF is kept as "drawing.pdf", "scan" as
 * "scan.png". An extension another type would have is replaced, never kept in front.
 */
export function cleanFileName(name: string, contentType: AttachmentContentType): string {
  const extensions = EXTENSIONS[contentType];
  const base = (name.split(/[\\/]/).pop() ?? "").normalize("NFC").replace(UNSAFE_IN_NAME, "").trim();
  const dot = base.lastIndexOf(".");
  const ext = dot >= 0 ? base.slice(dot + 1).toLowerCase() : "";
  if (extensions.includes(ext)) return `${base.slice(0, dot).slice(0, 200).trim() || "attachment"}.${ext}`;
  // a short trailing word after a dot is an extension of some other kind: it goes
  const stem = (/^[a-z0-9]{1,8}$/i.test(ext) ? base.slice(0, dot) : base).replace(/^\.+|\.+$/g, "").trim();
  return `${stem.slice(0, 200).trim() || "attachment"}.${extensions[0]}`;
}

/** `attachment; filename="…"; filename*=UTF-8''…` (RFC 6266 with RFC 5987 encoding). */
export function contentDisposition(fileName: string): string {
  const ascii = fileName.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}
