// @vitest-environment jsdom
// The editor's glTF import: a .gltf with a vector channel and a step channel (hand-built, checked with
// Khronos gltf-validator in tests/api/uploads.test.ts) and a .glb from the project's own writer; the
// person picks a channel and a component, sees keys before/after reduction with the largest error,
// applies it as one undoable edit.
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { DEMO_PROFILES } from '../../../shared/bake';
import { writeGltf } from '../../../shared/convert';
import { evaluate, prepareCurve } from '../../../shared/curve';
import { ImportExportPanel } from '../../../src/features/editor/import-export/import-export-panel';
import { EditorProvider } from '../../../src/features/editor/store/editor-context';
import { createEditorStore } from '../../../src/features/editor/store/editor-store';
import { EDITOR_EXAMPLES } from '../../../src/features/editor/store/examples';
import { HERO_KEYS, buildFixtureGltf, smoothstep } from '../../fixtures/uploads/gltf-fixture';

const panel = EDITOR_EXAMPLES[0].doc;

afterEach(() => cleanup());

function mount() {
  const api = createEditorStore(panel);
  render(<EditorProvider store={api}><ImportExportPanel profiles={DEMO_PROFILES} /></EditorProvider>);
  return api;
}

const choose = (bytes: Uint8Array, name: string) =>
  fireEvent.change(screen.getByLabelText('glTF file'), { target: { files: [new File([bytes.slice()], name)] } });

describe('importing a glTF channel in the editor', () => {
  it('lists the channels, reduces the chosen component within the tolerance and applies it as one undo step', async () => {
    const api = mount();
    choose(buildFixtureGltf().bytes, 'walk.gltf');
    const channel = await screen.findByLabelText('glTF channel');
    expect(within(channel).getAllByRole('option').map((o) => o.textContent)).toEqual([
      `hero · translation · LINEAR · ${HERO_KEYS} keys`,
      'lamp · scale · STEP · 3 keys',
    ]);
    const component = screen.getByLabelText('glTF component');
    expect(within(component).getAllByRole('option').map((o) => o.textContent)).toEqual(['x', 'y', 'z']);
    fireEvent.change(screen.getByLabelText('glTF tolerance'), { target: { value: '0.0005' } });
    fireEvent.click(screen.getByRole('button', { name: 'Reduce keys' }));
    const fit = screen.getByTestId('gltf-fit');
    const m = /^(\d+) keys → (\d+) keys · max error (\S+)/.exec(fit.textContent ?? '');
    expect(m, fit.textContent ?? '').not.toBeNull();
    const [before, after, maxError] = [Number(m![1]), Number(m![2]), Number(m![3])];
    expect(before).toBe(HERO_KEYS);
    expect(after).toBeLessThan(HERO_KEYS);
    expect(maxError).toBeLessThanOrEqual(5e-4);
    expect(fit.textContent).toContain('within tolerance');

    fireEvent.click(within(fit).getByRole('button', { name: 'Use this channel' }));
    const doc = api.getState().doc;
    expect(doc.keys).toHaveLength(after);
    expect(doc.name).toBe(panel.name); // the curve keeps its identity
    expect(doc.drives).toBe(panel.drives);
    // the channel's x holds smoothstep at 31 float32 keys; LINEAR keys are read as samples, so the
    // reduced curve is within the tolerance at every key
    const c = prepareCurve(doc);
    for (let k = 0; k < HERO_KEYS; k++) {
      const t = Math.fround(k / (HERO_KEYS - 1));
      expect(Math.abs(evaluate(c, t) - Math.fround(smoothstep(t)))).toBeLessThanOrEqual(5e-4);
    }
    // and between keys it follows the sampled motion itself, closer than the straight pieces could:
    // those miss smoothstep (M2 = 6) by up to M2·h²/8 = 6·(1/30)²/8 ≈ 8.3e-4 (linear interpolation error bound)
    let between = 0;
    for (let i = 0; i <= 900; i++) between = Math.max(between, Math.abs(evaluate(c, i / 900) - smoothstep(i / 900)));
    expect(between).toBeLessThanOrEqual(5e-4);
    expect(fit.textContent).toContain('linear keys read as samples');
    // one undo step returns the curve as it was
    api.temporal.getState().undo();
    expect(api.getState().doc).toEqual(panel);
  });

  it('another component and a step channel: the step keys are kept as they are', async () => {
    const api = mount();
    choose(buildFixtureGltf().bytes, 'walk.gltf');
    fireEvent.change(await screen.findByLabelText('glTF component'), { target: { value: '1' } });
    fireEvent.click(screen.getByRole('button', { name: 'Reduce keys' }));
    fireEvent.click(within(screen.getByTestId('gltf-fit')).getByRole('button', { name: 'Use this channel' }));
    // y = 2t is a straight line: two keys carry it exactly
    expect(api.getState().doc.keys).toHaveLength(2);
    expect(evaluate(prepareCurve(api.getState().doc), 0.3)).toBeCloseTo(0.6, 6);

    fireEvent.change(screen.getByLabelText('glTF channel'), { target: { value: '1' } });
    fireEvent.click(screen.getByRole('button', { name: 'Reduce keys' }));
    const fit = screen.getByTestId('gltf-fit');
    expect(fit.textContent).toMatch(/^3 keys → 3 keys · max error 0/);
    expect(fit.textContent).toContain('step keys hold their value');
    fireEvent.click(within(fit).getByRole('button', { name: 'Use this channel' }));
    const c = prepareCurve(api.getState().doc);
    // glTF 2.0 Appendix C STEP: the value of the key at or before t
    expect([0.25, 0.75, 1].map((t) => evaluate(c, t))).toEqual([1, 2, 1]);
    expect(api.getState().doc.segments.map((s) => s.kind)).toEqual(['step', 'step']);
  });

  it('reads a .glb from the project writer (one scalar channel: no component to choose)', async () => {
    const api = mount();
    const glb = writeGltf([{ name: 'fade', interpolation: 'CUBICSPLINE', times: new Float32Array([0, 1]), output: new Float32Array([0, 0, 0, 0, 1, 0]) }]).glb();
    choose(glb, 'fade.glb');
    const channel = await screen.findByLabelText('glTF channel');
    expect(within(channel).getAllByRole('option').map((o) => o.textContent)).toEqual(['fade · weights · CUBICSPLINE · 2 keys']);
    expect(screen.queryByLabelText('glTF component')).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: 'Reduce keys' }));
    fireEvent.click(within(screen.getByTestId('gltf-fit')).getByRole('button', { name: 'Use this channel' }));
    // CUBICSPLINE with zero tangents from 0 to 1: the Hermite basis −2s³+3s² (glTF 2.0 Appendix C), 0.5 at s = 0.5
    expect(evaluate(prepareCurve(api.getState().doc), 0.5)).toBeCloseTo(0.5, 6);
    expect(evaluate(prepareCurve(api.getState().doc), 0.25)).toBeCloseTo(0.15625, 6);
  });

  it('a file that is not glTF is refused in words and the curve is unchanged', async () => {
    const api = mount();
    choose(new TextEncoder().encode('time,value\n0,0\n'), 'samples.gltf');
    expect((await screen.findByRole('alert')).textContent).toMatch(/^glTF: .*invalid JSON/);
    expect(screen.queryByLabelText('glTF channel')).toBeNull();
    expect(api.getState().doc).toBe(panel);
  });
});
