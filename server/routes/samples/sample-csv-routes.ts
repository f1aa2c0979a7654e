import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import express from 'express';
import { WRITER_ROLES } from '../../../shared/roles';
import { SampleListQuery } from '../../../shared/schemas/sample';
import { IMPORT_MAX_BYTES, SampleImportBody, SampleImportQuery, SampleImportResult } from '../../../shared/schemas/sample-import';
import type { AppContext } from '../../app-context';
import { route, type AnyRouteSpec } from '../../http/route';
import { importSamplesCsv, sampleCsvStringifier, toCsvRecord, type ExportRow } from '../../services/sample-csv';
import { filteredSamples, sortedSamples } from '../../services/sample-search';

const EXPORT_COLUMNS = [
  's.code',
  's.kind',
  's.material',
  's.name',
  's.status',
  'u.display_name as owner_name',
  'u.email as owner_email',
  's.layer_estimate',
  's.note',
  's.properties',
  's.created_at',
  's.updated_at',
];

export function sampleCsvRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex } = context;
  return [
    route({
      method: 'get',
      path: '/samples.csv',
      tag: 'Samples',
      summary: 'The filtered sample list as CSV (same filters as GET /api/samples, all pages)',
      access: 'signed-in',
      query: SampleListQuery,
      producesType: 'text/csv',
      handler: async ({ query, res }) => {
        const stamp = new Date().toISOString().slice(0, 10);
        res.setHeader('Content-Type', 'text/csv; charset=utf-8');
        res.setHeader('Content-Disposition', `attachment; filename="flakeline-samples-${stamp}.csv"`);
        // Streamed row by row, so an export of the whole lab never sits in memory at once.
        const rows = sortedSamples(filteredSamples(knex, query).select(EXPORT_COLUMNS), query).stream();
        const toRecord = new Transform({
          objectMode: true,
          transform(row: ExportRow, _encoding, done) {
            done(null, toCsvRecord(row));
          },
        });
        await pipeline(rows, toRecord, sampleCsvStringifier(), res);
      },
    }),
    route({
      method: 'post',
      path: '/samples/imports',
      tag: 'Samples',
      summary: 'Import samples from CSV: mode=preview reports each row; mode=commit creates all rows or none',
      access: WRITER_ROLES,
      before: [express.text({ type: ['text/csv', 'text/plain'], limit: IMPORT_MAX_BYTES })],
      bodyType: 'text/csv',
      query: SampleImportQuery,
      body: SampleImportBody,
      response: SampleImportResult,
      handler: ({ user, query, body }) =>
        knex.transaction((trx) => importSamplesCsv({ trx, actor: user, csv: body, mode: query.mode })),
    }),
  ];
}
