import { describe, expect, it } from "vitest";
import { cleanFileName, contentDisposition, detectAttachmentType, looksExecutable, looksLikeAsciiDxf } from "@/lib/attachments/content-type";

const bytes = (...parts: (string | number[])[]) => Buffer.concat(parts.map((p) => (typeof p === "string" ? Buffer.from(p, "latin1") : Buffer.from(p))));

// The smallest valid files of each kind, written from their specifications:
// PNG signature and IHDR chunk (ISO/IEC 15948, §5.2 and §11.2.2); JPEG SOI + APP0 "JFIF" (ITU-T T.81 Annex B,
// JFIF 1.02); PDF header "%PDF-1.4" (ISO 32000-1 §7.5.2).
const PNG = bytes([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a], [0, 0, 0, 13], "IHDR", [0, 0, 0, 1, 0, 0, 0, 1, 8, 2, 0, 0, 0], [0x90, 0x77, 0x53, 0xde]);
const JPEG = bytes([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10], "JFIF", [0, 1, 2, 0, 0, 1, 0, 1, 0, 0], [0xff, 0xd9]);
const PDF = bytes("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n");
// ASCII DXF opens with group code 0 and SECTION (DXF reference, file structure; from memory)
const DXF = bytes("  0\r\nSECTION\r\n  2\r\nHEADER\r\n  0\r\nENDSEC\r\n  0\r\nEOF\r\n");
// Executables: "MZ" DOS header of a PE file (Microsoft PE/COFF specification), ELF e_ident (System V ABI)
const EXE = bytes("MZ", new Array(62).fill(0), "This program cannot be run in DOS mode.");
const ELF = bytes([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0], new Array(56).fill(0));

describe("attachment types by content", () => {
  it.each([
    ["PNG", PNG, "image/png"],
    ["JPEG", JPEG, "image/jpeg"],
    ["PDF", PDF, "application/pdf"],
    ["DXF", DXF, "image/vnd.dxf"],
  ])("accepts %s", async (_name, content, type) => {
    const r = await detectAttachmentType(content);
    expect(r).toMatchObject({ ok: true, contentType: type });
  });

  it.each([
    ["a Windows executable", EXE],
    ["an ELF executable", ELF],
    ["a shell script", bytes("#!/bin/sh\necho hi\n")],
    ["a ZIP archive", bytes([0x50, 0x4b, 0x03, 0x04], new Array(26).fill(0))],
    ["plain text", bytes("drawing to follow\n")],
    ["an empty file", bytes("")],
    ["text that mentions SECTION later", bytes("hello\n0\nSECTION\n")],
  ])("refuses %s", async (_name, content) => {
    expect((await detectAttachmentType(content)).ok).toBe(false);
  });

  it("judges by content only: an executable stays refused whatever it is called", () => {
    expect(looksExecutable(EXE)).toBe(true);
    expect(looksExecutable(PDF)).toBe(false);
    expect(looksLikeAsciiDxf(DXF)).toBe(true);
    expect(looksLikeAsciiDxf(bytes("0\nSECTION\n"))).toBe(true);
    expect(looksLikeAsciiDxf(bytes("0\nSECTION\n", [0], "x"))).toBe(false);
  });
});

describe("file names", () => {
  it.each([
    ["../../etc/passwd", "passwd.pdf"],
    ["C:\\drawings\\bank.pdf", "bank.pdf"],
    ["Bank.PDF", "Bank.pdf"],
    ['we"ird\u0007.pdf', "weird.pdf"],
    ["", "attachment.pdf"],
    ["..", "attachment.pdf"],
    [".pdf", "attachment.pdf"],
    // the extension says what the content is: another type's goes, a missing one is added
    ["drawing.exe", "drawing.pdf"],
    ["drawing.png", "drawing.pdf"],
    ["spec", "spec.pdf"],
    ["rev 2.1 final", "rev 2.1 final.pdf"],
    ["bank.v2", "bank.pdf"],
    // a right-to-left override (U+202E) would show "invoiceexe.pdf"; isolates, zero-width and C1 controls go too
    ["invoice\u202Efdp.exe", "invoicefdp.pdf"],
    ["a\u2066b\u2069c\u200Bd\u200Fe\uFEFF\u0085f.pdf", "abcdef.pdf"],
    ["line\u2028break.pdf", "linebreak.pdf"],
  ])("%j holding a PDF is stored as %j", (input, out) => {
    expect(cleanFileName(input, "application/pdf")).toBe(out);
  });

  it.each([
    ["image/jpeg", "photo.jpeg", "photo.jpeg"],
    ["image/jpeg", "photo.JPG", "photo.jpg"],
    ["image/jpeg", "photo.png", "photo.jpg"],
    ["image/png", "plan", "plan.png"],
    ["image/vnd.dxf", "layout.dwg", "layout.dxf"],
  ] as const)("a %s named %j is stored as %j", (type, input, out) => {
    expect(cleanFileName(input, type)).toBe(out);
  });

  it("sends non-ASCII names encoded per RFC 5987 with an ASCII fallback (RFC 6266)", () => {
    expect(contentDisposition("Schaltplan-Größe.pdf")).toBe(`attachment; filename="Schaltplan-Gr__e.pdf"; filename*=UTF-8''Schaltplan-Gr%C3%B6%C3%9Fe.pdf`);
  });
});
