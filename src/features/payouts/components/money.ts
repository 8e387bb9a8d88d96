import { formatMoney } from '../../../../shared/contracts/ledger';

export { formatMoney };

/** "£40.00 + €12.00" for a list of amounts in mixed currencies. */
export function totalsFor(items: readonly { amountMinor: number; currency: string }[]): string {
  const sums = new Map<string, number>();
  for (const i of items) sums.set(i.currency, (sums.get(i.currency) ?? 0) + i.amountMinor);
  return [...sums.entries()].map(([currency, amount]) => formatMoney(amount, currency)).join(' + ') || formatMoney(0, 'GBP');
}
