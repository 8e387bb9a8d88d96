import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoAccounts, demoPassword } from '../../../server/areas/accounts/demo-accounts';
import { publicConfigResponseSchema } from '../../../shared/contracts/auth';
import { createTestApp, type TestApp } from '../helpers/test-app';

// The demo accounts of product.md ("Demo accounts"): created and shown only in demo mode.
let demo: TestApp;
let plain: TestApp;
const seen: string[] = [];
beforeAll(async () => {
  demo = await createTestApp({ demo: { seeders: [{ name: 'probe', seed: () => void seen.push('probe') }] } });
  plain = await createTestApp();
});
afterAll(async () => {
  await demo.close();
  await plain.close();
});

describe('demo mode', () => {
  it('lists the four demo accounts and the password on the public config', async () => {
    const cfg = publicConfigResponseSchema.parse((await request(demo.app).get('/api/public/config').expect(200)).body);
    expect(cfg.demo).toBe(true);
    expect(cfg.demoPassword).toBe('squarewright-demo');
    expect(cfg.demoAccounts?.map((a) => a.email).sort()).toEqual([
      'admin@demo.squarewright.test',
      'editor@demo.squarewright.test',
      'printer@demo.squarewright.test',
      'setter@demo.squarewright.test',
    ]);
    expect(seen).toEqual(['probe']);
  });

  it.each(demoAccounts.map((a) => [a.role, a.email] as const))('the %s demo account signs in', async (role, email) => {
    const agent = request.agent(demo.app);
    await agent.post('/api/auth/sign-in/email').send({ email, password: demoPassword }).expect(200);
    expect((await agent.get('/api/me').expect(200)).body.user.role).toBe(role);
  });

  it('outside demo mode, no demo values are shown and no demo accounts exist', async () => {
    const res = await request(plain.app).get('/api/public/config').expect(200);
    expect(res.body).toEqual({ demo: false });
    await request(plain.app).post('/api/auth/sign-in/email').send({ email: 'admin@demo.squarewright.test', password: demoPassword }).expect(401);
  });
});
