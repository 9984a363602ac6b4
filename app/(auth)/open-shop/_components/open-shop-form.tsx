"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { PASSWORD_MIN_LENGTH } from "@/lib/validation/limits";
import { FormMessage, SelectField, TextField } from "@/components/ui/field";
import { CURRENCY_NAMES, SHOP_CURRENCIES } from "@/lib/vocabulary";
import { openShopSchema, suggestSlug, type OpenShopInput } from "@/lib/validation/auth";
import { openShop } from "../actions";

export function OpenShopForm() {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const [slugEdited, setSlugEdited] = useState(false);
  const { register, handleSubmit, formState, setError, setValue } = useForm<OpenShopInput>({
    resolver: zodResolver(openShopSchema),
    defaultValues: { name: "", email: "", password: "", shopName: "", slug: "", currency: "EUR" },
  });

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const result = await openShop(values);
    if (result.ok) {
      router.push(`/desk/${result.data.slug}`);
      router.refresh();
      return;
    }
    for (const [field, messages] of Object.entries(result.fieldErrors ?? {})) {
      setError(field as keyof OpenShopInput, { message: messages[0] });
    }
    setMessage(result.message ?? "The shop could not be opened.");
  });

  const shopName = register("shopName");
  const slug = register("slug");
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <fieldset className="space-y-4">
        <legend className="text-sm font-semibold text-ink-700">You</legend>
        <TextField id="name" label="Your name" autoComplete="name" error={formState.errors.name?.message} {...register("name")} />
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
      </fieldset>
      <fieldset className="space-y-4">
        <legend className="text-sm font-semibold text-ink-700">Your shop</legend>
        <TextField
          id="shopName"
          label="Shop name"
          error={formState.errors.shopName?.message}
          {...shopName}
          onChange={(e) => {
            void shopName.onChange(e);
            if (!slugEdited) setValue("slug", suggestSlug(e.target.value));
          }}
        />
        <TextField
          id="slug"
          label="Web address"
          hint="Lowercase letters, digits and hyphens; your storefront will be at /s/your-address."
          error={formState.errors.slug?.message}
          {...slug}
          onChange={(e) => {
            setSlugEdited(true);
            void slug.onChange(e);
          }}
        />
        <SelectField id="currency" label="Currency for prices" error={formState.errors.currency?.message} {...register("currency")}>
          {SHOP_CURRENCIES.map((c) => (
            <option key={c} value={c}>
              {c} — {CURRENCY_NAMES[c]}
            </option>
          ))}
        </SelectField>
      </fieldset>
      <FormMessage>{message}</FormMessage>
      <Button type="submit" disabled={formState.isSubmitting} className="w-full">
        {formState.isSubmitting ? "Opening your shop…" : "Open the shop"}
      </Button>
    </form>
  );
}
