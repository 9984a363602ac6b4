import { POST as arrangementsRoute } from "@/app/api/v1/shops/[shop]/arrangements/route";
import { request } from "./helpers";

/** The public arrangements endpoint, called as a server calls it, for one shop and requirement. */
export function postArrangements(slug: string, requirement: unknown): Promise<Response> {
  return arrangementsRoute(
    request(`/api/v1/shops/${slug}/arrangements`, {
      method: "POST",
      body: JSON.stringify(requirement),
      headers: { "content-type": "application/json" },
    }),
    { params: Promise.resolve({ shop: slug }) },
  );
}
