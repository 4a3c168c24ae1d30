// @vitest-environment jsdom
import { cleanup, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { ComparisonView } from '../../../src/features/packs/components/comparison-view';
import { EDITOR_EXAMPLES } from '../../../src/features/editor/store/examples';
import type { VersionComparison } from '../../../shared/schemas/versions';

afterEach(cleanup);

const before = EDITOR_EXAMPLES[0]!.doc;
const after = { ...before, keys: before.keys.map((k, i) => (i === 1 ? { ...k, value: k.value + 0.2 } : k)) };
const t0 = before.keys[0]!.time, t1 = before.keys.at(-1)!.time;
const comparison: VersionComparison = {
  from: 1, to: 2, added: [], removed: [], unchanged: [], targets: [],
  changed: [{ name: before.name, unit: before.units.value, maxDeviation: 0.2, at: before.keys[1]!.time, domain: [t0, t1], keysBefore: before.keys.length, keysAfter: after.keys.length, before, after }],
};

describe('comparison overlay with pinned comments', () => {
  it('draws a marker per comment pinned to the curve, at its time on the shared time axis, and lists them', () => {
    const tm = t0 + (t1 - t0) / 4;
    render(<ComparisonView c={comparison} pins={[{ curve: before.name, time: tm, label: 'Lee Lead: settles too early' }, { curve: 'another-curve', time: 0.1, label: 'elsewhere' }]} />);
    const plot = screen.getByRole('img', { name: new RegExp(`${before.name}: v1 dashed, v2 solid, 1 pinned comment`) });
    const marks = plot.querySelectorAll('[data-testid="overlay-pin"]');
    expect(marks).toHaveLength(1);
    // x = pad + (width − 2·pad)·(t − t0)/(t1 − t0) with width 240, pad 2: a quarter of the way
    const x = Number(marks[0]!.querySelector('line')!.getAttribute('x1'));
    expect(x).toBeCloseTo(2 + 236 / 4, 9);
    expect(marks[0]!.querySelector('title')!.textContent).toContain('settles too early');
    const list = screen.getByRole('list', { name: `Pinned on ${before.name}` });
    expect(within(list).getByText(/Lee Lead: settles too early/)).toBeTruthy();
    expect(screen.queryByText(/elsewhere/)).toBeNull();
  });

  it('draws no markers when nothing is pinned', () => {
    render(<ComparisonView c={comparison} />);
    expect(document.querySelectorAll('[data-testid="overlay-pin"]')).toHaveLength(0);
    expect(screen.getByRole('img', { name: `${before.name}: v1 dashed, v2 solid` })).toBeTruthy();
  });
});
