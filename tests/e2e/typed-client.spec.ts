import { expect, test } from "./fixtures";
import { signIn } from "./helpers";

// a one-page PDF, judged by its content
const PDF = Buffer.from("%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj 2 0 obj<</Type/Pages/Kids[]/Count 0>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n");

test("the storefront uploads a drawing through the typed API client, and shows the route's refusal at the field", async ({ page }) => {
  await signIn(page, "joaquim.pellow@quenby-hoists.example");
  await page.goto("/s/kestrel-bank-works");
  const input = page.getByLabel("Drawings and specifications (optional)");
  await input.setInputFiles({ name: "hoist-outline.pdf", mimeType: "application/pdf", buffer: PDF });
  await expect(page.getByRole("list", { name: "Attached files" })).toContainText("hoist-outline.pdf");
  // a file that is not one of the accepted kinds: the route's own message, through the client
  await input.setInputFiles({ name: "notes.pdf", mimeType: "application/pdf", buffer: Buffer.from("just text, not a PDF") });
  await expect(page.getByText(/^notes\.pdf: Attach a PDF/)).toBeVisible();
  await expect(page.getByRole("list", { name: "Attached files" })).not.toContainText("notes.pdf");
});
