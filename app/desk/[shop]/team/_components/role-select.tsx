"use client";
import { useState, useTransition } from "react";
import { ASSIGNABLE_ROLES, type Role } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/vocabulary";
import { changeMemberRole } from "../actions";

/**
 * A member's role. Picking another role only proposes it (an arrow key on the select must not
 * promote anyone): the change is saved when confirmed, and "Keep" puts the select back.
 */
export function RoleSelect({ shop, memberId, name, role }: { shop: string; memberId: string; name: string; role: Role }) {
  const [saved, setSaved] = useState(role);
  const [value, setValue] = useState(role);
  const [message, setMessage] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [pending, startTransition] = useTransition();
  const id = `role-${memberId}`;
  const proposed = value !== saved;
  const confirm = () =>
    startTransition(async () => {
      const r = await changeMemberRole(shop, { memberId, role: value });
      if (r.ok) {
        setSaved(value);
        setMessage({ tone: "ok", text: "Saved" });
      } else {
        setValue(saved);
        setMessage({ tone: "error", text: r.message ?? "Not saved" });
      }
    });
  return (
    <div className="flex flex-wrap items-center gap-2">
      <label htmlFor={id} className="sr-only">
        Role of {name}
      </label>
      <select
        id={id}
        value={value}
        disabled={pending}
        className="rounded-md border border-ink-200 px-2 py-1 text-sm"
        onChange={(e) => {
          setValue(e.target.value as Role);
          setMessage(null);
        }}
      >
        {ASSIGNABLE_ROLES.map((r) => (
          <option key={r} value={r}>
            {ROLE_LABELS[r]}
          </option>
        ))}
      </select>
      {proposed ? (
        <span className="flex flex-wrap items-center gap-2 text-xs" data-testid="role-confirm">
          <span className="text-ink-700">
            Make {name} {ROLE_LABELS[value].toLowerCase()} instead of {ROLE_LABELS[saved].toLowerCase()}?
          </span>
          <button type="button" disabled={pending} onClick={confirm} className="rounded-md bg-copper-600 px-2 py-1 font-medium text-white hover:bg-copper-700">
            {pending ? "Saving…" : "Change role"}
          </button>
          <button
            type="button"
            disabled={pending}
            onClick={() => setValue(saved)}
            className="rounded-md px-2 py-1 text-ink-700 ring-1 ring-ink-200 hover:bg-ink-50"
          >
            Keep {ROLE_LABELS[saved].toLowerCase()}
          </button>
        </span>
      ) : null}
      {message ? (
        <span role="status" className={`text-xs ${message.tone === "ok" ? "text-charge-700" : "text-danger-700"}`}>
          {message.text}
        </span>
      ) : null}
    </div>
  );
}
