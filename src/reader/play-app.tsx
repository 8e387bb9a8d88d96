import { useCallback, useEffect, useRef, useState, type ReactNode } from 'react';
import type { CheckInput, SolveEventKind } from '../../shared/contracts/reader';
import { checkEntries, revealEntries, sendEvent } from './api';
import { AssemblyBoard } from './assembly-board';
import { isComplete } from './assembly-geometry';
import { DeductionBoard } from './deduction-board';
import { clearProgress, loadProgress, newProgress, saveProgress, type Entry, type Placement, type Progress } from './progress';
import type { PageData } from './schemas';
import { clockText, useClock } from './use-clock';

// One puzzle in play: the board, the clock (with pause), Check, Reveal one / Reveal all
// (each after a confirmation; only once the edition's solutions are public), progress saved
// in this browser, and the finished state. The answer is never on the page: Check and
// Reveal ask the server (decision 080).

type Confirm = { title: string; body: string; action: string; run: () => void } | null;

export function PlayApp({ data }: { data: PageData }) {
  const { play, api } = data;
  const key = api;
  const [progress, setProgress] = useState<Progress>(() => loadProgress(key));
  const [paused, setPaused] = useState(false);
  const [wrong, setWrong] = useState<ReadonlySet<number>>(new Set());
  const [message, setMessage] = useState('');
  const [busy, setBusy] = useState(false);
  const [selected, setSelected] = useState<number | null>(null);
  const [confirm, setConfirm] = useState<Confirm>(null);
  const dialog = useRef<HTMLDialogElement>(null);
  // the latest progress for handlers and the clock (kept in step by update())
  const progressRef = useRef(progress);

  const running = progress.started && !progress.finished && !paused;
  const clock = useClock(progress.elapsedMs, running, (ms) => {
    if (!progressRef.current.started || progressRef.current.finished) return;
    const next = { ...progressRef.current, elapsedMs: ms };
    progressRef.current = next;
    saveProgress(key, next);
  });

  const update = useCallback(
    (change: (p: Progress) => Progress) => {
      setProgress((p) => {
        const next = change(p);
        progressRef.current = next;
        saveProgress(key, next);
        return next;
      });
    },
    [key],
  );

  const event = (kind: SolveEventKind, count?: number) => {
    sendEvent(api, { playId: progressRef.current.playId, kind, elapsedMs: Math.min(clock.read(), 7 * 24 * 3600 * 1000), ...(count !== undefined ? { count } : {}) });
  };

  /** The first move starts the clock and sends `started`. */
  const touch = () => {
    if (progressRef.current.started) return;
    update((p) => ({ ...p, started: true }));
    sendEvent(api, { playId: progressRef.current.playId, kind: 'started', elapsedMs: 0 });
  };

  const finish = (revealedAll: boolean) => {
    const ms = clock.read();
    update((p) => ({ ...p, finished: true, elapsedMs: ms }));
    event('finished');
    setMessage(revealedAll ? `Finished with the solution revealed, after ${clockText(ms)}.` : `Solved in ${clockText(ms)}. Well done!`);
  };

  const checkInput = (p: Progress): CheckInput => (play.kind === 'assembly' ? { placements: p.placements } : { entries: p.entries });

  const runCheck = async (auto: boolean) => {
    setBusy(true);
    try {
      const r = await checkEntries(api, checkInput(progressRef.current));
      setWrong(new Set(r.wrong));
      if (!auto) {
        update((p) => ({ ...p, checks: p.checks + 1 }));
        event('checked', r.wrong.length);
      }
      if (r.solved) finish(false);
      else if (r.wrong.length > 0) setMessage(`${r.wrong.length} ${play.kind === 'assembly' ? (r.wrong.length === 1 ? 'piece is' : 'pieces are') : r.wrong.length === 1 ? 'entry is' : 'entries are'} wrong: marked with \u2715.`);
      else setMessage(auto ? 'Every place is filled, but not all of it is right yet: use Check to see where.' : 'Nothing wrong so far.');
    } catch (e) {
      setMessage((e as Error).message);
    } finally {
      setBusy(false);
    }
  };

  // a full board is checked by itself
  const full = play.kind === 'assembly'
    ? isComplete(play.frame, [...play.starters.map((s) => ({ x: s.x, y: s.y, s: play.pieces[s.piece]! })), ...progress.placements.map((p) => ({ x: p.x, y: p.y, s: play.pieces[p.piece]! }))], play.pieces.length)
    : play.drawing.rects.every((_, i) => play.givens.some((g) => g.square === i) || progress.entries.some((e) => e.square === i));
  const fullKey = full ? JSON.stringify(checkInput(progress)) : '';
  useEffect(() => {
    if (fullKey && !progressRef.current.finished) void runCheck(true);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [fullKey]);

  const reveal = async (all: boolean) => {
    setBusy(true);
    try {
      const p = progressRef.current;
      let count = 0;
      if (play.kind === 'assembly') {
        const starters = new Set(play.starters.map((s) => s.piece));
        const piece = selected ?? play.pieces.findIndex((_, i) => !starters.has(i) && (wrong.has(i) || !p.placements.some((q) => q.piece === i)));
        if (!all && piece < 0) {
          setMessage('Choose a piece to reveal.');
          return;
        }
        const r = await revealEntries(api, all ? { all: true, placements: p.placements } : { piece, placements: p.placements });
        if (!('placements' in r)) throw new Error('The server answered with sizes for an Assembly.');
        const shown = r.placements.filter((q) => !starters.has(q.piece));
        // only what the reader did not have right counts as revealed
        const had = (q: Placement) => p.placements.some((x) => x.piece === q.piece && x.x === q.x && x.y === q.y);
        count = shown.filter((q) => !had(q)).length;
        update((q) => {
          // a revealed piece takes its place; any piece in the way goes back to the tray
          let placements = q.placements.filter((x) => !shown.some((y) => y.piece === x.piece));
          for (const y of shown) {
            const s = play.pieces[y.piece]!;
            placements = placements.filter((x) => {
              const t = play.pieces[x.piece]!;
              return !(x.x < y.x + s && y.x < x.x + t && x.y < y.y + s && y.y < x.y + t);
            });
            placements.push(y);
          }
          return { ...q, started: true, placements, revealed: q.revealed + count };
        });
      } else {
        const givens = new Set(play.givens.map((g) => g.square));
        const square = selected ?? play.drawing.rects.findIndex((_, i) => !givens.has(i) && (wrong.has(i) || !p.entries.some((e) => e.square === i)));
        if (!all && square < 0) {
          setMessage('Choose a square to reveal.');
          return;
        }
        const r = await revealEntries(api, all ? { all: true } : { square });
        if (!('entries' in r)) throw new Error('The server answered with places for a Deduction.');
        const shown = r.entries.filter((e) => !givens.has(e.square));
        count = shown.filter((e) => !p.entries.some((x) => x.square === e.square && x.size === e.size)).length;
        update((q) => ({ ...q, started: true, entries: [...q.entries.filter((e) => !shown.some((x) => x.square === e.square)), ...shown], revealed: q.revealed + count }));
      }
      setWrong(new Set());
      event('revealed', count);
      if (all) finish(true);
      else setMessage(count === 1 ? 'One revealed.' : `${count} revealed.`);
    } catch (e) {
      setMessage((e as Error).message);
    } finally {
      setBusy(false);
    }
  };

  useEffect(() => {
    const d = dialog.current;
    if (!d) return;
    if (confirm && !d.open) d.showModal();
    if (!confirm && d.open) d.close();
  }, [confirm]);

  const onPlace = (pl: Placement) => {
    touch();
    setWrong((w) => {
      const n = new Set(w);
      n.delete(pl.piece);
      return n;
    });
    update((p) => ({ ...p, started: true, placements: [...p.placements.filter((x) => x.piece !== pl.piece), pl] }));
  };
  const onRemove = (piece: number) => {
    touch();
    update((p) => ({ ...p, placements: p.placements.filter((x) => x.piece !== piece) }));
  };
  const onEnter = (square: number, size: number | null) => {
    touch();
    setWrong((w) => {
      const n = new Set(w);
      n.delete(square);
      return n;
    });
    update((p) => ({ ...p, started: true, entries: [...p.entries.filter((e) => e.square !== square), ...(size === null ? [] : [{ square, size } satisfies Entry])] }));
  };

  const locked = progress.finished || paused;
  const solutions = data.solutionsPublic;
  const what = play.kind === 'assembly' ? 'piece' : 'square';

  return (
    <section aria-label="Play" className="space-y-3">
      <div className="flex flex-wrap items-center gap-2 rounded-md border border-rule bg-surface px-3 py-2">
        <span className="min-w-16 font-mono text-lg tabular" role="timer" aria-label={`Time played ${clockText(clock.ms)}`}>
          {clockText(clock.ms)}
        </span>
        <Btn onClick={() => setPaused((v) => !v)} disabled={!progress.started || progress.finished}>
          {paused ? 'Resume' : 'Pause'}
        </Btn>
        <Btn onClick={() => void runCheck(false)} disabled={busy || locked}>
          Check
        </Btn>
        <Btn
          disabled={busy || locked || !solutions}
          onClick={() => setConfirm({ title: `Reveal one ${what}?`, body: `The ${selected === null ? `first ${what} not yet right` : `chosen ${what}`} is filled in from the solution. Revealing counts in your result.`, action: `Reveal ${what}`, run: () => void reveal(false) })}
        >
          Reveal one
        </Btn>
        <Btn
          disabled={busy || locked || !solutions}
          onClick={() => setConfirm({ title: 'Reveal the whole solution?', body: 'Every piece and size is filled in from the solution and the puzzle ends.', action: 'Reveal all', run: () => void reveal(true) })}
        >
          Reveal all
        </Btn>
        <span className="ml-auto" />
        <Btn
          disabled={busy}
          onClick={() =>
            setConfirm({
              title: 'Start again?',
              body: 'Your entries and time on this puzzle are cleared from this browser.',
              action: 'Start again',
              run: () => {
                clearProgress(key);
                const fresh = newProgress();
                progressRef.current = fresh;
                setProgress(fresh);
                setWrong(new Set());
                setPaused(false);
                setMessage('Started again.');
                window.location.reload();
              },
            })
          }
        >
          Start again
        </Btn>
      </div>
      {!solutions ? <p className="text-sm text-ink-muted">Reveal opens once this edition&rsquo;s solutions are public.</p> : null}
      <p role="status" aria-live="polite" className="min-h-6 text-sm font-semibold text-ink-soft" data-testid="play-status">
        {message}
      </p>
      {progress.finished ? (
        <div role="region" aria-label="Finished" className="rounded-md border border-success/40 border-l-4 border-l-success bg-success-soft px-4 py-3" data-testid="finished">
          <p className="font-semibold text-success">{progress.revealed > 0 ? 'Finished' : 'Solved!'}</p>
          <p className="text-sm text-ink-soft">
            Time played {clockText(progress.elapsedMs)}
            {progress.revealed > 0 ? `, ${progress.revealed} ${what}${progress.revealed === 1 ? '' : 's'} revealed` : ''}
            {progress.checks > 0 ? `, ${progress.checks} check${progress.checks === 1 ? '' : 's'}` : ''}.
          </p>
        </div>
      ) : null}
      <div className="relative">
        <div className={paused ? 'invisible' : ''}>
          {play.kind === 'assembly' ? (
            <AssemblyBoard play={play} placements={progress.placements} wrong={wrong} locked={locked} selected={selected} onSelect={setSelected} onPlace={onPlace} onRemove={onRemove} onMessage={setMessage} />
          ) : (
            <DeductionBoard play={play} entries={progress.entries} wrong={wrong} locked={locked} selected={selected} onSelect={setSelected} onEnter={onEnter} />
          )}
        </div>
        {paused ? (
          <div className="absolute inset-0 flex flex-col items-center justify-center gap-3 rounded-md border border-rule bg-paper-deep">
            <p className="font-semibold">Paused</p>
            <Btn onClick={() => setPaused(false)}>Resume</Btn>
          </div>
        ) : null}
      </div>
      <dialog ref={dialog} aria-labelledby="confirm-title" className="m-auto max-w-sm rounded-md border border-rule bg-surface p-4 text-ink backdrop:bg-ink/40" onClose={() => setConfirm(null)}>
        {confirm ? (
          <form
            method="dialog"
            onSubmit={(e) => {
              e.preventDefault();
              const run = confirm.run;
              setConfirm(null);
              run();
            }}
          >
            <h2 id="confirm-title" className="text-lg font-semibold">
              {confirm.title}
            </h2>
            <p className="mt-2 text-sm text-ink-soft">{confirm.body}</p>
            <div className="mt-4 flex justify-end gap-2">
              <Btn onClick={() => setConfirm(null)}>Cancel</Btn>
              <button type="submit" className="rounded border border-accent-strong bg-accent px-3 py-1.5 text-sm font-semibold text-accent-ink hover:bg-accent-strong">
                {confirm.action}
              </button>
            </div>
          </form>
        ) : null}
      </dialog>
    </section>
  );
}

function Btn({ children, onClick, disabled }: { children: ReactNode; onClick: () => void; disabled?: boolean }) {
  return (
    <button type="button" onClick={onClick} disabled={disabled} className="rounded border border-rule-strong bg-surface px-3 py-1.5 text-sm font-semibold text-ink hover:bg-paper-deep disabled:cursor-not-allowed disabled:opacity-50">
      {children}
    </button>
  );
}
