import { combineLayerEstimates, whoSaysWhat } from '../../../shared/evidence/layer-call';
import { allowedRange, describeLayers, layerEstimate, lowerBoundEstimate } from '../../../shared/evidence/layer-estimate';
import { LayerCall, type LayerCallEstimate } from '../../../shared/schemas/evidence-analysis';

let nextId = 1;
const raman = (layers: number, uncertainty = 0): LayerCallEstimate => ({
  evidenceId: nextId++,
  kind: 'raman',
  estimate: layerEstimate('raman', layers, uncertainty, 'test'),
});
const contrast = (layers: number, uncertainty = 0): LayerCallEstimate => ({
  evidenceId: nextId++,
  kind: 'micrograph',
  estimate: layerEstimate('optical_contrast', layers, uncertainty, 'test'),
});
const afm = (layers: number, uncertainty = 0): LayerCallEstimate => ({
  evidenceId: nextId++,
  kind: 'afm',
  estimate: layerEstimate('afm', layers, uncertainty, 'test'),
});
const atLeast = (kind: 'raman' | 'pl', layers: number): LayerCallEstimate => ({
  evidenceId: nextId++,
  kind,
  estimate: lowerBoundEstimate(kind, layers, 0, 'test'),
});

function combine(items: LayerCallEstimate[]) {
  const call = combineLayerEstimates(items);
  expect(LayerCall.parse(JSON.parse(JSON.stringify(call)))).toEqual(call);
  return call;
}

describe('layer estimates', () => {
  it('allow a range of counts and read as words', () => {
    expect(allowedRange(layerEstimate('afm', 2, 1, ''))).toEqual({ low: 1, high: 3 });
    expect(allowedRange(layerEstimate('afm', 1, 1, ''))).toEqual({ low: 1, high: 2 });
    expect(allowedRange(lowerBoundEstimate('raman', 2, 0, ''))).toEqual({ low: 2, high: Infinity });
    expect(describeLayers({ layers: 1, uncertainty: 0 })).toBe('1');
    expect(describeLayers({ layers: 3, uncertainty: 1 })).toBe('3 ± 1');
    expect(describeLayers({ layers: 2, uncertainty: 0, isLowerBound: true })).toBe('2 or more');
    expect(() => layerEstimate('pl', 0, 0, '')).toThrow(RangeError);
    expect(() => layerEstimate('pl', 1, -1, '')).toThrow(RangeError);
  });
});

describe('combineLayerEstimates', () => {
  it('has no call without evidence', () => {
    expect(combine([])).toEqual({
      layers: null,
      atLeast: null,
      uncertainty: null,
      status: 'no_evidence',
      summary: 'No evidence gives a layer count yet.',
      estimates: [],
    });
  });

  it('takes a single estimate as it is', () => {
    expect(combine([raman(1)])).toMatchObject({ layers: 1, uncertainty: 0, status: 'single', summary: 'Raman says 1.' });
    expect(combine([atLeast('raman', 2)])).toMatchObject({
      layers: null,
      atLeast: 2,
      status: 'single',
      summary: 'Raman says 2 or more.',
    });
  });

  it('agrees when one count fits every estimate', () => {
    expect(combine([contrast(1), raman(1), afm(1, 1)])).toMatchObject({
      layers: 1,
      uncertainty: 0,
      status: 'agreeing',
      summary: 'Contrast says 1, Raman says 1, AFM says 1 ± 1: they agree on 1 layer.',
    });
    // The loose estimate yields to the firm one inside the common range.
    expect(combine([contrast(2, 1), raman(1)])).toMatchObject({ layers: 1, uncertainty: 0, status: 'agreeing' });
    expect(combine([afm(2, 1), contrast(3, 1)])).toMatchObject({
      layers: 3,
      uncertainty: 1,
      summary: expect.stringMatching(/they agree on 3 layers \(± 1\)/),
    });
  });

  it('joins lower bounds with exact counts', () => {
    expect(combine([atLeast('raman', 2), contrast(3)])).toMatchObject({ layers: 3, status: 'agreeing' });
    expect(combine([atLeast('raman', 2), atLeast('pl', 2)])).toMatchObject({
      layers: null,
      atLeast: 2,
      status: 'agreeing',
      summary: 'Raman says 2 or more, PL says 2 or more: together, at least 2 layers.',
    });
  });

  it('says who says what when they disagree, and makes no call', () => {
    const call = combine([raman(1), contrast(2)]);
    expect(call).toMatchObject({ layers: null, atLeast: null, uncertainty: null, status: 'disagreeing' });
    expect(call.summary).toBe('Raman says 1, contrast says 2: they disagree, so there is no layer call.');
    expect(combine([atLeast('raman', 2), contrast(1)]).summary).toMatch(/^Raman says 2 or more, contrast says 1: they disagree/);
    expect(combine([raman(1), raman(2), afm(1)]).summary).toMatch(/^Raman says 1 and 2, AFM says 1: they disagree/);
  });

  it('counts repeated measurements by one method once in words', () => {
    expect(whoSaysWhat([raman(1), raman(1), contrast(1)])).toBe('Raman says 1 (2 measurements), contrast says 1');
  });

  it('keeps the estimates behind the call', () => {
    const items = [raman(1), contrast(1)];
    expect(combine(items).estimates).toEqual(items);
  });
});
