/** The shortcut sheet, written from the command definitions (../commands/commands.ts). */
import { useEffect, useRef } from 'react';
import { COMMANDS, type CommandGroup } from '../commands/commands';
import { formatShortcut } from '../commands/shortcut';
import { useEditor, useEditorApi } from '../store/editor-context';

const GROUPS: CommandGroup[] = ['Edit', 'Keys', 'View', 'Preview'];

/** Pointer actions are not commands; they are listed here by hand. */
const POINTER: [string, string][] = [
  ['Drag a key', 'move it (and the other selected keys)'],
  ['Shift+click a key', 'add it to the selection, or take it out'],
  ['Drag on empty canvas', 'select the keys inside the box (Shift: add to the selection)'],
  ['Drag a square handle', 'turn the slope (joined keys turn both sides)'],
  ['Double-click the curve', 'add a key there'],
  ['Wheel / pinch', 'zoom about the pointer (Shift: time only, Alt: value only)'],
  ['Middle-drag or Alt+drag', 'pan'],
  ['Esc while dragging', 'cancel the drag'],
];

export function HelpSheet() {
  const open = useEditor((s) => s.helpOpen);
  const api = useEditorApi();
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog ref={ref} aria-labelledby="help-heading" onClose={() => api.getState().setHelpOpen(false)} data-testid="help-sheet"
      className="m-auto max-h-[85vh] w-[40rem] max-w-[95vw] overflow-auto rounded-md border border-grid-major bg-card p-5 text-ink shadow-lg backdrop:bg-ink/30 dark:bg-night-card dark:text-paper">
      <div className="flex items-baseline justify-between">
        <h2 id="help-heading" className="text-lg font-semibold">Editor shortcuts</h2>
        <button type="button" className="text-sm underline" onClick={() => api.getState().setHelpOpen(false)}>Close</button>
      </div>
      <div className="mt-3 grid gap-4 sm:grid-cols-2">
        {GROUPS.map((g) => (
          <section key={g}>
            <h3 className="mb-1 text-sm font-semibold">{g}</h3>
            <table className="w-full text-sm"><tbody>
              {COMMANDS.filter((c) => c.group === g).map((c) => (
                <tr key={c.id} className="border-t border-grid-minor dark:border-night-line">
                  <td className="py-1 pr-2">{c.label}</td>
                  <td className="py-1 text-right font-mono text-xs">{c.keys.map((k) => <kbd key={formatShortcut(k)} className="ml-1 rounded-sm border border-grid-major px-1">{formatShortcut(k)}</kbd>)}</td>
                </tr>
              ))}
            </tbody></table>
          </section>
        ))}
        <section className="sm:col-span-2">
          <h3 className="mb-1 text-sm font-semibold">Pointer</h3>
          <table className="w-full text-sm"><tbody>
            {POINTER.map(([a, b]) => (
              <tr key={a} className="border-t border-grid-minor dark:border-night-line"><td className="py-1 pr-2 font-medium">{a}</td><td className="py-1">{b}</td></tr>
            ))}
          </tbody></table>
        </section>
      </div>
    </dialog>
  );
}
