import "server-only";
import { sql } from "drizzle-orm";
import { db } from "@/db";

/**
 * Whether the app's own connection escapes row-level security: a superuser, a role with BYPASSRLS,
 * or the owner of a table (the policies are forced on owners too, but an owner can lift them).
 */
export async function appRoleEscapesRowSecurity(): Promise<{ escapes: boolean; role: string }> {
  const { rows } = await db.execute<{ role: string; escapes: boolean }>(
    sql`select current_user as role,
          (r.rolsuper or r.rolbypassrls or exists (select 1 from pg_tables t where t.schemaname = 'public' and t.tableowner = current_user)) as escapes
        from pg_roles r where r.rolname = current_user`,
  );
  return { role: rows[0]?.role ?? "?", escapes: rows[0]?.escapes ?? true };
}
