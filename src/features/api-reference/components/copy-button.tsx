import { useState } from 'react';
import { secondaryButton } from '../../../components/form-controls';

/** Copies `text` to the clipboard and says so in words for a moment. */
export function CopyButton({ text, label = 'Copy' }: { text: string; label?: string }) {
  const [state, setState] = useState<'idle' | 'copied' | 'failed'>('idle');
  async function copy() {
    try {
      await navigator.clipboard.writeText(text);
      setState('copied');
    } catch {
      setState('failed');
    }
    setTimeout(() => setState('idle'), 1800);
  }
  return (
    <button type="button" onClick={copy} className={`${secondaryButton} text-xs`} aria-live="polite">
      {state === 'copied' ? 'Copied' : state === 'failed' ? 'Select and copy by hand' : label}
    </button>
  );
}
