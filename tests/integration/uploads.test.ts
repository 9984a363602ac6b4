/**
 * Upload limits and upkeep (issue item 4): per-person and per-shop rates (429) and quotas (413), a
 * cap on files not yet sent with a request, the daily sweep of files never attached, download
 * names whose extension is their content's with control and bidirectional characters gone, and a
 * 404 (not an empty reply) for an attachment whose file has gone. This file lowers the limits.
 */
import fs from "node:fs";
import path from "node:path";
import { eq, sql } from "drizzle-orm";
import { afterAll, describe, expect, it, vi } from "vitest";

vi.hoisted(() => {
  vi.stubEnv("UPLOAD_RATE_PER_USER", "25");
  vi.stubEnv("UPLOAD_RATE_PER_SHOP", "30");
  // 10,485 and 15,728 bytes
  vi.stubEnv("UPLOAD_USER_QUOTA_MB", "0.01");
  vi.stubEnv("UPLOAD_SHOP_QUOTA_MB", "0.015");
});

import { GET as downloadRoute } from "@/app/api/v1/shops/[shop]/attachments/[id]/route";
import { POST as uploadRoute } from "@/app/api/v1/shops/[shop]/attachments/route";
import { chooseArrangement } from "@/app/s/[shop]/actions";
import { requestAttachments } from "@/db/schema";
import { ATTACHMENT_SWEEP_QUEUE, sweepUnlinkedAttachments } from "@/lib/attachments/sweep";
import { getBoss } from "@/lib/mail/queue";
import { startMailWorker, stopMailWorker } from "@/lib/mail/worker";
import { env } from "@/lib/env";
import { MAX_PENDING_ATTACHMENTS_PER_USER } from "@/lib/validation/limits";
import { choiceOf, cheapestOption, createShop, KESTREL_REQUIREMENT, type TestPerson, type TestShop } from "./fixtures";
import { actAs, request, sessionCookie } from "./helpers";
import { ownerDb } from "./owner-db";

afterAll(() => vi.unstubAllEnvs());

/** A PDF of `size` bytes: the header (ISO 32000-1 §7.5.2), padding in a comment, the end marker. */
function pdf(size: number): Buffer {
  const head = "%PDF-1.4\n%";
  const tail = "\n%%EOF\n";
  return Buffer.from(head + "x".repeat(Math.max(0, size - head.length - tail.length)) + tail, "latin1");
}
// PNG signature + IHDR (ISO/IEC 15948 §5.2)
const PNG = Buffer.concat([
  Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]),
  Buffer.from("IHDR"),
  Buffer.from([0, 0, 0, 1, 0, 0, 0, 1, 8, 2, 0, 0, 0, 0x90, 0x77, 0x53, 0xde]),
]);

const cookies = new Map<string, string>();
async function cookieOf(person: TestPerson) {
  if (!cookies.has(person.email)) cookies.set(person.email, await sessionCookie(person.email));
  return cookies.get(person.email)!;
}

async function upload(shop: TestShop, person: TestPerson, name: string, bytes: Buffer) {
  const form = new FormData();
  form.set("file", new File([new Uint8Array(bytes)], name));
  const res = await uploadRoute(request(`/api/v1/shops/${shop.slug}/attachments`, { method: "POST", body: form, cookie: await cookieOf(person) }), {
    params: Promise.resolve({ shop: shop.slug }),
  });
  return { status: res.status, body: (await res.json()) as { id?: string; fileName?: string; error?: string }, retryAfter: res.headers.get("retry-after") };
}

async function download(shop: TestShop, person: TestPerson, id: string) {
  return downloadRoute(request(`/api/v1/shops/${shop.slug}/attachments/${id}`, { cookie: await cookieOf(person) }), {
    params: Promise.resolve({ shop: shop.slug, id }),
  });
}

describe("how much a person and a shop may upload", () => {
  it("a person keeps at most two requests' worth of files not yet sent, and makes at most the per-person number of uploads", async () => {
    const shop = await createShop("kestrel");
    const c = shop.customers[0];
    const statuses: number[] = [];
    for (let i = 0; i < MAX_PENDING_ATTACHMENTS_PER_USER; i++) statuses.push((await upload(shop, c, `p${i}.pdf`, pdf(50))).status);
    expect(statuses).toEqual(Array(MAX_PENDING_ATTACHMENTS_PER_USER).fill(201));
    const pending = await upload(shop, c, "one-more.pdf", pdf(50));
    expect(pending.status).toBe(413);
    expect(pending.body.error).toMatch(/not yet sent with a request/);
    // the per-person rate (25 per 10 minutes here) counts every try
    for (let i = MAX_PENDING_ATTACHMENTS_PER_USER + 1; i < 25; i++) expect((await upload(shop, c, "x.pdf", pdf(50))).status).toBe(413);
    const limited = await upload(shop, c, "x.pdf", pdf(50));
    expect(limited.status).toBe(429);
    expect(Number(limited.retryAfter)).toBeGreaterThan(0);
    // another person is not held back by it
    expect((await upload(shop, shop.customers[1], "theirs.pdf", pdf(50))).status).toBe(201);
  });

  it("the shop's people together make at most the per-shop number of uploads", async () => {
    const shop = await createShop("kestrel");
    for (let i = 0; i < 20; i++) expect((await upload(shop, shop.customers[0], `a${i}.pdf`, pdf(50))).status).toBe(201);
    for (let i = 0; i < 10; i++) expect((await upload(shop, shop.customers[1], `b${i}.pdf`, pdf(50))).status).toBe(201);
    const limited = await upload(shop, shop.customers[1], "b-last.pdf", pdf(50));
    expect(limited.status).toBe(429);
  });

  it("a person's stored bytes in the shop, and the shop's, stay within their quotas", async () => {
    const shop = await createShop("kestrel");
    const [c1, c2] = shop.customers;
    expect((await upload(shop, c1, "1.pdf", pdf(4000))).status).toBe(201);
    expect((await upload(shop, c1, "2.pdf", pdf(4000))).status).toBe(201);
    const own = await upload(shop, c1, "3.pdf", pdf(4000));
    expect(own.status).toBe(413);
    expect(own.body.error).toMatch(/Your files in this shop may take up to/);
    expect((await upload(shop, c2, "4.pdf", pdf(4000))).status).toBe(201);
    const shopFull = await upload(shop, c2, "5.pdf", pdf(4000));
    expect(shopFull.status).toBe(413);
    expect(shopFull.body.error).toMatch(/storage for drawings is full/);
    // only what was accepted was stored
    const rows = await ownerDb.select({ id: requestAttachments.id }).from(requestAttachments).where(eq(requestAttachments.shopId, shop.id));
    expect(rows).toHaveLength(3);
  });

  it("uploads racing each other cannot together pass a quota", async () => {
    const shop = await createShop("kestrel");
    const results = await Promise.all(Array.from({ length: 6 }, (_, i) => upload(shop, shop.customers[0], `r${i}.pdf`, pdf(3000))));
    // 10,485 bytes hold three files of 3,000 bytes, not four
    expect(results.filter((r) => r.status === 201)).toHaveLength(3);
    expect(results.filter((r) => r.status === 413)).toHaveLength(3);
  });
});

