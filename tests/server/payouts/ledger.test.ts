import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ZodError } from 'zod';
import { formatMoney, ledgerCorrectionResponseSchema, statementSchema, toDecimalString } from '../../../shared/contracts/ledger';
import { earningsSchema, payoutsOverviewSchema } from '../../../shared/contracts/payouts';
import { ledgerEntry } from '../../../server/schema';
import { listEntries, owedBalances, recordPublicationFees } from '../../../server/areas/payouts/ledger';
import { closeMonth } from '../../../server/areas/payouts/payouts';
import { createMoneyTestApp, type MoneyTestApp } from './money-test-app';

let t: MoneyTestApp;
beforeAll(async () => {
  t = await createMoneyTestApp();
});
afterAll(async () => {
  await t.closeAll();
});

describe('fees on publish (recordPublicationFees)', () => {
  it('writes one entry per printed puzzle, and a repeat of the publish step adds nothing', async () => {
    const setter = await t.createUser('setter', { email: 'fees@test.squarewright.test' });
    const input = {
      editionId: 'ed-2026-11-21',
      publicationId: 'saturday-quadrant',
      date: '2026-11-21',
      entries: [
        { puzzleId: 'pz-1', setterId: setter, kind: 'assembly' as const, amountMinor: 2500, currency: 'GBP' },
        { puzzleId: 'pz-2', setterId: setter, kind: 'deduction' as const, amountMinor: 3000, currency: 'GBP' },
      ],
    };
    const first = t.db.transaction((tx) => recordPublicationFees(tx, input));
    const again = t.db.transaction((tx) => recordPublicationFees(tx, input));
    expect(first).toHaveLength(2);
    expect(again).toHaveLength(0);
    expect(listEntries(t.db, setter).map((e) => [e.puzzleId, e.amountMinor, e.date])).toEqual([
      ['pz-1', 2500, '2026-11-21'],
      ['pz-2', 3000, '2026-11-21'],
    ]);
  });

  it('rolls back with the publish transaction: no fee without a published edition', async () => {
    const setter = await t.createUser('setter', { email: 'rollback@test.squarewright.test' });
    expect(() =>
      t.db.transaction((tx) => {
        recordPublicationFees(tx, { editionId: 'ed-x', publicationId: 'p', date: '2026-11-28', entries: [{ puzzleId: 'pz-9', setterId: setter, kind: 'assembly', amountMinor: 100, currency: 'GBP' }] });
        throw new Error('publish step failed after the fees');
      }),
    ).toThrow('publish step failed');
    expect(listEntries(t.db, setter)).toEqual([]);
  });

  it('refuses bad input, naming where: decimals, lower-case currency, a puzzle twice', () => {
    const bad = (entries: unknown[]) => () => t.db.transaction((tx) => recordPublicationFees(tx, { editionId: 'e', publicationId: 'p', date: '2026-11-28', entries } as never));
    const entry = { puzzleId: 'a', setterId: 's', kind: 'assembly', amountMinor: 100, currency: 'GBP' };
    expect(bad([{ ...entry, amountMinor: 12.5 }])).toThrow(ZodError);
    try {
      bad([{ ...entry, currency: 'gbp' }])();
    } catch (error) {
      expect((error as ZodError).issues[0]?.path).toEqual(['entries', 0, 'currency']);
    }
    try {
      bad([entry, entry])();
    } catch (error) {
      expect((error as ZodError).issues[0]?.path).toEqual(['entries', 1, 'puzzleId']);
    }
    expect.assertions(3);
  });
});

