/**
 * CSS easing functions: parse and evaluate exactly as the W3C specifications define them.
 *
 * Sources:
 * - W3C CSS Easing Functions Level 1 (§2.1 linear, §2.2 cubic Bézier easing functions,
 *   §2.3 step easing functions): keywords, cubic-bezier(), steps(), and how a cubic Bézier
 *   continues outside [0, 1] along its end tangents.
 * - W3C CSS Easing Functions Level 2 (linear easing function `linear()`): control-point
 *   canonicalisation and the piecewise-linear output with extrapolation.
 *
 * Conversion to and from curve documents is in ./css-curve.ts.
 */

export type StepPosition = 'jump-start' | 'jump-end' | 'jump-none' | 'jump-both';

export interface LinearPoint {
  input: number;
  output: number;
}

export type CssEasing =
  | { kind: 'cubic-bezier'; x1: number; y1: number; x2: number; y2: number }
  | { kind: 'steps'; steps: number; position: StepPosition }
  /** Canonical control points of linear() (Level 2); the keyword `linear` is linear(0, 1). */
  | { kind: 'linear'; points: LinearPoint[] };

export type CssParseResult =
  | { ok: true; easing: CssEasing }
  | { ok: false; error: string; position: number };

/** Level 1 §2.2: the keyword Bézier easings and their control points. */
export const CSS_BEZIER_KEYWORDS: Readonly<Record<string, readonly [number, number, number, number]>> = {
  ease: [0.25, 0.1, 0.25, 1],
  'ease-in': [0.42, 0, 1, 1],
  'ease-out': [0, 0, 0.58, 1],
  'ease-in-out': [0.42, 0, 0.58, 1],
};

// ---------------------------------------------------------------------------------------------
// Tokenizer (a small subset of CSS Syntax Level 3: idents, numbers, percentages, '(', ')', ',')
// ---------------------------------------------------------------------------------------------

type Token =
  | { type: 'ident'; value: string; pos: number }
  | { type: 'function'; value: string; pos: number }
  | { type: 'number'; value: number; text: string; pos: number }
  | { type: 'percentage'; value: number; pos: number }
  | { type: 'comma' | 'close'; pos: number }
  | { type: 'end'; pos: number };

class CssError extends Error {
  constructor(message: string, readonly position: number) {
    super(message);
  }
}

const NUMBER_RE = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?/;
const IDENT_RE = /^-?[a-zA-Z_][a-zA-Z0-9_-]*/;

function tokenize(src: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < src.length) {
    const ch = src[i];
    if (/\s/.test(ch)) { i++; continue; }
    if (ch === ',') { tokens.push({ type: 'comma', pos: i }); i++; continue; }
    if (ch === ')') { tokens.push({ type: 'close', pos: i }); i++; continue; }
    const rest = src.slice(i);
    const num = NUMBER_RE.exec(rest);
    if (num && (/[\d.]/.test(ch) || /[\d.]/.test(rest[1] ?? ''))) {
      const text = num[0];
      const value = Number(text);
      if (!Number.isFinite(value)) throw new CssError(`number "${text}" is out of range`, i);
      if (rest[text.length] === '%') {
        tokens.push({ type: 'percentage', value, pos: i });
        i += text.length + 1;
      } else {
        if (/[a-zA-Z]/.test(rest[text.length] ?? '')) {
          throw new CssError(`unexpected unit after number "${text}" (only plain numbers and percentages are allowed)`, i + text.length);
        }
        tokens.push({ type: 'number', value, text, pos: i });
        i += text.length;
      }
      continue;
    }
    const id = IDENT_RE.exec(rest);
    if (id) {
      const name = id[0].toLowerCase(); // CSS keywords and function names are ASCII case-insensitive
      if (rest[id[0].length] === '(') {
        tokens.push({ type: 'function', value: name, pos: i });
        i += id[0].length + 1;
      } else {
        tokens.push({ type: 'ident', value: name, pos: i });
        i += id[0].length;
      }
      continue;
    }
    throw new CssError(`unexpected character '${ch}'`, i);
  }
  tokens.push({ type: 'end', pos: src.length });
  return tokens;
}

// ---------------------------------------------------------------------------------------------
// Parser
// ---------------------------------------------------------------------------------------------

/**
 * Parse one CSS `<easing-function>`. Errors give a message and the 0-based position in `src`
 * (also written into the message as "at position N").
 */
export function parseCssEasing(src: string): CssParseResult {
  try {
    return { ok: true, easing: parseOrThrow(src) };
  } catch (e) {
    if (e instanceof CssError) {
      return { ok: false, error: `CSS easing "${src}": ${e.message} at position ${e.position}`, position: e.position };
    }
    throw e;
  }
}

