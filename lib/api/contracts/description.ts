import { z } from "zod";
import { defineRoute } from "@/lib/api/contract";

export const openApiDescription = defineRoute({
  method: "GET",
  path: "/api/v1/openapi.json",
  operationId: "getOpenApiDescription",
  tag: "Description",
  summary: "This description (OpenAPI 3.1)",
  description:
    "The OpenAPI 3.1 description of every route on this page, generated from the schemas the server validates requests and shapes answers with. Feed it to a client generator.",
  access: "public",
  ok: {
    status: 200,
    description: "An OpenAPI 3.1 document.",
    json: z.looseObject({
      openapi: z.string().startsWith("3.1"),
      info: z.looseObject({ title: z.string(), version: z.string() }),
      paths: z.record(z.string(), z.unknown()),
    }),
  },
  errors: {},
  examples: [{ title: "Download the description" }],
});
