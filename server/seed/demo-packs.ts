/**
 * The demo studio's packs (BRIEF.md demo scenario, invented): menu-transitions and audio-fades in
 * "UI Motion"; jump-arcs, camera-moves and hit-flashes in "Gameplay Feel". Each curve is a valid curve
 * document (tests/unit/server/demo-packs.test.ts parses every one with parseCurveDocument), and together
 * they use every segment kind. hit-flashes drives brightness and flashes more than three times in one
 * second, so the editor's flash caution shows. Most values are normalised (the demo targets' tolerances are
 * absolute); double-jump-height is in metres over 2.7 m on purpose: Mobile's unorm8 cannot hold it within
 * 4e-3, so a version shows a failed bake that names the curve and the reason.
 */
import { resolveSlopes, type CurveDocument, type Drives, type Key, type OutsideRule, type Segment } from '../../shared/curve';

export interface DemoPack {
  team: string;
  name: string;
  slug: string;
  description: string;
  frameRate: number;
  tags: string[];
  curves: CurveDocument[];
}

const k = (time: number, value: number, rule: Key['rule'] = 'catmull-rom', slope = 0): Key => ({ time, value, slopeIn: slope, slopeOut: slope, rule, slopes: 'joined' });
const split = (time: number, value: number, slopeIn: number, slopeOut: number): Key => ({ time, value, slopeIn, slopeOut, rule: 'manual', slopes: 'split' });

function curve(c: {
  name: string; description: string; value: string; drives: Drives; tags: string[]; keys: Key[]; segments: Segment[];
  frameRate?: number; before?: OutsideRule; after?: OutsideRule;
}): CurveDocument {
  return {
    format: 'tangentry.curve', version: 1, name: c.name, description: c.description, units: { time: 's', value: c.value },
    before: c.before ?? 'clamp', after: c.after ?? 'clamp', frameRate: c.frameRate ?? 60, drives: c.drives, tags: c.tags,
    keys: resolveSlopes(c.keys), segments: c.segments,
  };
}

const H: Segment = { kind: 'hermite' };
const L: Segment = { kind: 'linear' };
const S: Segment = { kind: 'step' };
/** CSS `ease` = cubic-bezier(0.25, 0.1, 0.25, 1) laid over [t0, t1] × [v0, v1] (CSS Easing Level 1). */
const ease = (t0: number, v0: number, t1: number, v1: number, x1 = 0.25, y1 = 0.1, x2 = 0.25, y2 = 1): Segment => ({
  kind: 'bezier',
  bezier: { h1: { time: t0 + x1 * (t1 - t0), value: v0 + y1 * (v1 - v0) }, h2: { time: t0 + x2 * (t1 - t0), value: v0 + y2 * (v1 - v0) } },
});

/** Damage flash: full white and back four times in 0.8 s (5 flashes a second). */
function damageFlash(): CurveDocument {
  const keys: Key[] = [k(0, 0, 'secant')];
  for (let i = 0; i < 4; i++) keys.push(k(+(i * 0.2 + 0.04).toFixed(3), 1, 'secant'), k(+(i * 0.2 + 0.2).toFixed(3), 0, 'secant'));
  return curve({
    name: 'damage-flash', description: 'Screen-edge brightness when the player is hit (0 = none, 1 = full).', value: 'brightness',
    drives: 'brightness', tags: ['combat', 'feedback'], keys, segments: keys.slice(1).map(() => L),
  });
}

