/**
 * Attachments: type judged by content, at most 10 MB, stored outside public/, downloadable only by
 * the customer who uploaded it and the shop's staff; linked to a request only by its uploader.
 */
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as downloadRoute } from "@/app/api/v1/shops/[shop]/attachments/[id]/route";
import { POST as uploadRoute } from "@/app/api/v1/shops/[shop]/attachments/route";
import { chooseArrangement } from "@/app/s/[shop]/actions";
import { ownerDb as db } from "./owner-db";
import { getAttachment } from "@/db/queries/attachments";
import { requestAttachments } from "@/db/schema";
import { env } from "@/lib/env";
import { createShop, KESTREL_REQUIREMENT, type TestShop } from "./fixtures";
import { actAs, request, sessionCookie } from "./helpers";

// Smallest files of each kind from their specifications: PDF header (ISO 32000-1 §7.5.2), PNG
// signature + IHDR (ISO/IEC 15948 §5.2), ASCII DXF opening group "0 / SECTION" (DXF reference, from memory).
const PDF = Buffer.from("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n", "latin1");
const PNG = Buffer.concat([
  Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]),
  Buffer.from("IHDR"),
  Buffer.from([0, 0, 0, 1, 0, 0, 0, 1, 8, 2, 0, 0, 0, 0x90, 0x77, 0x53, 0xde]),
]);
const DXF = Buffer.from("  0\r\nSECTION\r\n  2\r\nENTITIES\r\n  0\r\nENDSEC\r\n  0\r\nEOF\r\n", "latin1");
// A Windows program starts "MZ" (Microsoft PE/COFF specification); here it is named like a drawing.
const EXE = Buffer.concat([Buffer.from("MZ"), Buffer.alloc(62), Buffer.from("This program cannot be run in DOS mode.")]);

const params = <T extends Record<string, string>>(p: T) => ({ params: Promise.resolve(p) });

async function upload(email: string | null, slug: string, name: string, bytes: Buffer) {
  const form = new FormData();
  form.set("file", new File([new Uint8Array(bytes)], name));
  return uploadRoute(
    request(`/api/v1/shops/${slug}/attachments`, { method: "POST", body: form, cookie: email ? await sessionCookie(email) : "" }),
    params({ shop: slug }),
  );
}

async function download(email: string | null, slug: string, id: string) {
  return downloadRoute(request(`/api/v1/shops/${slug}/attachments/${id}`, { cookie: email ? await sessionCookie(email) : "" }), params({ shop: slug, id }));
}

