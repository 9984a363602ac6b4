import { z } from "zod";
import { API_KEY_SCOPES } from "../auth/api-key-scopes";
import { text } from "./text";

/** Making a key: a name people recognise and at least one scope. */
export const createApiKeySchema = z.object({
  name: text().trim().min(2, "Name the key after the system that uses it (at least 2 characters)").max(60, "Keep the name under 60 characters"),
  scopes: z.array(z.enum(API_KEY_SCOPES)).min(1, "Choose at least one scope").max(API_KEY_SCOPES.length),
});
export type CreateApiKeyInput = z.infer<typeof createApiKeySchema>;

export const revokeApiKeySchema = z.object({ id: z.string().uuid() });
