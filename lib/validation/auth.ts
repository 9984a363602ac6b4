import { z } from "zod";
import { ASSIGNABLE_ROLES } from "@/lib/auth/permissions";
import { SHOP_CURRENCIES } from "@/lib/vocabulary";
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from "./limits";
import { text } from "./text";

const RESERVED_SLUGS = ["api", "desk", "s", "admin", "sign-in", "sign-up", "open-shop", "new", "settings", "faradsmith"];

/** Why a slug is unusable, or null when it is fine. Shared by the form and the server. */
export function slugProblem(slug: string): string | null {
  if (slug.length === 0) return "Choose a web address for your shop.";
  if (/\s/.test(slug)) return "No spaces: use lowercase letters, digits and hyphens, e.g. north-coast-banks.";
  if (/[A-Z]/.test(slug)) return "Use lowercase letters only.";
  if (!/^[a-z0-9-]+$/.test(slug)) return "Use lowercase letters, digits and hyphens only.";
  if (slug.length < 3) return "At least 3 characters.";
  if (slug.length > 40) return "At most 40 characters.";
  if (slug.startsWith("-") || slug.endsWith("-")) return "Cannot start or end with a hyphen.";
  if (slug.includes("--")) return "No double hyphens.";
  if (RESERVED_SLUGS.includes(slug)) return "That address is reserved; choose another.";
  return null;
}

const slugSchema = z.string().superRefine((value, ctx) => {
  const problem = slugProblem(value);
  if (problem) ctx.addIssue({ code: "custom", message: problem });
});

/** Suggests a slug from a shop name: "Kestrel Bank Works" → "kestrel-bank-works". */
export function suggestSlug(name: string): string {
  return name
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 40)
    .replace(/-+$/g, "");
}

const name = text().trim().min(2, "Enter your name (at least 2 characters).").max(80, "At most 80 characters.");
const email = text().trim().toLowerCase().pipe(z.email("Enter an e-mail address like name@example.com."));
const password = text()
  .min(PASSWORD_MIN_LENGTH, `At least ${PASSWORD_MIN_LENGTH} characters.`)
  .max(PASSWORD_MAX_LENGTH, `At most ${PASSWORD_MAX_LENGTH} characters.`);

export const signInSchema = z.object({
  email,
  password: text().min(1, "Enter your password."),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const openShopSchema = z.object({
  name,
  email,
  password,
  shopName: text().trim().min(2, "Enter the shop's name (at least 2 characters).").max(80, "At most 80 characters."),
  slug: slugSchema,
  currency: z.enum(SHOP_CURRENCIES, { message: "Choose a currency." }),
});
export type OpenShopInput = z.infer<typeof openShopSchema>;

export const joinShopSchema = z.object({
  name,
  email,
  password,
  company: text().trim().max(120, "At most 120 characters.").optional(),
});
export type JoinShopInput = z.infer<typeof joinShopSchema>;

export const changeMemberRoleSchema = z.object({
  memberId: text().min(1, "Which member?"),
  role: z.enum(ASSIGNABLE_ROLES, { message: "Choose estimator or customer." }),
});
