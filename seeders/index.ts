import type { Sequelize } from "sequelize";
import type { Models } from "@/models";
import { seed as demoTeam } from "./01-demo-team";

export type SeedContext = { sequelize: Sequelize; models: Models };
export type Seeder = { name: string; demoOnly: boolean; seed: (ctx: SeedContext) => Promise<void> };

/** In order. Every seeder is idempotent, so `npm run db:seed` is safe to repeat. */
export const SEEDERS: Seeder[] = [{ name: "01-demo-team", demoOnly: true, seed: demoTeam }];

export async function runSeeders(ctx: SeedContext, options: { demo: boolean }): Promise<string[]> {
  const ran: string[] = [];
  for (const s of SEEDERS) {
    if (s.demoOnly && !options.demo) continue;
    await s.seed(ctx);
    ran.push(s.name);
  }
  return ran;
}
