import { eq } from 'drizzle-orm';
import { user } from './platform/auth/schema';
import type { AppDeps } from './app-deps';
import { demoAccounts, demoPassword } from './areas/accounts/index';
import { seeders as defaultSeeders, type DemoSeeder } from './demo-seeders';

/** Create the demo accounts (if missing), then run every area seeder in order. */
export async function seedDemo(deps: AppDeps, seeders: DemoSeeder[] = defaultSeeders): Promise<void> {
  for (const account of demoAccounts) {
    if (deps.db.select({ id: user.id }).from(user).where(eq(user.email, account.email)).get()) continue;
    await deps.auth.api.createUser({
      body: { email: account.email, password: demoPassword, name: account.name, role: account.role, data: { emailVerified: true } },
    });
  }
  for (const seeder of seeders) {
    const t0 = Date.now();
    try {
      await seeder.seed(deps);
    } catch (err) {
      throw new Error(`demo seeder "${seeder.name}" failed: ${err instanceof Error ? err.message : String(err)}`, { cause: err });
    }
    deps.log.debug(`demo seeder ${seeder.name}: ${Date.now() - t0} ms`);
  }
}
