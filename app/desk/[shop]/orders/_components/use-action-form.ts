"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import type { ActionResult } from "@/lib/auth/guards";

/**
 * What every order form does with an action's result: field messages back on the fields, other
 * refusals in the form's message, success said in words and the page refreshed.
 */
export function useActionResult<F extends FieldValues>(setError: UseFormSetError<F>) {
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string } | null>(null);
  function take<T>(r: ActionResult<T>, success: (data: T) => string): boolean {
    if (r.ok) {
      setMessage({ tone: "info", text: success(r.data) });
      router.refresh();
      return true;
    }
    for (const [field, messages] of Object.entries(r.fieldErrors ?? {})) setError(field as Path<F>, { message: messages[0] });
    setMessage({ tone: "error", text: r.message ?? "Not saved." });
    return false;
  }
  return { message, setMessage, take };
}
