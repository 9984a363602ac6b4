import type { Resolver } from "react-hook-form";
import { requestFormSchema } from "@/lib/validation/request-form-schema";
import type { RequestFormOutput, RequestFormValues } from "@/lib/validation/request-form";
import { zodResolver } from "@/lib/validation/zod-resolver";

/** The request form's checks: loaded by storefront-journey.tsx on the first check. */
export const requestFormResolver: Resolver<RequestFormValues, unknown, RequestFormOutput> = zodResolver(requestFormSchema);
