/** The editor's toolbar: buttons that run the shared command definitions (../commands/commands.ts). */
import { useStore } from 'zustand';
import { commandById } from '../commands/commands';
import { formatShortcut } from '../commands/shortcut';
import { useEditor, useEditorApi, useHistoryCounts } from '../store/editor-context';

function CommandButton({ id, children }: { id: string; children?: React.ReactNode }) {
  const api = useEditorApi();
  // re-render when what `when` reads may change
  useEditor((s) => `${s.selection.length}|${s.clip ? 1 : 0}|${s.drag ? 1 : 0}|${s.doc.keys.length}`);
  useHistoryCounts();
  const c = commandById(id);
  const enabled = c.when(api);
  const keys = c.keys.map((k) => formatShortcut(k)).join(' or ');
  return (
    <button type="button" disabled={!enabled} onClick={() => c.run(api)} title={`${c.label} (${keys})`} aria-label={c.label}
      aria-keyshortcuts={c.keys.map((k) => [k.mod ? 'Control' : '', k.alt ? 'Alt' : '', k.shift ? 'Shift' : '', k.key].filter(Boolean).join('+')).join(' ')}
      data-testid={`cmd-${id}`}
      className="rounded-sm border border-grid-major bg-card px-2 py-1 text-xs font-medium hover:border-ink disabled:opacity-40 dark:border-night-line dark:bg-night-card">
      {children ?? c.label}
    </button>
  );
}

function Toggle({ label, on, onToggle, testId }: { label: string; on: boolean; onToggle: () => void; testId: string }) {
  return (
    <button type="button" aria-pressed={on} onClick={onToggle} data-testid={testId}
      className={`rounded-sm border px-2 py-1 text-xs font-medium ${on ? 'border-ink bg-ink text-paper dark:border-paper dark:bg-paper dark:text-ink' : 'border-grid-major bg-card dark:border-night-line dark:bg-night-card'}`}>
      {label}: {on ? 'on' : 'off'}
    </button>
  );
}

export function Toolbar() {
  const api = useEditorApi();
  const snapping = useEditor((s) => s.snapping);
  const valueStep = useEditor((s) => s.valueStep);
  const fps = useEditor((s) => s.doc.frameRate);
  const unit = useEditor((s) => s.doc.units.value);
  const zoom = useStore(api, (s) => s.view.t1 - s.view.t0);
  return (
    <div role="toolbar" aria-label="Editor" className="flex flex-wrap items-center gap-1.5">
      <CommandButton id="undo" />
      <CommandButton id="redo" />
      <span className="mx-1 h-5 w-px bg-grid-major" aria-hidden="true" />
      <CommandButton id="copy">Copy</CommandButton>
      <CommandButton id="paste">Paste</CommandButton>
      <CommandButton id="delete">Delete</CommandButton>
      <CommandButton id="add-key">Add key</CommandButton>
      <span className="mx-1 h-5 w-px bg-grid-major" aria-hidden="true" />
      <Toggle label={`Snap to frames (${fps} fps)`} on={snapping.frames} testId="snap-frames" onToggle={() => commandById('snap-frames').run(api)} />
      <Toggle label={`Snap values (${valueStep} ${unit})`} on={snapping.values} testId="snap-values" onToggle={() => commandById('snap-values').run(api)} />
      <span className="mx-1 h-5 w-px bg-grid-major" aria-hidden="true" />
      <CommandButton id="zoom-out">−</CommandButton>
      <span className="font-mono text-xs" aria-label="visible time span">{zoom.toPrecision(3)} s</span>
      <CommandButton id="zoom-in">+</CommandButton>
      <CommandButton id="fit">Fit</CommandButton>
      <span className="mx-1 h-5 w-px bg-grid-major" aria-hidden="true" />
      <CommandButton id="help">Shortcuts</CommandButton>
    </div>
  );
}
