// npm run seed: creates the invented demo studio (idempotent).
import { db } from "~/db/client.server";
import { seedDemoTakes } from "./lib/seedTakes";
import { DEMO_PASSWORD, DEMO_STUDENTS, DEMO_TEACHER, seedDemoStudio } from "~/models/demoStudio.server";

export async function seed() {
  const result = await seedDemoStudio(db());
  console.log(result.created ? "Seeded the demo studio Tidewater Keys." : "The demo studio is already there.");
  const takes = await seedDemoTakes(db(), result.studioId);
  if (takes > 0) console.log(`Added ${takes} analysed demo takes over twelve weeks.`);
  return result;
}

export function printDemoSignIns() {
  console.log(`Demo sign-ins (password for all: ${DEMO_PASSWORD}):`);
  console.log(`  teacher  ${DEMO_TEACHER.email}`);
  for (const s of DEMO_STUDENTS) console.log(`  student  ${s.email}`);
}

if (import.meta.url === `file://${process.argv[1]}`) {
  await seed();
  printDemoSignIns();
}
