import { z } from "zod";
import { ASSIGNABLE_ROLES } from "@/lib/auth/permissions";
import { text } from "./text";

export const MIN_PASSWORD = 10;
export const RESERVED_SLUGS = ["api", "desk", "s", "admin", "sign-in", "sign-up", "open-shop", "new", "settings", "faradsmith"];

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

export const slugSchema = z.string().superRefine((value, ctx) => {
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
  .min(MIN_PASSWORD, `At least ${MIN_PASSWORD} characters.`)
  .max(128, "At most 128 characters.");

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
  currency: z.enum(["EUR", "USD", "GBP", "CHF", "JPY", "KWD"], { message: "Choose a currency." }),
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
export type ChangeMemberRoleInput = z.infer<typeof changeMemberRoleSchema>;

export const memberListSchema = z.object({
  q: text().trim().max(100).optional().default(""),
  role: z.enum(["all", "manager", "estimator", "customer"]).optional().default("all"),
  sort: z.enum(["name", "email", "role", "joined"]).optional().default("name"),
  dir: z.enum(["asc", "desc"]).optional().default("asc"),
  page: z.coerce.number().int().min(1).optional().default(1),
  size: z.coerce.number().int().min(5).max(100).optional().default(20),
});
export type MemberListQuery = z.infer<typeof memberListSchema>;
