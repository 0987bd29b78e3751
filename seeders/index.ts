import type { Sequelize } from "sequelize";
import type { Models } from "@/models";
import { seed as demoTeam } from "./01-demo-team";
import { seed as referenceLibrary } from "./02-reference-library";
import { seed as demoLibrary } from "./03-demo-library";
import { seed as demoCases } from "./04-demo-cases";

export type SeedContext = { sequelize: Sequelize; models: Models };
export type Seeder = { name: string; demoOnly: boolean; seed: (ctx: SeedContext) => Promise<void> };

/** In order. Every seeder is idempotent, so `npm run db:seed` is safe to repeat. */
export const SEEDERS: Seeder[] = [
  { name: "01-demo-team", demoOnly: true, seed: demoTeam },
  { name: "02-reference-library", demoOnly: false, seed: referenceLibrary },
  { name: "03-demo-library", demoOnly: true, seed: demoLibrary },
  { name: "04-demo-cases", demoOnly: true, seed: demoCases },
];

export async function runSeeders(ctx: SeedContext, options: { demo: boolean }): Promise<string[]> {
  const ran: string[] = [];
  for (const s of SEEDERS) {
    if (s.demoOnly && !options.demo) continue;
    await s.seed(ctx);
    ran.push(s.name);
  }
  return ran;
}
