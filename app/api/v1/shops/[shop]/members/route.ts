import { listMembers } from "@/db/queries/members";
import { withShopApi } from "@/lib/auth/guards";
import { jsonError } from "@/lib/http/json-error";
import { memberList } from "@/lib/validation/lists";
import { listMembers as contract } from "@/lib/api/contracts/shops";

/** GET /api/v1/shops/{shop}/members — the team list for managers: { rows, total, page, size }; a bad query is a 400. */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(request, shop, "team:read", async (ctx) => {
    const { query, issues } = memberList.parse(new URL(request.url).searchParams);
    if (issues.length > 0) return jsonError(400, "Invalid query.", issues);
    return contract.answer(await listMembers(ctx.shop.id, query));
  });
}