export const DEMO_PACKS: readonly DemoPack[] = [
  {
    team: 'ui-motion', name: 'Menu transitions', slug: 'menu-transitions', frameRate: 60, tags: ['menu', 'ui'],
    description: 'Panels, buttons and toasts of the pause and title menus.',
    curves: [
      curve({
        name: 'panel-slide-in', description: 'Pause menu panel entering from the left (0 = off screen, 1 = in place).', value: 'progress',
        drives: 'position', tags: ['menu', 'panel'], keys: [k(0, 0, 'manual', 5.5), k(0.3, 1.06, 'zero'), k(0.45, 1, 'zero')], segments: [H, H],
      }),
      curve({
        name: 'button-press-scale', description: 'Confirm button scale on press: a quick squash, then an eased return.', value: 'scale',
        drives: 'scale', tags: ['menu', 'button'], keys: [k(0, 1, 'zero'), k(0.08, 0.86, 'zero'), k(0.4, 1, 'zero')],
        segments: [H, { kind: 'shape', shape: { family: 'back', ease: 'out', params: { overshoot: 1.70158 } } }],
      }),
      curve({
        name: 'tab-fade', description: 'Opacity of a tab page fading in, CSS ease.', value: 'opacity',
        drives: 'opacity', tags: ['menu', 'tab'], keys: [k(0, 0, 'manual'), k(0.25, 1, 'manual')], segments: [ease(0, 0, 0.25, 1)],
      }),
      curve({
        name: 'toast-drop', description: 'A notice drops from the top edge and bounces to rest (0 = above the screen, 1 = at rest).', value: 'progress',
        drives: 'position', tags: ['hud', 'toast'], keys: [k(0, 0, 'zero'), k(0.6, 1, 'zero')],
        segments: [{ kind: 'shape', shape: { family: 'bounce', ease: 'out' } }],
      }),
    ],
  },
  {
    team: 'ui-motion', name: 'Audio fades', slug: 'audio-fades', frameRate: 60, tags: ['audio', 'music'],
    description: 'Music and ambience gain over menu changes and dialogue.',
    curves: [
      curve({
        name: 'music-fade-out', description: 'Title music fading out when a save loads (gain, 1 = full).', value: 'gain',
        drives: 'audio-gain', tags: ['music'], keys: [k(0, 1, 'zero'), k(2, 0, 'zero')], segments: [{ kind: 'shape', shape: { family: 'sine', ease: 'in-out' } }],
      }),
      curve({
        name: 'dialogue-duck', description: 'Ambience ducks under dialogue and recovers; held level while a line plays.', value: 'gain',
        drives: 'audio-gain', tags: ['ambience', 'dialogue'], keys: [k(0, 1, 'secant'), k(0.15, 0.35, 'secant'), k(1.5, 0.35, 'secant'), k(2.1, 1, 'secant')], segments: [L, S, L],
      }),
      curve({
        name: 'crossfade-in', description: 'Next track fading in without overshoot (Fritsch–Carlson slopes).', value: 'gain',
        drives: 'audio-gain', tags: ['music'], keys: [k(0, 0, 'monotone'), k(0.5, 0.2, 'monotone'), k(1.2, 0.85, 'monotone'), k(1.6, 1, 'monotone')], segments: [H, H, H],
      }),
    ],
  },
  {
    team: 'gameplay-feel', name: 'Jump arcs', slug: 'jump-arcs', frameRate: 60, tags: ['player', 'movement'],
    description: 'Height of the player over a jump; the feel of the game lives here.',
    curves: [
      curve({
        name: 'jump-height', description: 'Standing jump: quick rise, hang at the top, faster fall (metres).', value: 'm',
        drives: 'position', tags: ['jump'], keys: [k(0, 0, 'manual', 9), k(0.32, 1.6, 'zero'), k(0.7, 0, 'manual', -12)], segments: [H, H],
      }),
      curve({
        name: 'double-jump-height', description: 'Second jump from the top of the first: a kink where the boost starts (metres).', value: 'm',
        drives: 'position', tags: ['jump', 'double'], keys: [k(0, 0, 'manual', 9), split(0.3, 1.5, 0.4, 7), k(0.62, 2.7, 'zero'), k(1.05, 0, 'manual', -13)], segments: [H, H, H],
      }),
      curve({
        name: 'landing-squash', description: 'Vertical scale on landing: squash on contact, then a springy recovery.', value: 'scale',
        drives: 'scale', tags: ['landing'], keys: [k(0, 1, 'zero'), k(0, 0.78, 'zero'), k(0.35, 1, 'zero')],
        segments: [S, { kind: 'shape', shape: { family: 'elastic', ease: 'out', params: { amplitude: 1, period: 0.3 } } }],
      }),
    ],
  },
  {
    team: 'gameplay-feel', name: 'Camera moves', slug: 'camera-moves', frameRate: 30, tags: ['camera'],
    description: 'Dollies, shakes and orbits of the gameplay camera.',
    curves: [
      curve({
        name: 'dolly-in', description: 'Camera moves toward the harbour gate, ease-in-out (0 = start, 1 = at the gate).', value: 'progress', frameRate: 30,
        drives: 'position', tags: ['dolly', 'cutscene'], keys: [k(0, 0, 'manual'), k(2.5, 1, 'manual')], segments: [ease(0, 0, 2.5, 1, 0.42, 0, 0.58, 1)],
      }),
      curve({
        name: 'shake-offset', description: 'Vertical shake after an explosion, dying away (metres).', value: 'm', frameRate: 30,
        drives: 'position', tags: ['shake'], keys: [k(0, 0), k(0.05, 0.04), k(0.12, -0.03), k(0.2, 0.02), k(0.3, -0.01), k(0.42, 0.004), k(0.6, 0)], segments: [H, H, H, H, H, H],
      }),
      curve({
        name: 'orbit-yaw', description: 'Idle orbit around the lighthouse: one full turn every 12 s, repeating (turns).', value: 'turns', frameRate: 30,
        drives: 'rotation', tags: ['orbit', 'idle'], after: 'repeat', keys: [k(0, 0, 'secant'), k(12, 1, 'secant')], segments: [L],
      }),
    ],
  },
  {
    team: 'gameplay-feel', name: 'Hit flashes', slug: 'hit-flashes', frameRate: 60, tags: ['combat', 'light'],
    description: 'Brightness of hit feedback and weapon lights. Flashes: check the flash caution before shipping.',
    curves: [
      damageFlash(),
      curve({
        name: 'shield-pulse', description: 'Slow glow of the shield while it recharges (brightness, once a second).', value: 'brightness',
        drives: 'brightness', tags: ['shield'], after: 'mirror', keys: [k(0, 0.2, 'zero'), k(0.5, 0.8, 'zero')], segments: [{ kind: 'shape', shape: { family: 'quad', ease: 'in-out' } }],
      }),
      curve({
        name: 'parry-spark', description: 'One bright spark on a perfect parry, spring-damped back to dark.', value: 'brightness',
        drives: 'brightness', tags: ['parry'], keys: [k(0, 1, 'zero'), k(1, 0, 'zero')],
        segments: [{ kind: 'shape', shape: { family: 'spring', ease: 'out', params: { stiffness: 180, damping: 14, mass: 1 } } }],
      }),
    ],
  },
];
