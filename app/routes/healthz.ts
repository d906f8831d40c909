import { sql } from "drizzle-orm";
import { db } from "~/db/client.server";
import { appVersion } from "~/lib/version.server";

export async function loader() {
  let database: "ok" | "unavailable" = "ok";
  try {
    db().get(sql`select 1`);
  } catch {
    database = "unavailable";
  }
  return Response.json(
    { app: "nearnote", version: appVersion(), database },
    { status: database === "ok" ? 200 : 503, headers: { "Cache-Control": "no-store" } },
  );
}
