import { useState } from 'react';
import { secondaryButton } from '../../../components/form-controls';

/** A webhook's secret, shown once after creating or rotating, with a copy button. */
export function SecretNotice({ label, secret, onDone }: { label: string; secret: string; onDone: () => void }) {
  const [copied, setCopied] = useState<'yes' | 'failed' | null>(null);
  async function copy() {
    try {
      await navigator.clipboard.writeText(secret);
      setCopied('yes');
    } catch {
      setCopied('failed');
    }
  }
  return (
    <div role="status" className="rounded-md border-l-4 border-amber bg-card p-4 dark:bg-night-card">
      <p className="text-sm font-semibold">Copy the signing secret of “{label}” now — it is shown this once and never again.</p>
      <div className="mt-2 flex flex-wrap items-center gap-2">
        <code data-testid="webhook-secret" className="block min-w-0 flex-1 break-all rounded bg-paper px-2 py-1 font-mono text-sm dark:bg-night">
          {secret}
        </code>
        <button type="button" className={secondaryButton} onClick={() => void copy()}>
          Copy secret
        </button>
      </div>
      <p className="mt-1 text-xs" aria-live="polite">
        {copied === 'yes' ? 'Copied to the clipboard.' : copied === 'failed' ? 'The browser refused the clipboard; select the text and copy it.' : ''}
      </p>
      <p className="mt-2 text-xs">
        Your receiver checks <code className="font-mono">Tangentry-Signature</code> = hex HMAC-SHA256(secret, <code className="font-mono">timestamp + "." + body</code>), with the timestamp from{' '}
        <code className="font-mono">Tangentry-Timestamp</code>.
      </p>
      <button type="button" className={`mt-2 ${secondaryButton}`} onClick={onDone}>
        I have copied it
      </button>
    </div>
  );
}
