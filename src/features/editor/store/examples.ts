/**
 * Example curves of the demo studio (the brief's fictional "Corvid Lantern Games", game "Tidewright").
 * Each one is a valid curve document (tests/unit/editor/examples.test.ts parses them).
 */
import { resolveSlopes, type CurveDocument, type Key, type Segment } from '../../../../shared/curve';

export interface EditorExample {
  /** pack/curve, as the library will name it. */
  id: string;
  title: string;
  doc: CurveDocument;
}

const key = (time: number, value: number, rule: Key['rule'] = 'catmull-rom', slope = 0): Key => ({
  time, value, slopeIn: slope, slopeOut: slope, rule, slopes: 'joined',
});

function doc(partial: Omit<CurveDocument, 'format' | 'version' | 'units' | 'tags' | 'keys'> & { value: string; keys: Key[]; tags?: string[] }): CurveDocument {
  const { value, keys, tags, ...rest } = partial;
  return { format: 'tangentry.curve', version: 1, units: { time: 's', value }, tags: tags ?? [], ...rest, keys: resolveSlopes(keys) };
}

/** The menu panel slides in: a quick start, a small overshoot past its rest place, then settles. */
const panelSlideIn = doc({
  name: 'panel-slide-in',
  description: 'Pause menu panel entering from the left (0 = off screen, 1 = in place).',
  value: 'progress',
  before: 'clamp', after: 'clamp', frameRate: 60, drives: 'position', tags: ['menu', 'ui'],
  keys: [key(0, 0, 'manual', 5.5), key(0.3, 1.06, 'zero'), key(0.45, 1, 'zero')],
  segments: [{ kind: 'hermite' }, { kind: 'hermite' }],
});

/** A button squashes on press and springs back (a shape segment for the release). */
const buttonPress = doc({
  name: 'button-press-scale',
  description: 'Confirm button scale on press: a quick squash, then an eased return.',
  value: 'scale',
  before: 'clamp', after: 'clamp', frameRate: 60, drives: 'scale', tags: ['menu', 'ui'],
  keys: [key(0, 1, 'zero'), key(0.08, 0.86, 'zero'), key(0.4, 1, 'zero')],
  segments: [{ kind: 'hermite' }, { kind: 'shape', shape: { family: 'back', ease: 'out', params: { overshoot: 1.70158 } } }],
});

/**
 * The muzzle flash brightens and dims eight times in one second: deliberately above the three-flash
 * threshold, so the editor shows the flash caution (WCAG 2.3.1).
 */
function muzzleFlashKeys(): { keys: Key[]; segments: Segment[] } {
  const keys: Key[] = [key(0, 0, 'secant')];
  for (let p = 0; p < 8; p++) {
    const t = p * 0.125;
    keys.push(key(+(t + 0.025).toFixed(4), 1, 'secant'), key(+(t + 0.1).toFixed(4), 0.05, 'secant'));
  }
  return { keys, segments: keys.slice(1).map(() => ({ kind: 'linear' as const })) };
}

const muzzle = muzzleFlashKeys();
const muzzleFlash = doc({
  name: 'muzzle-flash',
  description: 'Brightness of the rapid-fire muzzle light (0 = off, 1 = full).',
  value: 'brightness',
  before: 'clamp', after: 'clamp', frameRate: 60, drives: 'brightness', tags: ['combat', 'light'],
  keys: muzzle.keys,
  segments: muzzle.segments,
});

export const EDITOR_EXAMPLES: readonly EditorExample[] = [
  { id: 'menu-transitions/panel-slide-in', title: 'Menu panel slides in', doc: panelSlideIn },
  { id: 'menu-transitions/button-press-scale', title: 'Button press squash', doc: buttonPress },
  { id: 'hit-flashes/muzzle-flash', title: 'Muzzle flash brightness', doc: muzzleFlash },
];

export const DEFAULT_EXAMPLE = EDITOR_EXAMPLES[0];
