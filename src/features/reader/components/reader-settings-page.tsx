import { useState } from 'react';
import { readerSettingsInputSchema, type ReaderSettings } from '../../../../shared/contracts/reader';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { Card, Loading, Page } from '../../../components/page';
import { TextField } from '../../../components/text-field';
import { useReaderSettings } from '../api/get-reader-settings';
import { useUpdateReaderSettings } from '../api/update-reader-settings';

/** /admin/reader (admin): each publication's public address, release time and zone, and the sites allowed to embed it. */
export function ReaderSettingsPage() {
  const settings = useReaderSettings();
  return (
    <Page
      title="Reader edition"
      description="Where each publication's puzzles are public, when a published edition goes public (its date at the release time, in the publication's time zone), and which sites may embed its pages."
    >
      <Alert tone="info" title="What is public">
        Nothing of an edition is public before its date and release time, or while it is unpublished: such addresses answer &ldquo;no such page&rdquo;. Solutions follow the publication&rsquo;s solution rule. Setters, fees, proofs and certificates are never shown.
      </Alert>
      {settings.isPending ? (
        <Loading />
      ) : settings.error ? (
        <ErrorAlert error={settings.error} title="Could not load the reader settings" />
      ) : (
        settings.data.items.map((s) => <SettingsCard key={s.publicationId} settings={s} />)
      )}
    </Page>
  );
}

function SettingsCard({ settings }: { settings: ReaderSettings }) {
  const update = useUpdateReaderSettings();
  const [slug, setSlug] = useState(settings.slug);
  const [timeZone, setTimeZone] = useState(settings.timeZone);
  const [releaseTime, setReleaseTime] = useState(settings.releaseTime);
  const [origins, setOrigins] = useState(settings.embedOrigins.join('\n'));
  const [saved, setSaved] = useState(false);
  const input = { slug, timeZone, releaseTime, embedOrigins: origins.split(/\s+/).filter(Boolean) };
  const check = readerSettingsInputSchema.safeParse(input);
  const errorAt = (field: string) => (check.success ? undefined : check.error.issues.find((i) => i.path[0] === field)?.message);
  return (
    <Card title={settings.publicationTitle}>
      <form
        className="grid gap-3 sm:grid-cols-2"
        onSubmit={(e) => {
          e.preventDefault();
          if (!check.success) return;
          setSaved(false);
          update.mutate({ publicationId: settings.publicationId, input: check.data }, { onSuccess: () => setSaved(true) });
        }}
      >
        <TextField label="Address" hint={`Public at /read/${slug || '...'}`} value={slug} onChange={(e) => setSlug(e.target.value)} error={errorAt('slug')} />
        <TextField label="Time zone" hint="An IANA zone, e.g. Europe/London" value={timeZone} onChange={(e) => setTimeZone(e.target.value)} error={errorAt('timeZone')} />
        <TextField label="Release time" hint="HH:MM on the edition date" value={releaseTime} onChange={(e) => setReleaseTime(e.target.value)} error={errorAt('releaseTime')} />
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-semibold">Sites allowed to embed (one origin a line)</span>
          <textarea value={origins} onChange={(e) => setOrigins(e.target.value)} rows={3} className="rounded border border-rule-strong bg-surface px-2 py-1 font-mono text-xs" aria-invalid={errorAt('embedOrigins') ? true : undefined} />
          {errorAt('embedOrigins') ? <span className="text-danger">{errorAt('embedOrigins')}</span> : <span className="text-ink-muted">e.g. https://www.example.com</span>}
        </label>
        <p className="text-sm text-ink-muted sm:col-span-2">Solutions: {settings.solutionRule === 'same_edition' ? 'public with the same edition' : 'public once the next edition is public'} (the publication&rsquo;s solution rule).</p>
        <div className="flex items-center gap-3 sm:col-span-2">
          <Button type="submit" variant="primary" busy={update.isPending} disabled={!check.success}>
            Save
          </Button>
          {saved ? <span role="status" className="text-sm text-success">Saved.</span> : null}
        </div>
        <ErrorAlert error={update.error} title="The settings were not saved" className="sm:col-span-2" />
      </form>
    </Card>
  );
}
