"use client";
import { useState, useTransition } from "react";
import { ASSIGNABLE_ROLES, type Role } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/vocabulary";
import { changeMemberRole } from "../actions";

export function RoleSelect({ shop, memberId, name, role }: { shop: string; memberId: string; name: string; role: Role }) {
  const [value, setValue] = useState(role);
  const [message, setMessage] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [pending, startTransition] = useTransition();
  const id = `role-${memberId}`;
  return (
    <div className="flex items-center gap-2">
      <label htmlFor={id} className="sr-only">
        Role of {name}
      </label>
      <select
        id={id}
        value={value}
        disabled={pending}
        className="rounded-md border border-ink-200 px-2 py-1 text-sm"
        onChange={(e) => {
          const next = e.target.value as Role;
          const previous = value;
          setValue(next);
          setMessage(null);
          startTransition(async () => {
            const r = await changeMemberRole(shop, { memberId, role: next });
            if (r.ok) setMessage({ tone: "ok", text: "Saved" });
            else {
              setValue(previous);
              setMessage({ tone: "error", text: r.message ?? "Not saved" });
            }
          });
        }}
      >
        {ASSIGNABLE_ROLES.map((r) => (
          <option key={r} value={r}>
            {ROLE_LABELS[r]}
          </option>
        ))}
      </select>
      {message ? (
        <span role="status" className={`text-xs ${message.tone === "ok" ? "text-charge-700" : "text-danger-700"}`}>
          {message.text}
        </span>
      ) : null}
    </div>
  );
}
