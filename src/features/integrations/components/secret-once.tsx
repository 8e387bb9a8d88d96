import { Alert } from '../../../components/alert';

/** A secret shown once (a new API key or signing secret): it cannot be read again later. */
export function SecretOnce({ title, secret, children }: { title: string; secret: string; children?: React.ReactNode }) {
  return (
    <Alert tone="warning" title={title}>
      <p className="text-sm">Copy it now: Squarewright keeps only a fingerprint of it and will not show it again.</p>
      <code className="mt-2 block rounded-md border border-rule bg-surface px-3 py-2 font-mono text-sm break-all select-all" aria-label="secret">
        {secret}
      </code>
      {children}
    </Alert>
  );
}
