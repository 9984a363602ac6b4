"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { FormMessage, TextField } from "@/components/ui/field";
import { authClient } from "@/lib/auth/client";
import { signInSchema, type SignInInput } from "@/lib/validation/auth";

export function SignInForm({ next, shop }: { next?: string; shop?: string }) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<SignInInput>({ resolver: zodResolver(signInSchema), defaultValues: { email: "", password: "" } });

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const { error } = await authClient.signIn.email({ email: values.email, password: values.password });
    if (error) {
      setMessage(
        error.status === 401 || error.code === "INVALID_EMAIL_OR_PASSWORD"
          ? "That e-mail and password do not match an account."
          : (error.message ?? "Sign-in failed; try again."),
      );
      return;
    }
    router.push(next ?? (shop ? `/my-shops?shop=${shop}` : "/my-shops"));
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <TextField id="email" label="E-mail" type="email" autoComplete="email" error={formState.errors.email?.message} {...register("email")} />
      <TextField
        id="password"
        label="Password"
        type="password"
        autoComplete="current-password"
        error={formState.errors.password?.message}
        {...register("password")}
      />
      <FormMessage>{message}</FormMessage>
      <Button type="submit" disabled={formState.isSubmitting} className="w-full">
        {formState.isSubmitting ? "Signing in…" : "Sign in"}
      </Button>
      <p className="text-center text-sm text-ink-600">
        {shop ? (
          <>
            New here?{" "}
            <Link className="font-medium text-copper-700 hover:underline" href={`/s/${shop}/join`}>
              Create a customer account
            </Link>
          </>
        ) : (
          <>
            Running a shop?{" "}
            <Link className="font-medium text-copper-700 hover:underline" href="/open-shop">
              Open one
            </Link>
          </>
        )}
      </p>
    </form>
  );
}
