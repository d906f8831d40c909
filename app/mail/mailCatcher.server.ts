import { data } from "react-router";
import { SMTPServer } from "smtp-server";
import { env } from "~/server/env.server";
import { storeMessage } from "./mailStore.server";

export { readCaughtMail, readCaughtMessage, type CaughtMail } from "./mailStore.server";

/**
 * A local SMTP server for the demo and the tests: it accepts every message
 * sent to it on 127.0.0.1 and stores it under `dir`, nothing leaves the machine.
 */
export async function startMailCatcher({
  dir,
  host = "127.0.0.1",
  port = 0,
}: {
  dir: string;
  host?: string;
  port?: number;
}): Promise<{ port: number; url: string; close(): Promise<void> }> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    banner: "Nearnote mail catcher",
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (chunk: Buffer) => chunks.push(chunk));
      stream.on("error", callback);
      stream.on("end", () => {
        try {
          const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : "";
          storeMessage(dir, Buffer.concat(chunks), { from, to: session.envelope.rcptTo.map((r) => r.address) });
          callback();
        } catch (error) {
          callback(error as Error);
        }
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => resolve());
  });
  const address = server.server.address();
  const actualPort = typeof address === "object" && address ? address.port : port;
  return {
    port: actualPort,
    url: `smtp://${host}:${actualPort}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/**
 * The folder of caught mail for the /dev/mail pages. It exists only while the
 * catcher is in use (MAIL_CATCHER_DIR set by the demo and the tests); otherwise 404.
 */
export function caughtMailDir(): string {
  const dir = env().mailCatcherDir;
  if (!dir) throw data("Not found", { status: 404 });
  return dir;
}
