import type { Metadata } from "next";
import localFont from "next/font/local";
import { connection } from "next/server";
import { BrowserZod } from "@/components/providers/browser-zod";
import "./globals.css";

// Plex Sans is the text of every page: one variable file (latin, as @fontsource-variable ships it)
// holds every weight the pages use (400 text, 500 and 600 labels and headings, 700 table headers
// and strong text) in half the bytes of four single-weight files; preloaded, shown with `swap` over
// a metric-matched fallback.
const plexSans = localFont({
  src: "./fonts/plex-sans-variable.woff2",
  weight: "100 700",
  variable: "--font-plex-sans",
  display: "swap",
});
const plexMono = localFont({
  src: [
    { path: "./fonts/plex-mono-400.woff2", weight: "400" },
    { path: "./fonts/plex-mono-500.woff2", weight: "500" },
  ],
  variable: "--font-plex-mono",
  display: "swap",
  // a few figures and codes, mostly below the fold: fetched when text needs it, not ahead of the page
  preload: false,
});

export const metadata: Metadata = {
  title: { default: "Faradsmith — capacitor banks, designed and quoted", template: "%s · Faradsmith" },
  description: "Custom capacitor banks designed from your shop's catalog, priced by your rules, quoted in minutes.",
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page renders per request: its scripts carry this request's CSP nonce (proxy.ts), which a
  // page prerendered at build time could not.
  await connection();
  return (
    <html lang="en" className={`${plexSans.variable} ${plexMono.variable}`}>
      <body className="min-h-screen font-sans">
        <a
          href="#main"
          className="sr-only rounded-md bg-white px-4 py-2 text-sm font-medium text-ink-900 shadow focus:not-sr-only focus:fixed focus:left-3 focus:top-3 focus:z-50"
        >
          Skip to content
        </a>
        <BrowserZod />
        {children}
      </body>
    </html>
  );
}