describe('corrections', () => {
  it('are new entries with a reason; the original stays as it was', async () => {
    const editor = await t.signInAs('editor');
    const setter = await t.createUser('setter', { email: 'corr@test.squarewright.test', name: 'Corr Setter' });
    t.seedFees(setter, [2000], { date: '2026-10-03' });
    const [fee] = listEntries(t.db, setter);
    const res = await editor.post('/api/ledger/corrections').send({ setterId: setter, amountMinor: -500, currency: 'GBP', reason: 'Fee rate was the old one', correctsEntryId: fee?.id, date: '2026-10-05' }).expect(201);
    const { entry } = ledgerCorrectionResponseSchema.parse(res.body);
    expect(entry).toMatchObject({ kind: 'correction', amountMinor: -500, correctsEntryId: fee?.id });
    expect(listEntries(t.db, setter).find((e) => e.id === fee?.id)?.amountMinor).toBe(2000);
    expect(owedBalances(t.db, setter)).toEqual([{ setterId: setter, currency: 'GBP', owedMinor: 1500 }]);
    const overview = payoutsOverviewSchema.parse((await editor.get('/api/payouts').expect(200)).body);
    expect(overview.owed.find((o) => o.setterId === setter)?.owedMinor).toBe(1500);
  });

  it('refuses a correction without a reason, in a decimal, or for someone who is not a setter', async () => {
    const editor = await t.signInAs('editor');
    const setter = await t.createUser('setter', { email: 'corr2@test.squarewright.test' });
    const noReason = await editor.post('/api/ledger/corrections').send({ setterId: setter, amountMinor: 100, currency: 'GBP' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.details).toContainEqual(expect.objectContaining({ path: 'body.reason' }));
    const decimal = await editor.post('/api/ledger/corrections').send({ setterId: setter, amountMinor: 1.5, currency: 'GBP', reason: 'rounding' });
    expect(decimal.status).toBe(400);
    expect(decimal.body.error.message).toContain('body.amountMinor');
    const printer = await t.createUser('printer');
    const notSetter = await editor.post('/api/ledger/corrections').send({ setterId: printer, amountMinor: 100, currency: 'GBP', reason: 'oops' });
    expect(notSetter.status).toBe(400);
    const count = t.db.select({ id: ledgerEntry.id }).from(ledgerEntry).all().length;
    await editor.post('/api/ledger/corrections').send({ setterId: randomUUID(), amountMinor: 100, currency: 'GBP', reason: 'nobody' }).expect(404);
    expect(t.db.select({ id: ledgerEntry.id }).from(ledgerEntry).all().length).toBe(count);
  });
});

describe('monthly statements', () => {
  it('shows a month on screen and as CSV (RFC 4180 quoting, exact decimals, a total row)', async () => {
    const { agent, id: setter } = await t.newSetter('Statement Setter', 'stmt@test.squarewright.test');
    t.seedFees(setter, [2500, 1205], { date: '2026-09-12' });
    t.seedFees(setter, [999], { date: '2026-10-01' });
    const editor = await t.signInAs('editor');
    await editor.post('/api/ledger/corrections').send({ setterId: setter, amountMinor: -5, currency: 'GBP', reason: '=SUM(A1), "typo"', date: '2026-09-30' }).expect(201);

    const screen = statementSchema.parse((await agent.get('/api/earnings/statements/2026-09').expect(200)).body);
    expect(screen.entries).toHaveLength(3);
    expect(screen.totals).toEqual([{ currency: 'GBP', amountMinor: 3700 }]);

    const csv = await agent.get('/api/earnings/statements/2026-09.csv').expect(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    expect(csv.headers['content-disposition']).toContain('squarewright-statement-2026-09.csv');
    const lines = csv.text.trimEnd().split('\r\n');
    expect(lines[0]).toBe('date,kind,description,edition,publication,puzzle,puzzle_kind,currency,amount,amount_minor');
    expect(lines).toHaveLength(5);
    expect(lines[1]).toMatch(/,GBP,25\.00,2500$/);
    expect(lines[2]).toMatch(/,GBP,12\.05,1205$/);
    // RFC 4180: a field with a comma or quote is quoted and quotes doubled; a leading "=" is
    // defused so a spreadsheet shows text (common practice against formula injection).
    expect(lines[3]).toContain('"Correction: =SUM(A1), ""typo"""');
    expect(lines[3]).toMatch(/,GBP,-0\.05,-5$/);
    expect(lines[4]).toMatch(/^,total,Total for 2026-09,,,,,GBP,37\.00,3700$/);

    const earnings = earningsSchema.parse((await agent.get('/api/earnings').expect(200)).body);
    expect(earnings.statements.map((s) => s.month)).toEqual(['2026-10', '2026-09']);
    await agent.get('/api/earnings/statements/2026-13').expect(400);
  });

  it('mails the statement through the outbox, and a month close mails each setter once', async () => {
    const { agent, id: setter, email } = await t.newSetter('Mail Setter', 'mailme@test.squarewright.test');
    t.seedFees(setter, [1800], { date: '2026-08-20' });
    const sent = await agent.post('/api/earnings/statements/2026-08/send').expect(200);
    expect(sent.body).toEqual({ month: '2026-08', to: email, queued: true });
    const mail = await t.mailbox.waitFor({ to: email, subject: '2026-08' });
    expect(mail.text).toContain('£18.00');
    expect(mail.text).toMatch(/tax/i);

    t.seedFees(setter, [600], { date: '2026-07-02' });
    const deps = t.payoutsDeps();
    expect(closeMonth(deps, '2026-07').mailed).toBeGreaterThanOrEqual(1);
    expect(closeMonth(deps, '2026-07').mailed).toBe(0);
    await t.mailbox.waitFor({ to: email, subject: '2026-07' });
  });
});

describe('money formatting', () => {
  it('uses the ISO 4217 minor unit of each currency (GBP 2 digits, JPY 0; from memory)', () => {
    expect(toDecimalString(1205, 'GBP')).toBe('12.05');
    expect(toDecimalString(-5, 'EUR')).toBe('-0.05');
    expect(toDecimalString(1205, 'JPY')).toBe('1205');
    expect(formatMoney(123456, 'GBP')).toBe('£1,234.56');
  });
});
