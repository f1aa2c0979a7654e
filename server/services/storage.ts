import { randomInt } from 'node:crypto';
import type { Knex } from 'knex';
import { CODE_BODY_LENGTH, formatCode, parseCode } from '../../shared/codes';
import { BOX_CODE_PREFIX } from '../../shared/samples';
import type {
  Box,
  BoxCreateInput,
  BoxSummary,
  SampleLocation,
  StoragePlace,
  StoragePlaceCreateInput,
} from '../../shared/schemas/storage';
import { parseSlot, slotName } from '../../shared/slots';
import { codeTypo, conflict, invalid, notFound } from '../errors';
import { BoxModel, StoragePlaceModel } from '../models/storage-models';
import type { UserModel } from '../models/user-model';
import { presentSampleSummary } from '../presenters/sample-presenter';
import { appendHistory } from './history-chain';
import { findSampleByCode } from './sample-lookup';

/** "Lab 2.14 › Desiccator B" for each place id, following parents. */
async function placePaths(knex: Knex | Knex.Transaction): Promise<Map<number, string>> {
  const places = await StoragePlaceModel.query(knex);
  const byId = new Map(places.map((place) => [place.id, place]));
  const paths = new Map<number, string>();
  const pathOf = (place: StoragePlaceModel, depth = 0): string => {
    const parent = place.parentId ? byId.get(place.parentId) : undefined;
    return parent && depth < 20 ? `${pathOf(parent, depth + 1)} › ${place.name}` : place.name;
  };
  for (const place of places) paths.set(place.id, pathOf(place));
  return paths;
}

export async function listPlaces(knex: Knex): Promise<StoragePlace[]> {
  const [places, paths, counts] = await Promise.all([
    StoragePlaceModel.query(knex),
    placePaths(knex),
    knex('boxes')
      .whereNotNull('place_id')
      .groupBy('place_id')
      .select<{ placeId: number; count: number }[]>('place_id', knex.raw('count(*)::int as count')),
  ]);
  const boxCount = new Map(counts.map((row) => [row.placeId, row.count]));
  return places
    .map((place) => ({
      id: place.id,
      name: place.name,
      kind: place.kind as StoragePlace['kind'],
      parentId: place.parentId,
      path: paths.get(place.id) ?? place.name,
      note: place.note,
      boxCount: boxCount.get(place.id) ?? 0,
    }))
    .sort((a, b) => a.path.localeCompare(b.path));
}

export async function createPlace(trx: Knex.Transaction, input: StoragePlaceCreateInput & { kind: StoragePlace['kind'] }) {
  if (input.parentId && !(await StoragePlaceModel.query(trx).findById(input.parentId))) {
    throw invalid({ parentId: [`There is no place with id ${input.parentId}.`] });
  }
  return StoragePlaceModel.query(trx).insertAndFetch({
    name: input.name,
    kind: input.kind,
    parentId: input.parentId ?? null,
    note: input.note || null,
  });
}

export function canonicalBoxCode(input: string): string {
  const parsed = parseCode(input, [BOX_CODE_PREFIX]);
  if (parsed.ok) return parsed.code;
  if (parsed.reason === 'check_failed') throw codeTypo(parsed.message);
  throw notFound(`There is no box with code ${input.trim()}.`);
}

export async function findBoxByCode(knex: Knex | Knex.Transaction, input: string, lock = false): Promise<BoxModel> {
  const code = canonicalBoxCode(input);
  const query = BoxModel.query(knex).findOne({ code });
  const box = await (lock ? query.forUpdate() : query);
  if (!box) throw notFound(`There is no box with code ${code}.`);
  return box;
}

export async function createBox(
  trx: Knex.Transaction,
  input: Required<Pick<BoxCreateInput, 'name' | 'rows' | 'columns'>> & BoxCreateInput,
) {
  if (input.placeId && !(await StoragePlaceModel.query(trx).findById(input.placeId))) {
    throw invalid({ placeId: [`There is no place with id ${input.placeId}.`] });
  }
  let code: string;
  do code = formatCode(BOX_CODE_PREFIX, randomInt(32 ** CODE_BODY_LENGTH));
  while (await BoxModel.query(trx).findOne({ code }));
  return BoxModel.query(trx).insertAndFetch({
    code,
    name: input.name,
    placeId: input.placeId ?? null,
    rows: input.rows,
    columns: input.columns,
    rowLabels: input.rowLabels ?? 'letters',
    columnLabels: input.columnLabels ?? 'numbers',
    note: input.note || null,
  });
}

export async function listBoxes(knex: Knex): Promise<BoxSummary[]> {
  const [boxes, paths, counts] = await Promise.all([
    BoxModel.query(knex).orderBy('name'),
    placePaths(knex),
    knex('sample_locations')
      .groupBy('box_id')
      .select<{ boxId: number; count: number }[]>('box_id', knex.raw('count(*)::int as count')),
  ]);
  const occupied = new Map(counts.map((row) => [row.boxId, row.count]));
  return boxes.map((box) => presentBoxSummary(box, paths, occupied.get(box.id) ?? 0));
}

