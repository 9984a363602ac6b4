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

/** A file name safe to store and to send back in a header: no folders, no control characters. */
export function cleanFileName(name: string, extension: string): string {
  const base = [...(name.split(/[\\/]/).pop() ?? "")]
    .filter((ch) => ch.charCodeAt(0) >= 0x20 && ch !== "\u007f" && ch !== '"')
    .join("")
    .trim()
    .slice(0, 200);
  return base === "" || base === "." || base === ".." ? `attachment.${extension}` : base;
}

/** `attachment; filename="…"; filename*=UTF-8''…` (RFC 6266 with RFC 5987 encoding). */
export function contentDisposition(fileName: string): string {
  const ascii = fileName.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}
