/**
 * The key card: numeric fields for the selected key and the segment that follows it, floating next
 * to the key (a shape segment gets the shape palette and the conversion to hermite keys). Every change is checked with the shared schema (./validate-edit.ts); a rejected value
 * stays in its field with the schema's message beside it, and the document is not touched.
 */
import { useEffect, useId, useState, type ReactNode } from 'react';
import { SHAPE_DEFAULTS, SLOPE_RULES, SEGMENT_KINDS, type CurveDocument, type Key, type Segment, type ShapeFamily } from '../../../../shared/curve';
import { useEditor, useEditorApi } from '../store/editor-context';
import { patchBezierHandle, patchKey, patchSegment, shapeEverySegment } from '../store/edits';
import { short } from '../canvas/format';
import { ConvertNoteLine, ConvertToKeys, ShapePalette, type ConvertNote } from './shape-palette';
import { checkEdit, parseNumberField, type FieldErrors } from './validate-edit';

const PARAMS_BY_FAMILY: Partial<Record<ShapeFamily, readonly ('overshoot' | 'amplitude' | 'period' | 'stiffness' | 'damping' | 'mass' | 'velocity')[]>> = {
  back: ['overshoot'],
  elastic: ['amplitude', 'period'],
  spring: ['stiffness', 'damping', 'mass', 'velocity'],
};

function segmentOfKind(doc: CurveDocument, i: number, kind: Segment['kind']): Segment {
  if (kind === 'bezier') {
    const a = doc.keys[i], b = doc.keys[i + 1];
    const h = b.time - a.time;
    return { kind, bezier: { h1: { time: a.time + h / 3, value: a.value + (b.value - a.value) / 3 }, h2: { time: a.time + (2 * h) / 3, value: a.value + (2 * (b.value - a.value)) / 3 } } };
  }
  if (kind === 'shape') return { kind, shape: { family: 'sine', ease: 'in-out' } };
  return { kind };
}

function NumberField({ label, unit, value, error, onCommit, testId }: {
  label: string; unit?: string; value: number; error?: string; onCommit: (text: string) => void; testId: string;
}) {
  const id = useId();
  // the typed text while the field is being edited or holds a rejected value; otherwise the value itself
  // (derived in render, not copied by an effect: a drag updates the card in one render per move, not two)
  const [typed, setText] = useState(short(value));
  const [editing, setEditing] = useState(false);
  const text = editing || error ? typed : short(value);
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="block text-[11px] text-ink/70 dark:text-paper/70">{label}</label>
      <div>
        <div className="flex items-center gap-1">
          <input id={id} data-testid={testId} inputMode="decimal" value={text} aria-invalid={!!error} aria-describedby={error ? `${id}-err` : undefined}
            onFocus={() => { if (!error) setText(short(value)); setEditing(true); }}
            onChange={(e) => setText(e.target.value)}
            onBlur={() => { setEditing(false); if (text !== short(value)) onCommit(text); }}
            onKeyDown={(e) => {
              if (e.key === 'Enter') { onCommit(text); }
              if (e.key === 'Escape') { setText(short(value)); e.stopPropagation(); }
            }}
            className={`w-full min-w-0 rounded-sm border bg-card px-1.5 py-0.5 font-mono text-sm dark:bg-night ${error ? 'border-brick' : 'border-grid-major dark:border-night-line'}`} />
          {unit && <span className="shrink-0 font-mono text-[10px] text-ink/60 dark:text-paper/60">{unit}</span>}
        </div>
        {error && <p id={`${id}-err`} role="alert" className="mt-0.5 text-xs text-brick dark:text-[#e07a6a]">{error}</p>}
      </div>
    </div>
  );
}

function SelectField({ label, value, options, onChange, testId, error }: {
  label: string; value: string; options: readonly string[]; onChange: (v: string) => void; testId: string; error?: string;
}) {
  const id = useId();
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="block text-[11px] text-ink/70 dark:text-paper/70">{label}</label>
      <div>
        <select id={id} data-testid={testId} value={value} onChange={(e) => onChange(e.target.value)}
          className="w-full rounded-sm border border-grid-major bg-card px-1 py-0.5 text-sm dark:border-night-line dark:bg-night">
          {options.map((o) => <option key={o} value={o}>{o}</option>)}
        </select>
        {error && <p role="alert" className="mt-0.5 text-xs text-brick">{error}</p>}
      </div>
    </div>
  );
}

