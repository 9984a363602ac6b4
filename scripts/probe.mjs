// `node scripts/probe.mjs [base-url]`: probes a running Faradsmith the way an attacker would and
// prints attempts and refusals per category (the auth plugin's endpoints, rate limits, NUL bytes,
// headers and cross-origin writes, account enumeration). Requests come from several loopback
// source addresses (127.0.0.x) so that per-address limits can be told apart. It signs in with the
// demo accounts and CHANGES the demo data when an attack gets through (it tries to undo what it
// did): run it against a throwaway database, e.g. the one `npm start` made. Run with tsx (it
// reads the demo people from db/seed) and DATABASE_URL pointing at the app's database:
//   DATABASE_URL=postgres://… npx tsx scripts/probe.mjs http://127.0.0.1:3000
import http from "node:http";
import pg from "pg";
import { DEMO_PASSWORD, demoPeople } from "../db/seed/people.ts";

const BASE = new URL(process.argv[2] ?? "http://127.0.0.1:3000");
const ORIGIN = BASE.origin;
const K = "kestrel-bank-works";
const M = "marlow-pulse";

/** One HTTP request from a chosen loopback address; resolves { status, headers, text }. */
function send(method, path, { headers = {}, body, from = "127.0.0.1" } = {}) {
  return new Promise((resolve, reject) => {
    const payload = body === undefined ? undefined : typeof body === "string" || Buffer.isBuffer(body) ? body : JSON.stringify(body);
    const h = { ...headers };
    if (payload !== undefined && !Object.keys(h).some((k) => k.toLowerCase() === "content-type")) h["content-type"] = "application/json";
    const req = http.request({ host: BASE.hostname, port: BASE.port, method, path, headers: h, localAddress: from }, (res) => {
      const chunks = [];
      res.on("data", (c) => chunks.push(c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text: Buffer.concat(chunks).toString("utf8") }));
    });
    req.on("error", reject);
    if (payload !== undefined) req.write(payload);
    req.end();
  });
}

const results = new Map();
/** Records one attempt: `refused` says whether the app stood firm. */
function record(category, name, refused, status) {
  const r = results.get(category) ?? { attempts: 0, refused: 0, through: [] };
  r.attempts += 1;
  if (refused) r.refused += 1;
  else r.through.push(`${name} (${status})`);
  results.set(category, r);
}

// a block of loopback addresses of its own per run, so one run's limits do not spill into the next
const block = 1 + Math.floor(Math.random() * 250);
let sourceCounter = 1;
/** A fresh loopback source address (127.x.y.z is all loopback on Linux). */
const freshSource = () => {
  const n = sourceCounter++;
  return `127.${block}.${Math.floor(n / 250)}.${1 + (n % 250)}`;
};
const notes = [];

async function signIn(email, password = DEMO_PASSWORD) {
  const res = await send("POST", "/api/auth/sign-in/email", { headers: { origin: ORIGIN }, body: { email, password }, from: freshSource() });
  if (res.status !== 200) throw new Error(`sign-in ${email}: ${res.status} ${res.text.slice(0, 200)}`);
  const cookies = [].concat(res.headers["set-cookie"] ?? []).map((c) => c.split(";")[0]);
  return cookies.join("; ");
}

const authed = (cookie, extra = {}) => ({ cookie, origin: ORIGIN, ...extra });
const is2xx = (s) => s >= 200 && s < 300;