function parseOrThrow(src: string): CssEasing {
  const toks = tokenize(src);
  let k = 0;
  const peek = () => toks[k];
  const next = () => toks[k++];
  const describe = (t: Token): string => {
    switch (t.type) {
      case 'end': return 'end of input';
      case 'comma': return "','";
      case 'close': return "')'";
      case 'number': return `number ${t.text}`;
      case 'percentage': return `percentage ${t.value}%`;
      case 'function': return `function ${t.value}(`;
      case 'ident': return `'${t.value}'`;
    }
  };
  const expectEnd = () => {
    const t = peek();
    if (t.type !== 'end') throw new CssError(`unexpected ${describe(t)} after the easing function`, t.pos);
  };
  const number = (what: string): { value: number; pos: number } => {
    const t = next();
    if (t.type !== 'number') throw new CssError(`expected a number for ${what}, got ${describe(t)}`, t.pos);
    return { value: t.value, pos: t.pos };
  };
  const comma = (what: string) => {
    const t = next();
    if (t.type !== 'comma') throw new CssError(`expected ',' before ${what}, got ${describe(t)}`, t.pos);
  };
  const close = (fn: string) => {
    const t = next();
    if (t.type !== 'close') throw new CssError(`expected ')' to close ${fn}(, got ${describe(t)}`, t.pos);
  };

  const first = next();
  if (first.type === 'ident') {
    expectEnd();
    const kw = CSS_BEZIER_KEYWORDS[first.value];
    if (kw) return { kind: 'cubic-bezier', x1: kw[0], y1: kw[1], x2: kw[2], y2: kw[3] };
    if (first.value === 'linear') return { kind: 'linear', points: [{ input: 0, output: 0 }, { input: 1, output: 1 }] };
    if (first.value === 'step-start') return { kind: 'steps', steps: 1, position: 'jump-start' };
    if (first.value === 'step-end') return { kind: 'steps', steps: 1, position: 'jump-end' };
    throw new CssError(`unknown easing keyword '${first.value}' (expected linear, ease, ease-in, ease-out, ease-in-out, step-start or step-end)`, first.pos);
  }
  if (first.type !== 'function') {
    throw new CssError(`expected an easing keyword or function, got ${describe(first)}`, first.pos);
  }

  if (first.value === 'cubic-bezier') {
    const x1 = number('x1');
    comma('y1');
    const y1 = number('y1');
    comma('x2');
    const x2 = number('x2');
    comma('y2');
    const y2 = number('y2');
    close('cubic-bezier');
    expectEnd();
    // Level 1 §2.2: "Both x values must be in the range [0, 1] or the definition is invalid."
    if (x1.value < 0 || x1.value > 1) throw new CssError(`x1 = ${x1.value} must be in [0, 1]`, x1.pos);
    if (x2.value < 0 || x2.value > 1) throw new CssError(`x2 = ${x2.value} must be in [0, 1]`, x2.pos);
    return { kind: 'cubic-bezier', x1: x1.value, y1: y1.value, x2: x2.value, y2: y2.value };
  }

  if (first.value === 'steps') {
    const n = number('the number of steps');
    if (!Number.isInteger(n.value) || n.value < 1) throw new CssError(`the number of steps must be a positive integer, got ${n.value}`, n.pos);
    let position: StepPosition = 'jump-end';
    if (peek().type === 'comma') {
      next();
      const t = next();
      if (t.type !== 'ident') throw new CssError(`expected a step position, got ${describe(t)}`, t.pos);
      const map: Record<string, StepPosition> = {
        'jump-start': 'jump-start', start: 'jump-start', 'jump-end': 'jump-end', end: 'jump-end',
        'jump-none': 'jump-none', 'jump-both': 'jump-both',
      };
      const p = map[t.value];
      if (!p) throw new CssError(`unknown step position '${t.value}' (expected jump-start, jump-end, jump-none, jump-both, start or end)`, t.pos);
      position = p;
      // Level 1 §2.3: with jump-none the step count must be greater than 1.
      if (p === 'jump-none' && n.value < 2) throw new CssError(`steps(${n.value}, jump-none) is invalid: jump-none needs at least 2 steps`, n.pos);
    }
    close('steps');
    expectEnd();
    return { kind: 'steps', steps: n.value, position };
  }

  if (first.value === 'linear') {
    // Level 2: linear( [ <number> && <percentage>{0,2} ]# ), in either order within a stop.
    const raw: { output: number; inputs: number[] }[] = [];
    for (;;) {
      const stopPos = peek().pos;
      let output: number | undefined;
      const inputs: number[] = [];
      const percentages = () => {
        while (peek().type === 'percentage') {
          const t = next() as Extract<Token, { type: 'percentage' }>;
          if (inputs.length === 2) throw new CssError(`a linear() stop has at most two percentages`, t.pos);
          inputs.push(t.value / 100);
        }
      };
      percentages();
      if (peek().type === 'number') output = (next() as Extract<Token, { type: 'number' }>).value;
      if (inputs.length === 0) percentages();
      if (peek().type === 'number' || peek().type === 'percentage') {
        throw new CssError(`a linear() stop is one number and up to two adjacent percentages; unexpected ${describe(peek())}`, peek().pos);
      }
      if (output === undefined) throw new CssError(`expected a number (the output of stop ${raw.length + 1}), got ${describe(peek())}`, peek().type === 'end' ? peek().pos : stopPos);
      raw.push({ output, inputs });
      const t = next();
      if (t.type === 'close') break;
      if (t.type !== 'comma') throw new CssError(`expected ',' or ')' in linear(), got ${describe(t)}`, t.pos);
    }
    expectEnd();
    if (raw.length < 2) throw new CssError(`linear() needs at least two stops, got ${raw.length}`, first.pos);
    return { kind: 'linear', points: canonicalizeLinear(raw) };
  }

  throw new CssError(`unknown easing function '${first.value}(' (expected cubic-bezier(, steps( or linear()`, first.pos);
}

