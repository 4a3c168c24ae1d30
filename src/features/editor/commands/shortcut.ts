/**
 * Keyboard shortcuts as data: matching a key event and writing the shortcut for people.
 * `mod` is Ctrl, or ⌘ on Apple keyboards.
 */

export interface Shortcut {
  /** KeyboardEvent.key, compared case-insensitively for letters ("z", "Delete", "ArrowLeft", "?"). */
  key: string;
  mod?: boolean;
  shift?: boolean;
  alt?: boolean;
}

export interface KeyLike {
  key: string;
  ctrlKey: boolean;
  metaKey: boolean;
  shiftKey: boolean;
  altKey: boolean;
}

/**
 * True when the event is this shortcut. Shift is compared only for letters and named keys; for
 * printed symbols ("?", "+") the symbol already says whether Shift was held.
 */
export function matches(e: KeyLike, s: Shortcut): boolean {
  const mod = e.ctrlKey || e.metaKey;
  if (!!s.mod !== mod || !!s.alt !== e.altKey) return false;
  const symbol = s.key.length === 1 && s.key.toLowerCase() === s.key.toUpperCase();
  if (!symbol && !!s.shift !== e.shiftKey) return false;
  return e.key.length === 1 ? e.key.toLowerCase() === s.key.toLowerCase() : e.key === s.key;
}

const NAMES: Record<string, string> = {
  ArrowLeft: '←', ArrowRight: '→', ArrowUp: '↑', ArrowDown: '↓', Delete: 'Delete', Backspace: 'Backspace',
  Escape: 'Esc', Home: 'Home', ' ': 'Space',
};

export function formatShortcut(s: Shortcut, apple = false): string {
  const parts: string[] = [];
  if (s.mod) parts.push(apple ? '⌘' : 'Ctrl');
  if (s.alt) parts.push(apple ? '⌥' : 'Alt');
  if (s.shift) parts.push('Shift');
  parts.push(NAMES[s.key] ?? (s.key.length === 1 ? s.key.toUpperCase() : s.key));
  return parts.join('+');
}
