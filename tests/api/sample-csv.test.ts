import { parse } from 'csv-parse/sync';
import request from 'supertest';
import { buildPerson } from '../helpers/factories';
import { signedInAgent, type SessionAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp();
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

const SPREADSHEET = [
  'Kind,Material,Name,Owner Email,Oxide thickness nm,Note,Supplier lot',
  'crystal,MoS2,Bulk lot 7,,,"grown by CVT, batch ""A""",L-0007',
  'chip,MoS2,Chip 7-1,colleague@lab.flakeline.test,285,=SUM(A1:A2),',
].join('\n');

async function importCsv(session: SessionAgent, csv: string, mode: 'preview' | 'commit') {
  return session.agent
    .post(`/api/samples/imports?mode=${mode}`)
    .set('x-csrf-token', session.csrfToken)
    .set('content-type', 'text/csv')
    .send(csv);
}

const rowCount = async (table: string) => Number((await lab.knex(table).count({ count: '*' }).first())?.count);

describe('POST /api/samples/imports', () => {
  it('403 for a reviewer', async () => {
    const reviewer = await buildPerson(lab.knex, { role: 'reviewer' });
    const response = await importCsv(await signedInAgent(lab.app, reviewer.email), SPREADSHEET, 'preview');
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
  });

  it('422 for a file that is not CSV, an unknown column, or a header without rows', async () => {
    const researcher = await buildPerson(lab.knex);
    const session = await signedInAgent(lab.app, researcher.email);
    const unclosedQuote = await importCsv(session, 'kind,material\nchip,"MoS2\n', 'preview');
    const unknownColumn = await importCsv(session, 'kind,material,colour\nchip,MoS2,blue\n', 'preview');
    const headerOnly = await importCsv(session, 'kind,material\n', 'preview');
    for (const response of [unclosedQuote, unknownColumn, headerOnly]) {
      expect(response.status).toBe(422);
      expect(response.body.error.fields.file).toHaveLength(1);
    }
    expect(unknownColumn.body.error.fields.file[0]).toContain('colour');
  });

  it('preview reports each row by spreadsheet line and changes nothing', async () => {
    const researcher = await buildPerson(lab.knex);
    const csv = `${SPREADSHEET}\nflake,,Flake X,,abc,,`;
    const response = await importCsv(await signedInAgent(lab.app, researcher.email), csv, 'preview');
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ mode: 'preview', rowCount: 3, validCount: 1, createdCount: 0 });
    const [crystal, chip, flake] = response.body.rows;
    expect(crystal).toMatchObject({ line: 2, ok: true, kind: 'crystal', material: 'MoS2' });
    expect(chip.errors.owner_email[0]).toContain('colleague@lab.flakeline.test');
    expect(Object.keys(flake.errors).sort()).toEqual(['material', 'oxide_thickness_nm']);
    expect(await rowCount('samples')).toBe(0);
  });

  it('commit with any bad row imports nothing and names each problem by line and column', async () => {
    const researcher = await buildPerson(lab.knex);
    const response = await importCsv(await signedInAgent(lab.app, researcher.email), SPREADSHEET, 'commit');
    expect(response.status).toBe(422);
    expect(Object.keys(response.body.error.fields)).toEqual(['line 3.owner_email']);
    expect(await rowCount('samples')).toBe(0);
    expect(await rowCount('history_events')).toBe(0);
  });

  it('commit creates every row with fresh codes, owners matched by e-mail, and history', async () => {
    const researcher = await buildPerson(lab.knex);
    const colleague = await buildPerson(lab.knex, { email: 'colleague@lab.flakeline.test' });
    const response = await importCsv(await signedInAgent(lab.app, researcher.email), SPREADSHEET, 'commit');
    expect(response.status).toBe(200);
    expect(response.body.createdCount).toBe(2);
    const samples = await lab.knex('samples').orderBy('id');
    expect(samples.map((sample) => [sample.kind, sample.ownerId])).toEqual([
      ['crystal', researcher.id],
      ['chip', colleague.id],
    ]);
    expect(samples[0].note).toBe('grown by CVT, batch "A"');
    expect(samples[0].properties).toEqual({ supplierLot: 'L-0007' });
    expect(samples[1].properties).toEqual({ oxideThicknessNm: 285 });
    const events = await lab.knex('history_events').orderBy('id').pluck('type');
    expect(events).toEqual(['sample.created', 'sample.created', 'samples.imported']);
  });
});

describe('GET /api/samples.csv', () => {
  it('401 when signed out', async () => {
    const response = await request(lab.app).get('/api/samples.csv');
    expect(response.status).toBe(401);
  });

  it('exports the filtered list; formulas are defused; the export imports back', async () => {
    const researcher = await buildPerson(lab.knex, { email: 'colleague@lab.flakeline.test' });
    const session = await signedInAgent(lab.app, researcher.email);
    await importCsv(session, SPREADSHEET, 'commit');
    const response = await session.agent.get('/api/samples.csv?kind=chip');
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toContain('text/csv');
    expect(response.headers['content-disposition']).toMatch(/attachment; filename="flakeline-samples-\d{4}-\d{2}-\d{2}\.csv"/);
    const rows = parse(response.text, { columns: true }) as Record<string, string>[];
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ kind: 'chip', material: 'MoS2', oxide_thickness_nm: '285', owner_email: researcher.email });
    // OWASP "CSV Injection": a cell starting with = would run as a formula in a spreadsheet.
    expect(rows[0].note).toBe("'=SUM(A1:A2)");

    const again = await importCsv(session, response.text, 'preview');
    expect(again.status).toBe(200);
    expect(again.body.validCount).toBe(1);
    expect(again.body.ignoredColumns).toEqual(expect.arrayContaining(['code', 'owner', 'created_at', 'updated_at']));
  });
});
