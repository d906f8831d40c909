// npm run digest: send the teachers' digests and the due-date reminders now, by hand. The
// digest's usual hour is skipped; what was already sent today is not sent again.
import { db } from "~/db/client.server";
import { runScheduledMail } from "~/models/digest.server";
import { loadEnvOrExit } from "./lib/runApp";

loadEnvOrExit();
db();
const result = await runScheduledMail(new Date(), { anyHour: true });
console.log(`Sent ${result.digests} digest(s) and ${result.reminders} due-date reminder(s).`);