async function probeAuthPlugin(ids) {
  const cat = "auth plugin endpoints";
  const kp = demoPeople[K];
  const mp = demoPeople[M];
  const cookies = {
    customer: await signIn(kp.customers[0].email),
    estimator: await signIn(kp.estimator.email),
    manager: await signIn(kp.manager.email),
    otherManager: await signIn(mp.manager.email),
  };
  const leaksMembers = (res) => is2xx(res.status) && res.text.includes("@");
  for (const role of ["customer", "estimator", "otherManager"]) {
    const list = await send("GET", `/api/auth/organization/list-members?organizationId=${ids.k}`, { headers: authed(cookies[role]) });
    record(cat, `${role} list-members`, !leaksMembers(list), list.status);
    const full = await send("GET", `/api/auth/organization/get-full-organization?organizationId=${ids.k}`, { headers: authed(cookies[role]) });
    record(cat, `${role} get-full-organization`, !leaksMembers(full), full.status);
  }
  const visitorList = await send("GET", `/api/auth/organization/list-members?organizationId=${ids.k}`, { headers: { origin: ORIGIN } });
  record(cat, "visitor list-members", !leaksMembers(visitorList), visitorList.status);

  for (const slug of ["desk", "sign-in", "ab", "X..Y", "api"]) {
    const res = await send("POST", "/api/auth/organization/create", { headers: authed(cookies.customer), body: { name: `Probe ${slug}`, slug } });
    record(cat, `customer creates shop "${slug}"`, !is2xx(res.status), res.status);
  }
  for (const slug of ["api", "a/../x"]) {
    const res = await send("POST", "/api/auth/organization/update", { headers: authed(cookies.manager), body: { organizationId: ids.k, data: { slug } } });
    record(cat, `manager renames slug to "${slug}"`, !is2xx(res.status), res.status);
    if (is2xx(res.status))
      await send("POST", "/api/auth/organization/update", { headers: authed(cookies.manager), body: { organizationId: ids.k, data: { slug: K } } });
  }
  const promote = await send("POST", "/api/auth/organization/update-member-role", {
    headers: authed(cookies.manager),
    body: { organizationId: ids.k, memberId: ids.kCustomer2Member, role: "manager" },
  });
  record(cat, "manager promotes a customer to manager", !is2xx(promote.status), promote.status);
  const invite = await send("POST", "/api/auth/organization/invite-member", {
    headers: authed(cookies.manager),
    body: { organizationId: ids.k, email: `probe-${Date.now()}@probe.example`, role: "manager" },
  });
  record(cat, "manager invites a manager", !is2xx(invite.status), invite.status);
  if (is2xx(promote.status)) {
    // the promoted customer, now a co-manager, demotes the founder
    const coManager = await signIn(kp.customers[1].email);
    const demote = await send("POST", "/api/auth/organization/update-member-role", {
      headers: authed(coManager),
      body: { organizationId: ids.k, memberId: ids.kManagerMember, role: "customer" },
    });
    record(cat, "co-manager demotes the founder", !is2xx(demote.status), demote.status);
    if (is2xx(demote.status))
      await send("POST", "/api/auth/organization/update-member-role", {
        headers: authed(coManager),
        body: { organizationId: ids.k, memberId: ids.kManagerMember, role: "manager" },
      });
    await send("POST", "/api/auth/organization/update-member-role", {
      headers: authed(cookies.manager),
      body: { organizationId: ids.k, memberId: ids.kCustomer2Member, role: "customer" },
    });
  } else {
    const demote = await send("POST", "/api/auth/organization/update-member-role", {
      headers: authed(cookies.manager),
      body: { organizationId: ids.k, memberId: ids.kManagerMember, role: "customer" },
    });
    record(cat, "manager demotes the founder (themself)", !is2xx(demote.status), demote.status);
  }
  const foreign = await send("POST", "/api/auth/organization/update-member-role", {
    headers: authed(cookies.otherManager),
    body: { organizationId: ids.k, memberId: ids.kCustomer2Member, role: "estimator" },
  });
  record(cat, "other shop's manager changes a role", !is2xx(foreign.status), foreign.status);
  const remove = await send("POST", "/api/auth/organization/remove-member", {
    headers: authed(cookies.estimator),
    body: { organizationId: ids.k, memberIdOrEmail: kp.manager.email },
  });
  record(cat, "estimator removes the manager", !is2xx(remove.status), remove.status);
  const leave = await send("POST", "/api/auth/organization/leave", { headers: authed(cookies.customer), body: { organizationId: ids.m } });
  record(cat, "customer leaves a shop they are not in", !is2xx(leave.status), leave.status);
}

async function probeRateLimits() {
  const cat = "rate limits";
  const victim = demoPeople[K].customers[1].email;
  // 30 wrong passwords from one address, a new X-Forwarded-For each time
  const spoofFrom = freshSource();
  let through = 0;
  for (let i = 0; i < 30; i += 1) {
    const res = await send("POST", "/api/auth/sign-in/email", {
      headers: { origin: ORIGIN, "x-forwarded-for": `198.51.100.${i + 1}` },
      body: { email: `nobody-${i}@probe.example`, password: "wrong-password" },
      from: spoofFrom,
    });
    if (res.status !== 429) through += 1;
  }
  // the limit for this address (AUTH_SIGN_IN_LIMIT, 3 by default) is what may pass
  for (let i = 0; i < 30; i += 1) record(cat, `wrong password with forged X-Forwarded-For #${i + 1}`, i >= through || i < 3, through);
  notes.push(`wrong passwords with a new forged X-Forwarded-For each: ${through} of 30 reached the password check`);
  // one forged X-Real-IP per request on the public API
  const apiFrom = freshSource();
  let limited = 0;
  const n = 140;
  for (let i = 0; i < n; i += 1) {
    const res = await send("POST", `/api/v1/shops/${K}/arrangements`, {
      headers: { "x-real-ip": `203.0.113.${i % 250}`, "x-forwarded-for": `203.0.113.${i % 250}` },
      body: { maxVoltage: 48, minVoltage: 24, energy: 20000 },
      from: apiFrom,
    });
    if (res.status === 429) limited += 1;
  }
  record(cat, `${n} API calls with forged headers: ${limited} limited`, limited > 0, limited);
  notes.push(`public API with a new forged X-Forwarded-For / X-Real-IP each: ${limited} of ${n} answered 429`);
  // three wrong tries from one address must not lock out another address
  const a = freshSource();
  for (let i = 0; i < 4; i += 1)
    await send("POST", "/api/auth/sign-in/email", {
      headers: { origin: ORIGIN },
      body: { email: `nobody@probe.example`, password: "wrong-password" },
      from: a,
    });
  const other = await send("POST", "/api/auth/sign-in/email", {
    headers: { origin: ORIGIN },
    body: { email: demoPeople[K].estimator.email, password: DEMO_PASSWORD },
    from: freshSource(),
  });
  record(cat, "another address signs in after one address's wrong tries", other.status === 200, other.status);
  notes.push(`after 4 wrong tries from one address, another address signs in: ${other.status}`);
  // one account, wrong passwords from ten addresses: the account's own limit must stop them
  let accountLocked = 0;
  for (let i = 0; i < 10; i += 1) {
    const res = await send("POST", "/api/auth/sign-in/email", {
      headers: { origin: ORIGIN },
      body: { email: victim, password: `wrong-${i}` },
      from: freshSource(),
    });
    if (res.status === 429) accountLocked += 1;
  }
  record(cat, `10 wrong passwords for one account from 10 addresses: ${accountLocked} refused`, accountLocked > 0, accountLocked);
  notes.push(`wrong passwords for one account from 10 addresses: ${accountLocked} of 10 answered 429`);
}