describe("attachments", () => {
  // a shop of this file's own (K) and another shop (M)
  let K = "";
  let M = "";
  let kShopId = "";
  let kCustomer = "";
  let kOtherCustomer = "";
  let kEstimator = "";
  let kManager = "";
  let mEstimator = "";
  let mCustomer = "";
  beforeAll(async () => {
    const [k, m]: TestShop[] = await Promise.all([createShop("kestrel"), createShop("marlow")]);
    ({ slug: K, id: kShopId } = k!);
    M = m!.slug;
    [kCustomer, kOtherCustomer, kEstimator, kManager] = [k!.customers[0].email, k!.customers[1].email, k!.estimator.email, k!.manager.email];
    [mEstimator, mCustomer] = [m!.estimator.email, m!.customers[0].email];
  });

  it.each([
    ["drawing.pdf", PDF, "application/pdf", "drawing.pdf"],
    ["photo.png", PNG, "image/png", "photo.png"],
    ["outline.dxf", DXF, "image/vnd.dxf", "outline.dxf"],
    // the name does not decide: a PDF called .png is a PDF, and is named so
    ["misnamed.png", PDF, "application/pdf", "misnamed.pdf"],
  ])("accepts %s and stores it outside public/ with its SHA-256", async (name, bytes, type, storedName) => {
    const res = await upload(kCustomer, K, name, bytes);
    expect(res.status).toBe(201);
    const body = (await res.json()) as { id: string; fileName: string; sizeBytes: number; contentType: string };
    expect(body).toMatchObject({ fileName: storedName, sizeBytes: bytes.byteLength, contentType: type });
    const row = await getAttachment(kShopId, body.id);
    expect(row?.storageKey.startsWith(`${kShopId}/`)).toBe(true);
    const file = path.resolve(env.UPLOAD_DIR, row!.storageKey);
    expect(file.startsWith(path.resolve("public"))).toBe(false);
    expect(fs.readFileSync(file).equals(bytes)).toBe(true);
    // sha256 of the bytes, as node:crypto computes it independently of the route
    const { createHash } = await import("node:crypto");
    expect(row?.sha256).toBe(createHash("sha256").update(bytes).digest("hex"));
  });

  it("refuses a renamed executable", async () => {
    const res = await upload(kCustomer, K, "bank-drawing.pdf", EXE);
    expect(res.status).toBe(400);
    expect(((await res.json()) as { error: string }).error).toMatch(/Programs/);
  });

  it("refuses an 11 MB file and a file one byte over 10 MB", async () => {
    const big = Buffer.alloc(11 * 1024 * 1024, 0x20);
    PDF.copy(big);
    expect((await upload(kCustomer, K, "big.pdf", big)).status).toBe(400);
    const justOver = Buffer.alloc(10 * 1024 * 1024 + 1, 0x20);
    PDF.copy(justOver);
    const res = await upload(kCustomer, K, "just-over.pdf", justOver);
    expect(res.status).toBe(400);
    expect(((await res.json()) as { error: string }).error).toMatch(/10 MB/);
    const exact = Buffer.alloc(10 * 1024 * 1024, 0x20);
    PDF.copy(exact);
    expect((await upload(kCustomer, K, "exact.pdf", exact)).status).toBe(201);
  });

  it("refuses a signed-out visitor (401), staff (403: they do not make requests) and another shop's customer (403)", async () => {
    expect((await upload(null, K, "a.pdf", PDF)).status).toBe(401);
    expect((await upload(kEstimator, K, "a.pdf", PDF)).status).toBe(403);
    expect((await upload(mCustomer, K, "a.pdf", PDF)).status).toBe(403);
  });

  it("downloads only to the uploader and the shop's staff; 404 to another customer and another shop", async () => {
    const res = await upload(kCustomer, K, "Schaltplan Größe.pdf", PDF);
    const { id } = (await res.json()) as { id: string };
    const own = await download(kCustomer, K, id);
    expect(own.status).toBe(200);
    expect(own.headers.get("content-disposition")).toMatch(/^attachment; /);
    expect(own.headers.get("content-type")).toBe("application/pdf");
    expect(Buffer.from(await own.arrayBuffer()).equals(PDF)).toBe(true);
    expect((await download(kEstimator, K, id)).status).toBe(200);
    expect((await download(kManager, K, id)).status).toBe(200);
    expect((await download(kOtherCustomer, K, id)).status).toBe(404);
    // another shop's staff, through their own shop: not found; through this shop: not a member
    expect((await download(mEstimator, M, id)).status).toBe(404);
    expect((await download(mEstimator, K, id)).status).toBe(403);
    expect((await download(null, K, id)).status).toBe(401);
    expect((await download(kCustomer, K, randomUUID())).status).toBe(404);
    expect((await download(kCustomer, K, "../../etc/passwd")).status).toBe(404);
  });

  it("a request links the customer's own uploads only", async () => {
    const mine = (await (await upload(kCustomer, K, "mine.pdf", PDF)).json()) as { id: string };
    const theirs = (await (await upload(kOtherCustomer, K, "theirs.pdf", PDF)).json()) as { id: string };
    await actAs(kCustomer);
    const r = await chooseArrangement(K, { idempotencyKey: randomUUID(), requirement: KESTREL_REQUIREMENT, attachmentIds: [mine.id, theirs.id] });
    if (!r.ok) throw new Error(JSON.stringify(r));
    const requestId = r.data.kind === "review" ? r.data.requestId : null;
    expect(requestId).not.toBeNull();
    const [m] = await db
      .select()
      .from(requestAttachments)
      .where(and(eq(requestAttachments.shopId, kShopId), eq(requestAttachments.id, mine.id)));
    const [t] = await db
      .select()
      .from(requestAttachments)
      .where(and(eq(requestAttachments.shopId, kShopId), eq(requestAttachments.id, theirs.id)));
    expect(m?.requestId).toBe(requestId);
    expect(t?.requestId).toBeNull();
  });
});
