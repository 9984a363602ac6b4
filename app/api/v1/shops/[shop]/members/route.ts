import { listMembers } from "@/db/queries/members";
import { withShopApi } from "@/lib/auth/guards";
import { jsonError } from "@/lib/http/json-error";
import { memberListSchema } from "@/lib/validation/auth";

/** GET /api/v1/shops/{shop}/members — the team list for managers: { rows, total }. */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(request, shop, "team:read", async (ctx) => {
    const parsed = memberListSchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
    if (!parsed.success) {
      return jsonError(400, "Invalid query.", parsed.error.issues.map((i) => ({ path: i.path.join("."), message: i.message })));
    }
    const { rows, total } = await listMembers(ctx.shop.id, parsed.data);
    return Response.json({ rows, total });
  });
}
