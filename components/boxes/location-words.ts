import type { SampleLocation } from '@/shared/schemas/sample';
import type { BoxSummary } from '@/shared/schemas/storage';

/** "Box ‘MoS2 chips 1’, slot B3 — Lab 2.14 › Desiccator B" */
export function locationWords(location: SampleLocation): string {
  return `Box ‘${location.boxName}’, slot ${location.slot}${location.placePath ? ` — ${location.placePath}` : ''}`;
}

export function slotCount(box: Pick<BoxSummary, 'rows' | 'columns'>): number {
  return box.rows * box.columns;
}

/** "12 of 81 slots used" */
export function occupancyWords(box: Pick<BoxSummary, 'rows' | 'columns' | 'occupied'>): string {
  return `${box.occupied} of ${slotCount(box)} slots used`;
}
