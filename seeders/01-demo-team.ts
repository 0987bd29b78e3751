import { hashPassword } from "@/lib/auth/password";
import type { SeedContext } from "./index";
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_TEAM, OTHER_TEAM } from "./demo-accounts";

/** Demo teams and one account per role. Safe to repeat: looks up before it creates. */
export async function seed({ models, sequelize }: SeedContext): Promise<void> {
  const { Team, User, Membership } = models;
  await sequelize.transaction(async (transaction) => {
    const teams: Record<string, number> = {};
    for (const t of [DEMO_TEAM, OTHER_TEAM]) {
      const [team] = await Team.findOrCreate({ where: { slug: t.slug }, defaults: t, transaction });
      teams[t.slug] = team.id;
    }
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    for (const account of DEMO_ACCOUNTS) {
      const [user] = await User.findOrCreate({
        where: { email: account.email },
        defaults: { email: account.email, name: account.name, passwordHash, isDemo: true },
        transaction,
      });
      await Membership.findOrCreate({
        where: { userId: user.id, teamId: teams[account.team] },
        defaults: { userId: user.id, teamId: teams[account.team], role: account.role },
        transaction,
      });
    }
  });
}
