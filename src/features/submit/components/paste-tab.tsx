import { useId, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { MAX_NOTE, MAX_TITLE } from '../../../../shared/contracts/submissions';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { controlClasses } from '../../../components/field';
import { TextField } from '../../../components/text-field';
import { useCheckTiling } from '../api/check-tiling';
import { useCreateSubmission } from '../api/create-submission';
import { useDebounced } from './use-debounced';
import { VerdictView } from './verdict-view';

/** Debounce of the live check while typing, in ms (common practice for type-ahead: 300-500 ms). */
export const CHECK_DEBOUNCE_MS = 400;

/** Paste a Bouwkamp or table code: live drawing and verdict, then submit. */
export function PasteTab() {
  const codeId = useId();
  const noteId = useId();
  const [code, setCode] = useState('');
  const [title, setTitle] = useState('');
  const [note, setNote] = useState('');
  const debounced = useDebounced(code.trim(), CHECK_DEBOUNCE_MS);
  const check = useCheckTiling(debounced);
  const create = useCreateSubmission();
  const current = debounced === code.trim();
  const valid = current && check.data?.valid === true;

  function onSubmit(e: FormEvent) {
    e.preventDefault();
    if (!valid) return;
    create.mutate(
      { code: code.trim(), source: 'paste', ...(title.trim() ? { title: title.trim() } : {}), ...(note.trim() ? { note: note.trim() } : {}) },
      {
        onSuccess: () => {
          setCode('');
          setTitle('');
          setNote('');
        },
      },
    );
  }

  return (
    <form onSubmit={onSubmit} className="grid gap-6 lg:grid-cols-2" aria-label="Submit a pasted code">
      <div className="flex flex-col gap-4">
        <div className="flex flex-col gap-1">
          <label htmlFor={codeId} className="text-sm font-semibold text-ink">
            Bouwkamp or table code
          </label>
          <p className="text-sm text-ink-muted">For example 9 33 32 (18,15)(7,8)(14,4)(10,1)(9). The header (order, width, height) is optional.</p>
          <textarea
            id={codeId}
            value={code}
            onChange={(e) => setCode(e.target.value)}
            rows={4}
            spellCheck={false}
            className={`${controlClasses} h-auto font-mono`}
          />
        </div>
        <TextField label="Title (optional)" value={title} maxLength={MAX_TITLE} onChange={(e) => setTitle(e.target.value)} />
        <div className="flex flex-col gap-1">
          <label htmlFor={noteId} className="text-sm font-semibold text-ink">
            Note to the editor (optional)
          </label>
          <textarea id={noteId} value={note} maxLength={MAX_NOTE} onChange={(e) => setNote(e.target.value)} rows={3} className={`${controlClasses} h-auto`} />
        </div>
        <div>
          <Button type="submit" variant="primary" disabled={!valid} busy={create.isPending}>
            Submit for review
          </Button>
        </div>
        {create.isSuccess ? (
          <Alert tone="success" title="Submitted">
            Your tiling is in the review queue{create.data.duplicateOf ? ' (flagged as a duplicate)' : ''}. Follow it on <Link to="/submissions">My submissions</Link>.
          </Alert>
        ) : null}
        <ErrorAlert error={create.error} title="Not submitted" />
      </div>
      <section aria-label="Verdict" aria-live="polite" className="flex flex-col gap-3">
        {!debounced ? (
          <p className="text-sm text-ink-muted">Paste a code and its drawing and verdict appear here.</p>
        ) : check.isPending || !current ? (
          <p className="text-sm text-ink-muted">Checking…</p>
        ) : check.error ? (
          <ErrorAlert error={check.error} title="Could not check the code" />
        ) : check.data ? (
          <VerdictView verdict={check.data} />
        ) : null}
      </section>
    </form>
  );
}