describe("files never attached to a request", () => {
  it("are deleted with their bytes after a day; attached and recent ones stay", async () => {
    const shop = await createShop("kestrel");
    const c = shop.customers[0];
    const old = (await upload(shop, c, "old.pdf", pdf(80))).body.id!;
    const attached = (await upload(shop, c, "attached.pdf", pdf(80))).body.id!;
    const recent = (await upload(shop, c, "recent.pdf", pdf(80))).body.id!;
    await actAs(c.email);
    const r = await chooseArrangement(shop.slug, {
      ...choiceOf(KESTREL_REQUIREMENT, await cheapestOption(shop.id, KESTREL_REQUIREMENT)),
      attachmentIds: [attached],
    });
    expect(r.ok).toBe(true);
    await ownerDb
      .update(requestAttachments)
      .set({ createdAt: sql`now() - interval '25 hours'` })
      .where(sql`${requestAttachments.id} in (${old}, ${attached})`);
    const [oldRow] = await ownerDb.select().from(requestAttachments).where(eq(requestAttachments.id, old));
    const oldFile = path.resolve(env.UPLOAD_DIR, oldRow!.storageKey);
    expect(fs.existsSync(oldFile)).toBe(true);

    expect(await sweepUnlinkedAttachments()).toBeGreaterThanOrEqual(1);
    const left = await ownerDb.select({ id: requestAttachments.id }).from(requestAttachments).where(eq(requestAttachments.shopId, shop.id));
    expect(left.map((x) => x.id).sort()).toEqual([attached, recent].sort());
    expect(fs.existsSync(oldFile)).toBe(false);
    expect((await download(shop, c, old)).status).toBe(404);
    expect((await download(shop, c, attached)).status).toBe(200);
  });

  it("are swept on a schedule by the job queue's worker, on whichever server runs it", async () => {
    await startMailWorker({ retryOnFailure: false });
    try {
      const schedules = await (await getBoss()).getSchedules();
      expect(schedules.map((x) => [x.name, x.cron])).toContainEqual([ATTACHMENT_SWEEP_QUEUE, "17 * * * *"]);
    } finally {
      await stopMailWorker();
    }
  });
});

describe("download names and missing files", () => {
  it("a name loses control and bidirectional characters and takes its content's extension, at upload and at download", async () => {
    const shop = await createShop("kestrel");
    const c = shop.customers[0];
    // U+202E would show "invoiceexe.pdf" for a file that is really named …fdp.exe
    const up = await upload(shop, c, "invoice\u202Efdp.exe", pdf(80));
    expect(up).toMatchObject({ status: 201, body: { fileName: "invoicefdp.pdf" } });
    const res = await download(shop, c, up.body.id!);
    expect(res.headers.get("content-disposition")).toBe(`attachment; filename="invoicefdp.pdf"; filename*=UTF-8''invoicefdp.pdf`);
    // a name stored before these rules is sent with the extension of what the file is
    const png = (await upload(shop, c, "plan.png", PNG)).body.id!;
    await ownerDb.update(requestAttachments).set({ fileName: "plan\u202Egnp.exe" }).where(eq(requestAttachments.id, png));
    const again = await download(shop, shop.estimator, png);
    expect(again.headers.get("content-type")).toBe("image/png");
    expect(again.headers.get("content-disposition")).toContain('filename="plangnp.png"');
  });

  it("an attachment whose file is gone answers 404 with a message, not an empty reply", async () => {
    const shop = await createShop("kestrel");
    const c = shop.customers[0];
    const id = (await upload(shop, c, "gone.pdf", pdf(80))).body.id!;
    const [row] = await ownerDb.select().from(requestAttachments).where(eq(requestAttachments.id, id));
    fs.rmSync(path.resolve(env.UPLOAD_DIR, row!.storageKey));
    const res = await download(shop, shop.estimator, id);
    expect(res.status).toBe(404);
    expect(res.headers.get("content-type")).toMatch(/application\/json/);
    expect(await res.json()).toEqual({ error: "This attachment's file is no longer available." });
  });
});
