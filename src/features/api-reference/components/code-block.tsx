import { CopyButton } from './copy-button';

/** A command to paste into a shell, with a copy button. */
export function CodeBlock({ code, testId, label }: { code: string; testId?: string; label: string }) {
  return (
    <div className="relative">
      <pre data-testid={testId} aria-label={label} className="overflow-x-auto rounded bg-paper px-3 py-2 pr-20 font-mono text-xs leading-relaxed dark:bg-night">
        {code}
      </pre>
      <div className="absolute right-2 top-2">
        <CopyButton text={code} />
      </div>
    </div>
  );
}
