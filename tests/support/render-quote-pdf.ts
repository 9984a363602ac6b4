/**
 * `tsx --tsconfig tests/support/tsconfig.render.json tests/support/render-quote-pdf.ts SHOP_ID REVISION_ID OUT.pdf`:
 * renders one quote revision's PDF with the app's own code from the database in DATABASE_URL.
 * Lets a test render the same quote from two databases (for example a restored backup).
 */
import fs from "node:fs";
import { loadQuotePdf } from "@/lib/quoting/quote-pdf-loader";

const [shopId, revisionId, out] = process.argv.slice(2);
if (!shopId || !revisionId || !out) throw new Error("usage: render-quote-pdf.ts SHOP_ID REVISION_ID OUT.pdf");
const { buffer } = await loadQuotePdf(shopId, revisionId);
fs.writeFileSync(out, buffer);
process.exit(0);
