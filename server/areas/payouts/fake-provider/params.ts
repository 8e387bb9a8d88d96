import { z } from 'zod';
import { invalidRequest } from './errors';

// The parameters of the provider calls the fake answers. The SDK sends them form-encoded
// (`metadata[a]=1&capabilities[transfers][requested]=true`); each endpoint reads them
// through its zod schema here, and a missing or wrong one is answered the way the provider
// does (400, `parameter_missing` or `parameter_invalid_*`, naming the parameter).

export type FormValue = string | FormFields;
export type FormFields = { [name: string]: FormValue };

/** Parses the provider's form encoding into nested objects. */
export function parseFormBody(body: string): FormFields {
  const out: FormFields = {};
  for (const [rawKey, value] of new URLSearchParams(body)) {
    const parts = rawKey.split('[').map((p, i) => (i === 0 ? p : p.replace(/\]$/, '')));
    const last = parts.pop() ?? '';
    let node = out;
    for (const part of parts) {
      const next = node[part];
      if (typeof next === 'object') node = next;
      else {
        const fresh: FormFields = {};
        node[part] = fresh;
        node = fresh;
      }
    }
    node[last] = value;
  }
  return out;
}

const text = z.string().min(1);
const lowerCaseText = text.transform((s) => s.toLowerCase());
const positiveAmount = z
  .string()
  .regex(/^\d+$/, 'Invalid positive integer')
  .transform(Number)
  .refine((n) => n > 0, 'Invalid positive integer');
const metadata = z.record(z.string(), z.string()).default({});

/** The provider's code for a parameter that is present but wrong (default `parameter_invalid`). */
const invalidCodes: Record<string, string> = { amount: 'parameter_invalid_integer' };

export const createAccountParams = z.object({
  type: z.string().default('express'),
  country: z.string().default('GB'),
  email: z.string().nullable().default(null),
  metadata,
});

export const accountLinkParams = z.object({ account: text, return_url: text, refresh_url: text });

export const transferParams = z.object({
  amount: positiveAmount,
  currency: lowerCaseText,
  destination: text,
  metadata,
  transfer_group: z.string().nullable().default(null),
});

export const payoutParams = z.object({ amount: positiveAmount, currency: lowerCaseText, metadata });

/** Reads a request's parameters through its schema; the first bad one is the provider's 400. */
export function parseParams<S extends z.ZodType>(schema: S, fields: FormFields): z.output<S> {
  const parsed = schema.safeParse(fields);
  if (parsed.success) return parsed.data;
  const issue = parsed.error.issues[0];
  const param = String(issue?.path[0] ?? '');
  const raw = fields[param];
  if (raw === undefined || raw === '') throw invalidRequest('parameter_missing', `Missing required param: ${param}.`, param);
  throw invalidRequest(invalidCodes[param] ?? 'parameter_invalid', issue?.message ?? `Invalid ${param}`, param);
}
