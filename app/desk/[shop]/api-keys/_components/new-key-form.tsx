"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { FormMessage, TextField } from "@/components/ui/field";
import { API_KEY_SCOPES, API_KEY_SCOPE_LABELS } from "@/lib/auth/api-key-scopes";
import { createApiKeySchema, type CreateApiKeyInput } from "@/lib/validation/api-keys";
import { createApiKey } from "../actions";

/** Make a key: a name and its scopes; the secret is shown once, here, and never again. */
export function NewKeyForm({ shop }: { shop: string }) {
  const router = useRouter();
  const form = useForm<CreateApiKeyInput>({
    resolver: zodResolver(createApiKeySchema),
    defaultValues: { name: "", scopes: ["catalog:read"] },
    mode: "onTouched",
  });
  const [made, setMade] = useState<{ name: string; secret: string } | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [busy, start] = useTransition();
  const errors = form.formState.errors;

  const onSubmit = form.handleSubmit((values) =>
    start(async () => {
      setMessage(null);
      const r = await createApiKey(shop, values);
      if (!r.ok) {
        for (const [k, v] of Object.entries(r.fieldErrors ?? {})) form.setError(k as keyof CreateApiKeyInput, { message: v[0] });
        setMessage(r.message ?? "Not made.");
        return;
      }
      setMade({ name: r.data.name, secret: r.data.secret });
      form.reset({ name: "", scopes: ["catalog:read"] });
      router.refresh();
    }),
  );

  return (
    <section className="space-y-4 rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="new-key-title">
      <h2 id="new-key-title" className="text-lg font-semibold">
        New key
      </h2>
      {made ? (
        <div role="status" className="space-y-2 rounded-md border-l-4 border-hazard-500 bg-hazard-100 p-3 text-sm" data-testid="new-key-secret">
          <p className="font-medium">The secret of “{made.name}”. Copy it now: it is shown only this once, and the shop keeps only a fingerprint of it.</p>
          <code className="block break-all rounded bg-white px-2 py-1.5 font-mono text-xs">{made.secret}</code>
          <p>
            Send it as <span className="font-mono">Authorization: Bearer …</span> with each request.
          </p>
        </div>
      ) : null}
      <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="New API key">
        <TextField
          id="name"
          label="Name"
          placeholder="Stock system"
          hint="Name it after the system that will use it."
          error={errors.name?.message}
          {...form.register("name")}
        />
        <fieldset className="space-y-1" aria-describedby={errors.scopes ? "scopes-error" : "scopes-hint"}>
          <legend className="text-sm font-medium text-ink-800">Scopes</legend>
          {API_KEY_SCOPES.map((s) => (
            <label key={s} className="flex items-start gap-2 text-sm">
              <input type="checkbox" value={s} className="mt-1" {...form.register("scopes")} />
              <span>
                <span className="font-mono text-xs">{s}</span> — {API_KEY_SCOPE_LABELS[s]}
              </span>
            </label>
          ))}
          {errors.scopes ? (
            <p id="scopes-error" role="alert" className="text-xs font-medium text-danger-700">
              {errors.scopes.message}
            </p>
          ) : (
            <p id="scopes-hint" className="text-xs text-ink-500">
              Give a key only what its system needs; a key with catalog:read cannot change anything.
            </p>
          )}
        </fieldset>
        {message ? <FormMessage>{message}</FormMessage> : null}
        <Button type="submit" disabled={busy}>
          {busy ? "Making…" : "Make the key"}
        </Button>
      </form>
    </section>
  );
}
