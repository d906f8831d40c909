import { sql } from "drizzle-orm";
import { db } from "~/db/client.server";
import { takesFolderWritable } from "~/takes/takeFiles.server";
import { appVersion } from "~/server/version.server";

export async function loader() {
  let database: "ok" | "unavailable" = "ok";
  try {
    db().get(sql`select 1`);
  } catch {
    database = "unavailable";
  }
  // Uploads need to write take files: a read-only or missing volume is not healthy.
  const storage: "ok" | "not-writable" = (await takesFolderWritable()) ? "ok" : "not-writable";
  const ok = database === "ok" && storage === "ok";
  return Response.json(
    { app: "nearnote", version: appVersion(), database, storage },
    { status: ok ? 200 : 503, headers: { "Cache-Control": "no-store" } },
  );
}
