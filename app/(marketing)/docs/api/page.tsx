import type { Metadata } from "next";
import Link from "next/link";
import { Logo } from "@/components/brand/logo";
import { signInCommand } from "@/lib/api/document";
import { env } from "@/lib/env";
import { SHOP_EVENT_LABELS, SHOP_EVENT_TYPES } from "@/lib/vocabulary";
import { VERIFY_SNIPPET, WEBHOOK_HEADERS } from "@/lib/webhooks/signature";
import { ApiReference } from "./_components/api-reference";

export const metadata: Metadata = { title: "API reference" };

const EXAMPLE_EVENT = {
  id: "6f1c2b7e-9a54-4c1e-8f0d-2b3a4c5d6e7f",
  type: "quote.accepted",
  createdAt: "2026-08-14T09:30:12.000Z",
  shop: "kestrel-bank-works",
  data: { quoteNumber: "Q-2026-0042", revision: 2 },
};

function Code({ children, label }: { children: string; label: string }) {
  return (
    <pre aria-label={label} tabIndex={0} className="overflow-x-auto rounded-md bg-ink-900 p-4 font-mono text-xs leading-relaxed text-ink-50">
      <code>{children}</code>
    </pre>
  );
}

/**
 * The API reference: what every route takes and answers (Swagger UI over the generated
 * description), how to sign in from a program, and how to receive and verify webhooks.
 */
export default function ApiDocsPage() {
  const origin = new URL(env.APP_URL).origin;
  return (
    <div>
      <header className="bg-ink-900 text-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-4 py-4">
          <Logo subtitle="API reference" />
          <nav className="flex flex-wrap items-center gap-4 text-sm">
            <a href="#webhooks" className="hover:underline">
              Webhooks
            </a>
            <a href="/api/v1/openapi.json" className="hover:underline">
              openapi.json
            </a>
            <Link href="/sign-in" className="hover:underline">
              Sign in
            </Link>
          </nav>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-6xl space-y-10 px-4 py-8">
        <section className="max-w-3xl space-y-3">
          <h1 className="text-3xl font-semibold tracking-tight">Build on Faradsmith</h1>
          <p className="text-ink-700">
            Size banks from your own design tools with the engine, search a shop&apos;s buildable arrangements, read its quotes, and have your ERP or stock
            system told when quotes and orders change. Every route below is generated from the same schemas the server checks requests and shapes answers with;
            the whole description is at{" "}
            <a className="font-medium text-copper-700 hover:underline" href="/api/v1/openapi.json">
              /api/v1/openapi.json
            </a>{" "}
            (OpenAPI 3.1) for your client generator.
          </p>
          <p className="text-sm text-ink-600">
            Routes under a shop need a member&apos;s session. From a program, sign in once and keep the cookie (the examples read it from{" "}
            <code>cookies.txt</code>):
          </p>
          <Code label="Signing in with curl">{signInCommand(origin)}</Code>
          <p className="text-sm text-ink-600">
            A shop&apos;s own systems can send an API key instead, as <code>Authorization: Bearer …</code>: the shop&apos;s manager creates it on the desk with
            the scopes it needs, and each operation below names the scope it asks for (the others take no key).
          </p>
          <p className="text-sm text-ink-600">
            The figures are engineering estimates; local electrical codes and licensed practice decide how a bank is built and handled.
          </p>
        </section>

        <ApiReference />

        <section id="webhooks" aria-labelledby="webhooks-title" className="max-w-3xl scroll-mt-6 space-y-4">
          <h2 id="webhooks-title" className="text-2xl font-semibold">
            Webhooks
          </h2>
          <p className="text-ink-700">
            A shop&apos;s manager registers endpoints on the desk (Webhooks), each with the events it takes and its own signing secret, shown once. When one of
            these happens, every active endpoint that takes it receives a <code>POST</code> with a JSON body:
          </p>
          <ul className="list-disc space-y-1 pl-6 text-sm">
            {SHOP_EVENT_TYPES.map((t) => (
              <li key={t}>
                <code>{t}</code> — {SHOP_EVENT_LABELS[t]}
              </li>
            ))}
          </ul>
          <Code label="A delivery's body">{JSON.stringify(EXAMPLE_EVENT, null, 2)}</Code>
          <h3 className="text-lg font-semibold">Headers</h3>
          <dl className="grid gap-x-4 gap-y-2 text-sm sm:grid-cols-[max-content_1fr]">
            <dt>
              <code>{WEBHOOK_HEADERS.eventId}</code>
            </dt>
            <dd>The event&apos;s stable id, the same on every attempt and every replay: store it and ignore an id you have already handled.</dd>
            <dt>
              <code>{WEBHOOK_HEADERS.eventType}</code>
            </dt>
            <dd>The event, as in the body.</dd>
            <dt>
              <code>{WEBHOOK_HEADERS.deliveryId}</code>
            </dt>
            <dd>This delivery (a replay from the log is a new delivery of the same event).</dd>
            <dt>
              <code>{WEBHOOK_HEADERS.timestamp}</code>
            </dt>
            <dd>Unix time, in seconds, of this attempt.</dd>
            <dt>
              <code>{WEBHOOK_HEADERS.signature}</code>
            </dt>
            <dd>
              <code>v1=</code> and the hexadecimal HMAC-SHA256, keyed with the endpoint&apos;s signing secret, of the timestamp, a full stop and the raw body:{" "}
              <code>{"<timestamp>.<body>"}</code>.
            </dd>
          </dl>
          <h3 className="text-lg font-semibold">Checking the signature (Node.js)</h3>
          <p className="text-sm text-ink-700">
            Compute the HMAC over the body exactly as received, before parsing it, compare in constant time, and refuse a timestamp more than five minutes away
            (an old request replayed):
          </p>
          <Code label="Signature check in Node.js">{VERIFY_SNIPPET}</Code>
          <h3 className="text-lg font-semibold">Answers, retries and limits</h3>
          <ul className="list-disc space-y-1 pl-6 text-sm text-ink-700">
            <li>Answer any 2xx within 10 seconds. Anything else, no answer, or a redirect (never followed) counts as a failure.</li>
            <li>
              A failed delivery is tried again after 30 s, then after waits that double up to 6 hours, 20 attempts in all (about three days). Delivery is at
              least once: the same event can arrive twice, so dedupe on its id.
            </li>
            <li>An endpoint whose every attempt has failed for three days is stopped, and the shop&apos;s managers get an e-mail.</li>
            <li>
              Endpoints must be public <code>http://</code> or <code>https://</code> addresses: names that resolve to loopback, private or link-local addresses
              are refused when the endpoint is saved and again on every delivery. Answers are read up to 64 KB.
            </li>
          </ul>
        </section>
      </main>
    </div>
  );
}