/**
 * CSS Easing Level 2, "create a linear easing function" / canonicalisation of control points:
 * a stop with two inputs becomes two points with the same output; if the first point has no
 * input it gets 0; if the last has none it gets max(1, the largest input before it); an input
 * lower than the largest earlier input is raised to it; each run of points without input is
 * spaced evenly between the points with inputs around it.
 */
export function canonicalizeLinear(stops: { output: number; inputs: number[] }[]): LinearPoint[] {
  const pts: { output: number; input: number | null }[] = [];
  for (const s of stops) {
    if (s.inputs.length === 0) pts.push({ output: s.output, input: null });
    for (const x of s.inputs) pts.push({ output: s.output, input: x });
  }
  if (pts[0].input === null) pts[0].input = 0;
  let largest = -Infinity;
  for (let i = 0; i < pts.length - 1; i++) {
    const x = pts[i].input;
    if (x !== null) largest = Math.max(largest, x);
  }
  const last = pts[pts.length - 1];
  if (last.input === null) last.input = Math.max(1, largest);
  largest = -Infinity;
  for (const p of pts) {
    if (p.input === null) continue;
    if (p.input < largest) p.input = largest;
    largest = p.input;
  }
  for (let i = 0; i < pts.length; i++) {
    if (pts[i].input !== null) continue;
    let j = i;
    while (pts[j].input === null) j++;
    const a = pts[i - 1].input as number;
    const b = pts[j].input as number;
    const count = j - i + 1;
    for (let m = i; m < j; m++) pts[m].input = a + ((b - a) * (m - i + 1)) / count;
    i = j;
  }
  return pts.map((p) => ({ input: p.input as number, output: p.output }));
}

// ---------------------------------------------------------------------------------------------
// Evaluation
// ---------------------------------------------------------------------------------------------

/** Output progress of an easing at input progress x (any real x), per the specifications. */
export function evaluateCssEasing(e: CssEasing, x: number): number {
  switch (e.kind) {
    case 'cubic-bezier': return cubicBezierEasing(e.x1, e.y1, e.x2, e.y2, x);
    case 'steps': return stepsEasing(e.steps, e.position, x);
    case 'linear': return linearEasing(e.points, x);
  }
}

/**
 * CSS Easing Level 1 §2.3 step easing algorithm, with the before flag unset:
 * step = ⌊x·n⌋ (+1 for jump-start/jump-both); if x ≥ 0 and step < 0 then step = 0;
 * jumps = n (start/end), n − 1 (none), n + 1 (both); if x ≤ 1 and step > jumps then step = jumps;
 * output = step / jumps.
 */
export function stepsEasing(n: number, position: StepPosition, x: number): number {
  let step = Math.floor(x * n);
  if (position === 'jump-start' || position === 'jump-both') step += 1;
  if (x >= 0 && step < 0) step = 0;
  const jumps = position === 'jump-none' ? n - 1 : position === 'jump-both' ? n + 1 : n;
  if (x <= 1 && step > jumps) step = jumps;
  return step / jumps;
}

