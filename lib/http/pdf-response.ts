import { contentDisposition } from "@/lib/attachments/content-type";

/** A PDF download: private, never cached, named for the reader's disk. */
export function pdfResponse(buffer: Buffer, fileName: string): Response {
  return new Response(new Uint8Array(buffer), {
    headers: {
      "content-type": "application/pdf",
      "content-length": String(buffer.byteLength),
      "content-disposition": contentDisposition(fileName),
      "cache-control": "private, no-store",
    },
  });
}
