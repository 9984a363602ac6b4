// The production server (scripts/serve.mjs) answers the build's scripts and styles in brotli. The
// body is checked by decompressing it with Node's zlib (brotli, RFC 7932) and comparing it byte for
// byte with the file Next.js sends uncompressed; the headers with those Next.js gives the file.
import http from "node:http";
import zlib from "node:zlib";
import { expect, test } from "./fixtures";

interface Answer {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: Buffer;
}

/** A raw GET (no decompression on our side) with the Accept-Encoding given. */
function get(url: string, acceptEncoding: string): Promise<Answer> {
  return new Promise((resolve, reject) => {
    http
      .get(url, { headers: { "accept-encoding": acceptEncoding } }, (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
        res.on("error", reject);
      })
      .on("error", reject);
  });
}

test("a page's scripts and styles arrive in brotli, byte for byte the build's files, with the headers Next.js gives them", async ({ page, baseURL }) => {
  await page.goto("/");
  const script = await page.locator('script[src^="/_next/static/"]').first().getAttribute("src");
  const style = await page.locator('link[rel="stylesheet"][href^="/_next/static/"]').first().getAttribute("href");
  expect(script).toBeTruthy();
  expect(style).toBeTruthy();

  for (const file of [script!, style!]) {
    const url = new URL(file, baseURL).toString();
    const br = await get(url, "gzip, deflate, br");
    expect(br.headers["content-encoding"]).toBe("br");
    const plain = await get(url, "identity");
    const gzip = await get(url, "gzip");
    expect(br.status).toBe(200);
    expect(plain.headers["content-encoding"]).toBeUndefined();
    expect(zlib.brotliDecompressSync(br.body).equals(plain.body), `${file} decompresses to the file itself`).toBe(true);
    expect(br.body.length, `${file} is smaller in brotli than in gzip`).toBeLessThan(gzip.body.length);
    expect(br.headers.vary).toMatch(/accept-encoding/i);
    for (const header of ["content-type", "cache-control", "x-content-type-options", "x-frame-options", "referrer-policy", "permissions-policy"]) {
      expect(br.headers[header], `${file}: ${header}`).toBe(plain.headers[header]);
    }
    // a client that does not take brotli, or refuses it with q=0, gets Next.js's own gzip
    expect(gzip.headers["content-encoding"]).toBe("gzip");
    expect((await get(url, "br;q=0, gzip")).headers["content-encoding"]).toBe("gzip");
  }
});
