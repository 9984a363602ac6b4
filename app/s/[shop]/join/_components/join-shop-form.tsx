"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { PASSWORD_MIN_LENGTH } from "@/lib/validation/limits";
import { FormMessage, TextField } from "@/components/ui/field";
import { joinShopSchema, type JoinShopInput } from "@/lib/validation/auth";
import { joinShop } from "../actions";

export function JoinShopForm({ slug, signedInAs, next }: { slug: string; signedInAs: string | null; next?: string }) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const { register, handleSubmit, formState, setError } = useForm<JoinShopInput>({
    resolver: zodResolver(joinShopSchema),
    defaultValues: { name: "", email: "", password: "", company: "" },
  });

  async function submit(values: JoinShopInput | null) {
    setMessage(null);
    const result = await joinShop(slug, values);
    if (result.ok) {
      router.push(next ?? `/s/${slug}`);
      router.refresh();
      return;
    }
    for (const [field, messages] of Object.entries(result.fieldErrors ?? {})) setError(field as keyof JoinShopInput, { message: messages[0] });
    setMessage(result.message ?? "Your account could not be created.");
  }

  if (signedInAs) {
    return (
      <div className="space-y-4">
        <p className="text-sm text-ink-700">
          You are signed in as <strong>{signedInAs}</strong>.
        </p>
        <FormMessage>{message}</FormMessage>
        <Button
          type="button"
          disabled={busy}
          className="w-full"
          onClick={async () => {
            setBusy(true);
            await submit(null);
            setBusy(false);
          }}
        >
          Join as a customer
        </Button>
      </div>
    );
  }

  return (
    <form onSubmit={handleSubmit(submit)} noValidate className="space-y-4">
      <TextField id="name" label="Your name" autoComplete="name" error={formState.errors.name?.message} {...register("name")} />
      <TextField id="company" label="Company (optional)" autoComplete="organization" error={formState.errors.company?.message} {...register("company")} />
      <TextField id="email" label="E-mail" type="email" autoComplete="email" error={formState.errors.email?.message} {...register("email")} />
      <TextField
        id="password"
        label="Password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN_LENGTH} characters.`}
        error={formState.errors.password?.message}
        {...register("password")}
      />
      <FormMessage>{message}</FormMessage>
      <Button type="submit" disabled={formState.isSubmitting} className="w-full">
        {formState.isSubmitting ? "Creating your account…" : "Create my account"}
      </Button>
      <p className="text-center text-sm text-ink-600">
        Have an account?{" "}
        <Link href={`/sign-in?shop=${slug}&next=${encodeURIComponent(next ?? `/s/${slug}/join`)}`} className="font-medium text-copper-700 hover:underline">
          Sign in
        </Link>
      </p>
    </form>
  );
}
