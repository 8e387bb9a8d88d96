import { useState, type FormEvent } from 'react';
import {
  EXHAUSTIVE_ALL_MAX,
  EXHAUSTIVE_ORDER_MAX,
  EXHAUSTIVE_ORDER_MIN,
  RANDOM_ORDER_MAX,
  RANDOM_ORDER_MIN,
  runRequestSchema,
  type RunMode,
  type RunRequest,
} from '../../../../shared/contracts/foundry';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { CheckboxField } from '../../../components/checkbox-field';
import { Card } from '../../../components/page';
import { SelectField } from '../../../components/select-field';
import { TextField } from '../../../components/text-field';
import { useStartRun } from '../api/start-run';

const modes = [
  { value: 'exhaustive', label: 'Exhaustive: every simple tiling of one order' },
  { value: 'random', label: 'Random: simple perfect rectangles with filters' },
  { value: 'joining', label: 'Joining: squared squares from pairs in the stock' },
] as const;

type Fields = Record<string, string>;

const initial: Fields = { order: '12', count: '10', orderMin: '13', orderMax: '18', maxSide: '', aspectMin: '', aspectMax: '', seed: '1' };

function num(v: string | undefined): number | undefined {
  if (v === undefined || v.trim() === '') return undefined;
  return Number(v);
}

/** Build the request from the form and validate it with the shared contract. */
export function toRunRequest(mode: RunMode, f: Fields, squaresOnly: boolean, includeImperfect = false) {
  const raw =
    mode === 'exhaustive'
      ? { mode, order: num(f.order), squaresOnly, includeImperfect }
      : mode === 'random'
        ? { mode, count: num(f.count), orderMin: num(f.orderMin), orderMax: num(f.orderMax), maxSide: num(f.maxSide), aspectMin: num(f.aspectMin), aspectMax: num(f.aspectMax), squaresOnly, seed: num(f.seed) }
        : { mode };
  return runRequestSchema.safeParse(raw);
}

/** Start a foundry run: the three modes with their parameters. */
export function RunForm() {
  const [mode, setMode] = useState<RunMode>('exhaustive');
  const [fields, setFields] = useState<Fields>(initial);
  const [squaresOnly, setSquaresOnly] = useState(false);
  const [includeImperfect, setIncludeImperfect] = useState(false);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const start = useStartRun();

  const field = (name: string, label: string, hint?: string) => (
    <TextField
      label={label}
      hint={hint}
      inputMode="numeric"
      value={fields[name] ?? ''}
      error={errors[name]}
      onChange={(e) => setFields({ ...fields, [name]: e.target.value })}
    />
  );

  function submit(e: FormEvent) {
    e.preventDefault();
    const parsed = toRunRequest(mode, fields, squaresOnly, includeImperfect);
    if (!parsed.success) {
      const errs: Record<string, string> = {};
      for (const issue of parsed.error.issues) {
        const key = String(issue.path[0] ?? 'form');
        errs[key] ??= issue.message;
      }
      setErrors(errs);
      return;
    }
    setErrors({});
    start.mutate(parsed.data satisfies RunRequest);
  }

  return (
    <Card title="Start a run">
      <form className="flex flex-col gap-4" onSubmit={submit} noValidate aria-label="Start a foundry run">
        <SelectField label="Mode" options={modes} value={mode} onChange={(e) => { setMode(e.target.value as RunMode); setErrors({}); }} />
        {mode === 'exhaustive' ? (
          <div className="grid gap-4 sm:grid-cols-2">
            {field('order', 'Order (number of squares)', `${EXHAUSTIVE_ORDER_MIN} to ${EXHAUSTIVE_ALL_MAX}; up to ${EXHAUSTIVE_ORDER_MAX} for squares only`)}
          </div>
        ) : null}
        {mode === 'random' ? (
          <div className="grid gap-4 sm:grid-cols-3">
            {field('count', 'How many tilings')}
            {field('orderMin', 'Smallest order', `${RANDOM_ORDER_MIN} to ${RANDOM_ORDER_MAX}`)}
            {field('orderMax', 'Largest order')}
            {field('maxSide', 'Largest square at most', 'optional; small sides are rare at high orders')}
            {field('aspectMin', 'Aspect ratio from', 'long side / short side, optional')}
            {field('aspectMax', 'Aspect ratio to', 'optional')}
            {field('seed', 'Seed', 'the same seed gives the same run')}
          </div>
        ) : null}
        {mode === 'joining' ? (
          <p className="text-sm text-ink-muted">
            Finds pairs of perfect rectangles in the stock with the same dimensions and joins them into squared squares.
            Every result is verified before it goes into the stock.
          </p>
        ) : null}
        {mode !== 'joining' ? <CheckboxField label="Squares only" checked={squaresOnly} onChange={(e) => setSquaresOnly(e.target.checked)} /> : null}
        {mode === 'exhaustive' ? (
          <CheckboxField
            label="Put imperfect tilings into the stock too"
            hint="By default only the perfect ones (all sizes different) go into the stock; the run lists both."
            checked={includeImperfect}
            onChange={(e) => setIncludeImperfect(e.target.checked)}
          />
        ) : null}
        {errors.form ? <Alert tone="danger" title="Check the parameters">{errors.form}</Alert> : null}
        <ErrorAlert error={start.error} title="The run did not start" />
        <div>
          <Button type="submit" variant="primary" busy={start.isPending}>
            Start run
          </Button>
        </div>
      </form>
    </Card>
  );
}
