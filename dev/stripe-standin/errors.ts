/**
 * Errors in Stripe's shape: `{ error: { type, code?, decline_code?, param?, message } }` with the
 * HTTP status Stripe uses for the type (400 invalid_request_error and idempotency_error, 401 for a
 * missing or wrong key, 402 card_error, 404 resource_missing). Messages follow the real API's
 * wording where it is known (recalled from the API's answers, not from a published list).
 */

export type ErrorType = "invalid_request_error" | "idempotency_error" | "card_error" | "api_error";

export interface ErrorBody {
  type: ErrorType;
  message: string;
  code?: string;
  decline_code?: string;
  param?: string;
  payment_intent?: unknown;
  charge?: string;
}

export class StripeApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ErrorBody,
    /**
     * Parameter-validation errors happen before the endpoint starts work: Stripe keeps no
     * idempotent result for them, so a retry with the same key is judged afresh.
     */
    readonly beforeExecution = false,
  ) {
    super(body.message);
  }
}

/** A parameter refused before the endpoint ran (400, not remembered under the idempotency key). */
export function paramError(message: string, param: string | undefined, code?: string): StripeApiError {
  return new StripeApiError(400, { type: "invalid_request_error", message, ...(param ? { param } : {}), ...(code ? { code } : {}) }, true);
}

export function missingParam(param: string): StripeApiError {
  return paramError(`Missing required param: ${param}.`, param, "parameter_missing");
}

/** 404 for an id that does not exist; `param` is the path parameter's name, as Stripe reports it. */
export function noSuch(objectName: string, id: string, param: string): StripeApiError {
  return new StripeApiError(404, { type: "invalid_request_error", code: "resource_missing", param, message: `No such ${objectName}: '${id}'` });
}

/** A request that is well-formed but not allowed in the object's state (remembered under the key). */
export function stateError(message: string, code?: string, param?: string): StripeApiError {
  return new StripeApiError(400, { type: "invalid_request_error", message, ...(code ? { code } : {}), ...(param ? { param } : {}) });
}

export function errorJson(body: ErrorBody): string {
  return JSON.stringify({ error: body }, null, 2);
}
