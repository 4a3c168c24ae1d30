/**
 * Drag and drop on the pack page with @dnd-kit/core: a curve card's grip drags it; dropping on another
 * card puts it in that card's place, dropping on a pack in the "Move to" strip moves it there. The
 * "Move earlier / later" buttons and the move form stay the keyboard way to do the same.
 */
import type { ReactNode } from 'react';
import { DndContext, PointerSensor, pointerWithin, useDraggable, useDroppable, useSensor, useSensors, type DragEndEvent } from '@dnd-kit/core';
import type { PackDto } from '../../../../shared/schemas/packs';

export type DropResult = { kind: 'place'; curveId: string; onCurveId: string } | { kind: 'pack'; curveId: string; toPack: string };

/** Reads a finished drag as a placement or a move (null when dropped nowhere or on itself). */
export function dropResult(e: Pick<DragEndEvent, 'active' | 'over'>): DropResult | null {
  const curveId = String(e.active.id).replace(/^curve:/, '');
  const over = e.over ? String(e.over.id) : null;
  if (!over) return null;
  if (over.startsWith('pack:')) return { kind: 'pack', curveId, toPack: over.slice(5) };
  const onCurveId = over.replace(/^slot:/, '');
  return onCurveId === curveId ? null : { kind: 'place', curveId, onCurveId };
}

/** The drag context of the grid (always mounted; slots and grips are disabled when dragging is not allowed). */
export function CurveDnd({ onDrop, children }: { onDrop: (r: DropResult) => void; children: ReactNode }) {
  // a few pixels before a drag starts, so the card's buttons still click; the drop target is the one under
  // the pointer (a small pack chip would never win an area-overlap test against the big cards)
  const sensors = useSensors(useSensor(PointerSensor, { activationConstraint: { distance: 6 } }));
  return (
    <DndContext sensors={sensors} collisionDetection={pointerWithin} onDragEnd={(e) => { const r = dropResult(e); if (r) onDrop(r); }}>
      {children}
    </DndContext>
  );
}

/** A grid cell that is both a drop slot and holds a draggable card with a grip. */
export function DraggableSlot({ curveId, name, enabled, children }: { curveId: string; name: string; enabled: boolean; children: ReactNode }) {
  const drop = useDroppable({ id: `slot:${curveId}`, disabled: !enabled });
  const drag = useDraggable({ id: `curve:${curveId}`, disabled: !enabled });
  const style = drag.transform ? { transform: `translate(${drag.transform.x}px, ${drag.transform.y}px)`, zIndex: 10 } : undefined;
  return (
    <li ref={drop.setNodeRef} className={`grid rounded-md ${drop.isOver && !drag.isDragging ? 'outline-2 outline-dashed outline-vermilion' : ''}`}>
      <div ref={drag.setNodeRef} style={style} className={`relative grid ${drag.isDragging ? 'opacity-80 shadow-lg' : ''}`}>
        {enabled ? (
          <button type="button" {...drag.listeners} {...drag.attributes} aria-label={`Drag to reorder or move: ${name}`} tabIndex={-1}
            className="absolute right-2 top-2 z-10 cursor-grab rounded border border-grid-major bg-card px-1 text-xs leading-5 active:cursor-grabbing dark:bg-night-card">
            ⠿ drag
          </button>
        ) : null}
        {children}
      </div>
    </li>
  );
}

/** Other packs as drop targets while dragging a curve. */
export function PackDropStrip({ packs }: { packs: PackDto[] }) {
  if (packs.length === 0) return null;
  return (
    <div className="mt-3 flex flex-wrap items-center gap-2 text-sm" aria-label="Drop a curve on a pack to move it">
      <span className="text-ink/70 dark:text-paper/70">Drop on a pack to move:</span>
      {packs.map((p) => <PackDrop key={p.slug} pack={p} />)}
    </div>
  );
}

function PackDrop({ pack }: { pack: PackDto }) {
  const { setNodeRef, isOver } = useDroppable({ id: `pack:${pack.slug}` });
  return (
    <span ref={setNodeRef} data-pack-drop={pack.slug} className={`rounded border border-dashed px-2 py-1 ${isOver ? 'border-vermilion bg-vermilion/10' : 'border-grid-major dark:border-night-line'}`}>
      {pack.name}
    </span>
  );
}