async function probeNulBytes(cookies) {
  const cat = "NUL bytes";
  const m = { cookie: cookies.manager, origin: ORIGIN };
  const tries = [
    ["GET", "/s/%00"],
    ["GET", "/s/kestrel%00works"],
    ["GET", "/desk/%00"],
    ["GET", `/desk/${K}/quotes?q=%00`, m],
    ["GET", `/desk/${K}/team?q=%00`, m],
    ["GET", `/desk/${K}/outbox?q=%00`, m],
    ["GET", `/desk/${K}/catalog?q=%00`, m],
    ["GET", `/desk/${K}/requests?status=%00`, m],
    ["GET", `/s/${K}/quotes/%00`, m],
    ["GET", "/sign-in?next=%00&shop=%00"],
    ["GET", "/api/v1/shops/%00/members", m],
    ["GET", `/api/v1/shops/${K}/members?q=%00`, m],
    ["GET", `/api/v1/shops/${K}/quotes?q=%00`, m],
    ["GET", `/api/v1/shops/${K}/attachments/%00`, m],
    ["GET", `/api/v1/shops/${K}/quotes/Q-%00/pdf`, m],
    ["POST", "/api/v1/shops/%00/arrangements", { body: { maxVoltage: 48, energy: 20000 } }],
    ["POST", `/api/v1/shops/${K}/arrangements`, { body: { maxVoltage: 48, energy: 20000, technology: "edlc\u0000" } }],
    ["POST", `/api/v1/shops/${K}/arrangements`, { body: { maxVoltage: 48, energy: 20000, "\u0000": 1 } }],
    ["POST", "/api/v1/networks/evaluate", { body: { network: { kind: "cell", id: "c\u0000", capacitance: 1, ratedVoltage: 2.7 } } }],
    ["POST", "/api/auth/sign-in/email", { headers: { origin: ORIGIN }, body: { email: "a\u0000@probe.example", password: "x\u0000" } }],
    [
      "POST",
      "/api/auth/sign-up/email",
      { headers: { origin: ORIGIN }, body: { name: "N\u0000", email: `n${Date.now()}\u0000@probe.example`, password: "long-enough-password" } },
    ],
    ["GET", `/desk/${K}`, { headers: { cookie: "better-auth.session_token=%00abc" } }],
    ["GET", `/api/v1/shops/${K}/members`, { headers: { cookie: "better-auth.session_token=a%00.b" } }],
  ];
  for (const [method, path, opts = {}] of tries) {
    const headers = opts.headers ?? (opts.cookie ? { cookie: opts.cookie, origin: ORIGIN } : {});
    const res = await send(method, path, { headers, body: opts.body, from: freshSource() });
    record(cat, `${method} ${path}${opts.body ? " " + JSON.stringify(opts.body).replace(/\\u0000/g, "\\0") : ""}`, res.status < 500, res.status);
  }
  // a file name with a NUL in a multipart upload
  const boundary = "probe-boundary";
  const pdf = "%PDF-1.4\n%%EOF\n";
  const body = `--${boundary}\r\ncontent-disposition: form-data; name="file"; filename="spec\u0000.pdf"\r\ncontent-type: application/pdf\r\n\r\n${pdf}\r\n--${boundary}--\r\n`;
  const up = await send("POST", `/api/v1/shops/${K}/attachments`, {
    headers: { cookie: cookies.customer, origin: ORIGIN, "content-type": `multipart/form-data; boundary=${boundary}` },
    body,
    from: freshSource(),
  });
  record(cat, "upload with a NUL in the file name", up.status < 500, up.status);
}

