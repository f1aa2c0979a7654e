/** Slots in a box are named the way labs name them: a row then a column, e.g. "B3" or "2-7". */
export type AxisLabels = 'letters' | 'numbers';

const LETTERS = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ';

export function axisLabel(index: number, labels: AxisLabels): string {
  return labels === 'letters' ? LETTERS[index - 1] : String(index);
}

export function slotName(row: number, column: number, rowLabels: AxisLabels, columnLabels: AxisLabels): string {
  const separator = rowLabels === columnLabels ? '-' : '';
  return `${axisLabel(row, rowLabels)}${separator}${axisLabel(column, columnLabels)}`;
}

function readAxis(text: string, labels: AxisLabels): number | null {
  if (labels === 'letters') return /^[A-Z]$/.test(text) ? LETTERS.indexOf(text) + 1 : null;
  return /^[1-9][0-9]?$/.test(text) ? Number(text) : null;
}

/** Reads "b3", "B-3", "2-7" or "2 7" for a box with the given labels and size; null when it is not a slot. */
export function parseSlot(
  input: string,
  box: { rows: number; columns: number; rowLabels: AxisLabels; columnLabels: AxisLabels },
): { row: number; column: number } | null {
  const text = input.trim().toUpperCase();
  const split = /^([A-Z]|[0-9]{1,2})[\s-]*([A-Z]|[0-9]{1,2})$/.exec(text);
  if (!split) return null;
  const row = readAxis(split[1], box.rowLabels);
  const column = readAxis(split[2], box.columnLabels);
  if (row === null || column === null || row > box.rows || column > box.columns) return null;
  return { row, column };
}