function presentBoxSummary(box: BoxModel, paths: Map<number, string>, occupied: number): BoxSummary {
  return {
    code: box.code,
    name: box.name,
    placeId: box.placeId,
    placePath: box.placeId ? (paths.get(box.placeId) ?? null) : null,
    rows: box.rows,
    columns: box.columns,
    rowLabels: box.rowLabels,
    columnLabels: box.columnLabels,
    occupied,
  };
}

/** A box with every slot in reading order and what sits in it. */
export async function boxDetail(knex: Knex, box: BoxModel): Promise<Box> {
  const [paths, contents] = await Promise.all([
    placePaths(knex),
    knex('sample_locations as l')
      .join('samples as s', 's.id', 'l.sample_id')
      .where('l.box_id', box.id)
      .select('l.row', 'l.column', 's.code', 's.kind', 's.material', 's.name', 's.status', 's.layer_estimate'),
  ]);
  const bySlot = new Map(contents.map((row) => [`${row.row}:${row.column}`, row]));
  const slots: Box['slots'] = [];
  for (let row = 1; row <= box.rows; row += 1) {
    for (let column = 1; column <= box.columns; column += 1) {
      const content = bySlot.get(`${row}:${column}`);
      slots.push({
        slot: slotName(row, column, box.rowLabels, box.columnLabels),
        row,
        column,
        sample: content ? presentSampleSummary(content) : null,
      });
    }
  }
  return { ...presentBoxSummary(box, paths, contents.length), note: box.note, slots };
}

export async function locationOf(knex: Knex | Knex.Transaction, sampleId: number): Promise<SampleLocation | null> {
  const row = await knex('sample_locations as l')
    .join('boxes as b', 'b.id', 'l.box_id')
    .where('l.sample_id', sampleId)
    .first('l.row', 'l.column', 'b.code', 'b.name', 'b.place_id', 'b.row_labels', 'b.column_labels');
  if (!row) return null;
  const paths = row.placeId ? await placePaths(knex) : new Map<number, string>();
  return {
    boxCode: row.code,
    boxName: row.name,
    slot: slotName(row.row, row.column, row.rowLabels, row.columnLabels),
    placePath: row.placeId ? (paths.get(row.placeId) ?? null) : null,
  };
}

/**
 * Puts a sample into a box slot (or takes it out, with `to` null): one history event either
 * way. Two samples never share a slot; the unique index is the final word under concurrency.
 */
export async function moveSample(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  code: string;
  to: { boxCode: string; slot: string } | null;
}) {
  const sample = await findSampleByCode(props.code, { trx: props.trx, lock: true });
  const from = await locationOf(props.trx, sample.id);
  let to: SampleLocation | null = null;
  if (props.to) {
    const box = await findBoxByCode(props.trx, props.to.boxCode);
    const position = parseSlot(props.to.slot, box);
    if (!position) {
      const first = slotName(1, 1, box.rowLabels, box.columnLabels);
      const last = slotName(box.rows, box.columns, box.rowLabels, box.columnLabels);
      throw invalid({ slot: [`${box.name} has slots ${first} to ${last}; "${props.to.slot}" is not one of them.`] });
    }
    const name = slotName(position.row, position.column, box.rowLabels, box.columnLabels);
    const occupant = await props
      .trx('sample_locations as l')
      .join('samples as s', 's.id', 'l.sample_id')
      .where({ 'l.box_id': box.id, 'l.row': position.row, 'l.column': position.column })
      .whereNot('l.sample_id', sample.id)
      .first('s.code');
    if (occupant) {
      throw conflict(
        'slot_taken',
        `Slot ${name} in ${box.name} already holds ${occupant.code}. Choose a free slot or move that one first.`,
      );
    }
    await props.trx('sample_locations').where('sample_id', sample.id).delete();
    try {
      await props.trx('sample_locations').insert({
        sampleId: sample.id,
        boxId: box.id,
        row: position.row,
        column: position.column,
        placedById: props.actor.id,
      });
    } catch (error) {
      if ((error as { code?: string }).code === '23505') {
        throw conflict('slot_taken', `Slot ${name} in ${box.name} was just filled by someone else. Choose another slot.`);
      }
      throw error;
    }
    to = await locationOf(props.trx, sample.id);
  } else {
    await props.trx('sample_locations').where('sample_id', sample.id).delete();
  }
  if (from?.boxCode !== to?.boxCode || from?.slot !== to?.slot) {
    await appendHistory(props.trx, [
      { type: 'sample.moved', actorId: props.actor.id, subjectCode: sample.code, payload: { from, to } },
    ]);
  }
  return { code: sample.code, location: to };
}