async function probeHeaders(cookies) {
  const cat = "headers and cross-origin writes";
  for (const path of ["/", `/s/${K}`, "/sign-in"]) {
    const res = await send("GET", path, { from: freshSource() });
    const csp = String(res.headers["content-security-policy"] ?? "");
    record(
      cat,
      `${path}: CSP with a script nonce`,
      /script-src[^;]*'nonce-[A-Za-z0-9+/=_-]{16,}'/.test(csp) && !/script-src[^;]*'unsafe-inline'/.test(csp),
      csp || "none",
    );
    record(cat, `${path}: frame-ancestors 'none'`, /frame-ancestors 'none'/.test(csp), csp || "none");
    record(cat, `${path}: X-Content-Type-Options`, res.headers["x-content-type-options"] === "nosniff", res.headers["x-content-type-options"]);
    record(cat, `${path}: Referrer-Policy`, Boolean(res.headers["referrer-policy"]), res.headers["referrer-policy"]);
    record(cat, `${path}: Permissions-Policy`, Boolean(res.headers["permissions-policy"]), res.headers["permissions-policy"]);
  }
  const boundary = "probe-boundary";
  const body = `--${boundary}\r\ncontent-disposition: form-data; name="file"; filename="spec.pdf"\r\ncontent-type: application/pdf\r\n\r\n%PDF-1.4\n%%EOF\n\r\n--${boundary}--\r\n`;
  for (const origin of ["https://evil.example", "null", `${BASE.protocol}//127.0.0.1.evil.example:${BASE.port}`]) {
    const res = await send("POST", `/api/v1/shops/${K}/attachments`, {
      headers: { cookie: cookies.customer, origin, "content-type": `multipart/form-data; boundary=${boundary}` },
      body,
      from: freshSource(),
    });
    record(cat, `upload with Origin ${origin}`, res.status === 403, res.status);
  }
}

async function probeEnumeration() {
  const cat = "account enumeration";
  const known = demoPeople[K].customers[0].email;
  const unknown = `nobody-${Date.now()}@probe.example`;
  const a = await send("POST", "/api/auth/sign-up/email", {
    headers: { origin: ORIGIN },
    body: { name: "Probe", email: known, password: "long-enough-password" },
    from: freshSource(),
  });
  const b = await send("POST", "/api/auth/sign-up/email", {
    headers: { origin: ORIGIN },
    body: { name: "Probe", email: unknown, password: "long-enough-password" },
    from: freshSource(),
  });
  record(cat, `sign-up over HTTP: known ${a.status} vs unknown ${b.status}`, a.status === b.status && !is2xx(b.status), `${a.status}/${b.status}`);
  const c = await send("POST", "/api/auth/request-password-reset", { headers: { origin: ORIGIN }, body: { email: known }, from: freshSource() });
  record(cat, "password-reset endpoint open", !is2xx(c.status), c.status);
}

/** The demo shops' ids and two member ids, read from the app's database. */
async function demoIds() {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    const shop = async (slug) => (await client.query("SELECT id FROM shops WHERE slug = $1", [slug])).rows[0]?.id;
    const member = async (slug, email) =>
      (
        await client.query("SELECT m.id FROM members m JOIN shops s ON s.id = m.shop_id JOIN users u ON u.id = m.user_id WHERE s.slug = $1 AND u.email = $2", [
          slug,
          email,
        ])
      ).rows[0]?.id;
    return {
      k: await shop(K),
      m: await shop(M),
      kManagerMember: await member(K, demoPeople[K].manager.email),
      kCustomer2Member: await member(K, demoPeople[K].customers[1].email),
    };
  } finally {
    await client.end();
  }
}

const ids = await demoIds();
const cookies = { manager: await signIn(demoPeople[K].manager.email), customer: await signIn(demoPeople[K].customers[0].email) };
await probeAuthPlugin(ids);
await probeNulBytes(cookies);
await probeHeaders(cookies);
await probeEnumeration();
await probeRateLimits();

let total = 0;
let refused = 0;
for (const [category, r] of results) {
  total += r.attempts;
  refused += r.refused;
  console.log(`${category}: ${r.attempts} attempts, ${r.refused} refused`);
  for (const t of r.through.slice(0, 8)) console.log(`    got through: ${t}`);
  if (r.through.length > 8) console.log(`    … and ${r.through.length - 8} more`);
}
console.log(`all: ${total} attempts, ${refused} refused`);
for (const n of notes) console.log(`note: ${n}`);