/**
 * CSS Easing Level 2, linear easing output: A = the last point with input ≤ x (index 0 if none;
 * if A is the last point, take the one before), B = the point after A; if their inputs are equal
 * return B's output, else interpolate (or extrapolate) on the line through A and B.
 */
export function linearEasing(points: readonly LinearPoint[], x: number): number {
  let a = 0;
  // binary search for the last point with input ≤ x
  let lo = 0;
  let hi = points.length - 1;
  if (x >= points[0].input) {
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (points[mid].input <= x) lo = mid;
      else hi = mid - 1;
    }
    a = lo;
  }
  if (a === points.length - 1) a -= 1;
  const A = points[a];
  const B = points[a + 1];
  if (A.input === B.input) return B.output;
  return A.output + ((x - A.input) / (B.input - A.input)) * (B.output - A.output);
}

/**
 * CSS cubic-bezier(x1, y1, x2, y2) with P0 = (0,0), P3 = (1,1) (Level 1 §2.2):
 * x(s) = 3(1−s)²s·x1 + 3(1−s)s²·x2 + s³, y(s) likewise; output = y(s) where x(s) = x.
 * x(s) is non-decreasing because x1, x2 ∈ [0,1], so s is found by Newton's method safeguarded
 * by bisection on [0,1] to full double precision (|Δs| ≤ 2⁻⁵²·4, at most 100 steps).
 * Outside [0,1] (§2.2): x < 0 follows the line through P0 and P1 if x1 > 0, else through P0 and
 * P2 if x2 > 0, else 0; x > 1 follows the line through P2 and P3 if x2 < 1, else through P1 and
 * P3 if x1 < 1, else 1.
 */
export function cubicBezierEasing(x1: number, y1: number, x2: number, y2: number, x: number): number {
  if (x < 0) {
    if (x1 > 0) return (y1 / x1) * x;
    if (x2 > 0) return (y2 / x2) * x;
    return 0;
  }
  if (x > 1) {
    if (x2 < 1) return 1 + ((1 - y2) / (1 - x2)) * (x - 1);
    if (x1 < 1) return 1 + ((1 - y1) / (1 - x1)) * (x - 1);
    return 1;
  }
  if (x === 0) return 0;
  if (x === 1) return 1;
  const s = solveBezierParameter(x1, x2, x);
  return bezier1d(y1, y2, s);
}

/** One coordinate of the CSS Bézier: 3(1−s)²s·p1 + 3(1−s)s²·p2 + s³ (Bernstein form). */
function bezier1d(p1: number, p2: number, s: number): number {
  const r = 1 - s;
  return 3 * r * r * s * p1 + 3 * r * s * s * p2 + s * s * s;
}

/** Solve x(s) = x on [0,1] for the CSS Bézier (x non-decreasing in s). */
function solveBezierParameter(x1: number, x2: number, x: number): number {
  let lo = 0;
  let hi = 1;
  let s = x; // good first guess: x(s) ≈ s for near-linear handles
  for (let it = 0; it < 100; it++) {
    const f = bezier1d(x1, x2, s) - x;
    if (f === 0) return s;
    if (f > 0) hi = s;
    else lo = s;
    const r = 1 - s;
    const d = 3 * r * r * x1 + 6 * r * s * (x2 - x1) + 3 * s * s * (1 - x2); // dx/ds
    let nextS = d > 0 ? s - f / d : NaN;
    if (!(nextS > lo && nextS < hi)) nextS = 0.5 * (lo + hi);
    if (Math.abs(nextS - s) <= 4 * Number.EPSILON) return nextS;
    s = nextS;
    if (hi - lo <= 4 * Number.EPSILON) break;
  }
  return s;
}

/** Serialize an easing back to CSS text (numbers in shortest round-trip form). */
export function formatCssEasing(e: CssEasing): string {
  const n = (v: number) => String(Object.is(v, -0) ? 0 : v);
  switch (e.kind) {
    case 'cubic-bezier': return `cubic-bezier(${n(e.x1)}, ${n(e.y1)}, ${n(e.x2)}, ${n(e.y2)})`;
    case 'steps': return `steps(${e.steps}, ${e.position})`;
    case 'linear': {
      const parts: string[] = [];
      const p = e.points;
      for (let i = 0; i < p.length; i++) {
        if (i + 1 < p.length && p[i + 1].output === p[i].output && p[i + 1].input !== p[i].input) {
          parts.push(`${n(p[i].output)} ${n(p[i].input * 100)}% ${n(p[i + 1].input * 100)}%`);
          i++;
        } else {
          parts.push(`${n(p[i].output)} ${n(p[i].input * 100)}%`);
        }
      }
      return `linear(${parts.join(', ')})`;
    }
  }
}