export function KeyCard({ position }: { position: { left: number; top?: number; bottom?: number; maxHeight?: number } }) {
  const api = useEditorApi();
  const doc = useEditor((s) => s.doc);
  const primary = useEditor((s) => s.primary);
  const count = useEditor((s) => s.selection.length);
  const valueStep = useEditor((s) => s.valueStep);
  const readOnly = useEditor((s) => s.readOnly);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [note, setNote] = useState<ConvertNote | null>(null);
  useEffect(() => { setErrors({}); setNote(null); }, [primary]);
  if (primary === null || primary >= doc.keys.length) return null;
  const i = primary;
  const key = doc.keys[i];
  const seg = i < doc.segments.length ? doc.segments[i] : null;
  const unit = doc.units.value;

  const apply = (candidate: CurveDocument, field: string) => {
    const r = checkEdit(candidate, i);
    if (!r.ok) { setErrors((e) => ({ ...e, ...r.errors, ...(r.errors[field] ? {} : { [field]: Object.values(r.errors)[0] }) })); return; }
    setErrors({});
    api.getState().edit(() => r.doc);
  };
  const numberKey = (field: 'time' | 'value' | 'slopeIn' | 'slopeOut' | 'tension', label: string) => (text: string) => {
    const n = parseNumberField(text, label);
    if (!n.ok) { setErrors((e) => ({ ...e, [field]: n.error })); return; }
    let patch: Partial<Key> = { [field]: n.value };
    if (field === 'slopeIn' || field === 'slopeOut') {
      patch = key.slopes === 'joined' ? { rule: 'manual', slopeIn: n.value, slopeOut: n.value } : { rule: 'manual', [field]: n.value };
    }
    apply(patchKey(doc, i, patch), field);
  };
  const numberParam = (p: string) => (text: string) => {
    if (!seg?.shape) return;
    const n = parseNumberField(text, p);
    if (!n.ok) { setErrors((e) => ({ ...e, [p]: n.error })); return; }
    apply(patchSegment(doc, i, { ...seg, shape: { ...seg.shape, params: { ...seg.shape.params, [p]: n.value } } }), p);
  };

  const numberHandle = (handle: 'h1' | 'h2', field: 'time' | 'value') => (text: string) => {
    const label = `handle ${handle === 'h1' ? 1 : 2} ${field}`;
    const n = parseNumberField(text, label);
    if (!n.ok) { setErrors((e) => ({ ...e, [`${handle}.${field}`]: n.error })); return; }
    apply(patchBezierHandle(doc, i, handle, field, n.value), `${handle}.${field}`);
  };

  const row = (node: ReactNode) => node;
  return (
    <section aria-label={`Key ${i + 1} card`} data-testid="key-card"
      className="absolute z-10 w-80 overflow-y-auto rounded-md [will-change:transform] border border-grid-major/80 bg-card/95 p-3 shadow-[0_2px_10px_rgb(27_42_65/0.14)] dark:border-night-line dark:bg-night-card/95"
      style={position}
      onPointerDown={(e) => e.stopPropagation()}>
      <header className="mb-2 flex items-baseline justify-between">
        <h2 className="text-sm font-semibold">Key {i + 1} <span className="font-normal text-ink/60 dark:text-paper/60">of {doc.keys.length}</span></h2>
        {count > 1 && <span className="text-xs text-ink/60 dark:text-paper/60">{count} keys selected</span>}
      </header>
      {/* a viewer's card shows the numbers without letting them change */}
      <fieldset disabled={readOnly} className="contents">
      <div className="grid grid-cols-2 gap-x-3 gap-y-1.5">
        <NumberField label="time" unit="s" value={key.time} error={errors.time} onCommit={numberKey('time', 'time')} testId="card-time" />
        <NumberField label="value" unit={unit} value={key.value} error={errors.value} onCommit={numberKey('value', 'value')} testId="card-value" />
        <NumberField label="in-slope" unit={`${unit}/s`} value={key.slopeIn} error={errors.slopeIn} onCommit={numberKey('slopeIn', 'in-slope')} testId="card-slope-in" />
        <NumberField label="out-slope" unit={`${unit}/s`} value={key.slopeOut} error={errors.slopeOut} onCommit={numberKey('slopeOut', 'out-slope')} testId="card-slope-out" />
        <SelectField label="slope rule" value={key.rule} options={SLOPE_RULES} testId="card-rule" error={errors.rule}
          onChange={(v) => apply(patchKey(doc, i, { rule: v as Key['rule'] }), 'rule')} />
        {key.rule === 'catmull-rom' && (
          <NumberField label="tension" value={key.tension ?? 0} error={errors.tension} onCommit={numberKey('tension', 'tension')} testId="card-tension" />
        )}
        <SelectField label="in / out" value={key.slopes} options={['joined', 'split']} testId="card-slopes" error={errors.slopes}
          onChange={(v) => apply(patchKey(doc, i, v === 'joined' ? { slopes: 'joined', slopeIn: key.slopeOut } : { slopes: 'split' }), 'slopes')} />
        {seg && row(
          <div className="col-span-2 mt-1 grid grid-cols-2 gap-x-3 gap-y-1.5 border-t border-grid-minor pt-2 dark:border-night-line">
            <p className="col-span-2 text-xs font-medium text-ink/70 dark:text-paper/70">Segment to key {i + 2}</p>
            <SelectField label="kind" value={seg.kind} options={SEGMENT_KINDS} testId="card-kind" error={errors.kind}
              onChange={(v) => apply(patchSegment(doc, i, segmentOfKind(doc, i, v as Segment['kind'])), 'kind')} />
            {seg.kind === 'shape' && seg.shape && (
              <>
                <ShapePalette doc={doc} i={i} ease={seg.shape.ease}
                  onPick={(shape) => apply(patchSegment(doc, i, { kind: 'shape', shape }), 'shape')} />
                {errors.shape && <p role="alert" className="col-span-2 text-xs text-brick">{errors.shape}</p>}
                {doc.segments.length > 1 && (
                  <button type="button" data-testid="shape-every-segment" className="col-span-2 justify-self-start rounded-sm border border-grid-major px-2 py-0.5 text-xs dark:border-night-line"
                    onClick={() => apply(shapeEverySegment(doc, seg.shape!), 'shape')}>
                    Use {seg.shape.family} {seg.shape.ease} on all {doc.segments.length} segments
                  </button>
                )}
                <SelectField label="ease" value={seg.shape.ease} options={['in', 'out', 'in-out']} testId="card-ease"
                  onChange={(v) => apply(patchSegment(doc, i, { ...seg, shape: { ...seg.shape!, ease: v as 'in' | 'out' | 'in-out' } }), 'shape')} />
                {(PARAMS_BY_FAMILY[seg.shape.family] ?? []).map((p) => (
                  <NumberField key={p} label={p} value={seg.shape!.params?.[p] ?? defaultParam(p)} error={errors[p]} onCommit={numberParam(p)} testId={`card-${p}`} />
                ))}
              </>
            )}
            {seg.kind === 'bezier' && seg.bezier && (['h1', 'h2'] as const).map((h) => (
              <div key={h} className="contents">
                <NumberField label={`handle ${h === 'h1' ? 1 : 2} time`} unit="s" value={seg.bezier![h].time} error={errors[`${h}.time`]} onCommit={numberHandle(h, 'time')} testId={`card-${h}-time`} />
                <NumberField label={`handle ${h === 'h1' ? 1 : 2} value`} unit={unit} value={seg.bezier![h].value} error={errors[`${h}.value`]} onCommit={numberHandle(h, 'value')} testId={`card-${h}-value`} />
              </div>
            ))}
            {(seg.kind === 'shape' || seg.kind === 'bezier') && <ConvertToKeys doc={doc} i={i} defaultTolerance={valueStep / 20} setNote={setNote} />}
            <ConvertNoteLine note={note} />
            {errors.bezier && <p role="alert" className="col-span-2 text-xs text-brick">{errors.bezier}</p>}
          </div>,
        )}
        {errors.other && <p role="alert" className="col-span-2 text-xs text-brick">{errors.other}</p>}
      </div>
      </fieldset>
    </section>
  );
}

/** Shown when a parameter is absent: the curve engine's defaults. */
function defaultParam(p: string): number {
  return (SHAPE_DEFAULTS as Record<string, number>)[p] ?? 0;
}
