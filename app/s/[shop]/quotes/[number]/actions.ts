"use server";
import { shopAction } from "@/lib/auth/guards";
import { openCheckout } from "@/lib/payments/checkout";
import { startCheckoutSchema } from "@/lib/validation/orders";

/**
 * "Accept and pay": the quote's own customer accepts the revision and is handed the Checkout
 * Session to pay it (the whole amount, the deposit or the balance). Acceptance itself is the
 * quote's life: lib/payments/checkout.ts marks the ACCEPTANCE SEAM where the accept move goes.
 */
export const startCheckout = shopAction(startCheckoutSchema, "quote:accept", async (ctx, input) => openCheckout(ctx, input));
