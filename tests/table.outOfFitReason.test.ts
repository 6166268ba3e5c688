// The plot list says why a plot is out of the fit with the same rule the fits use
// (shared/table/plotTable outOfFitReason, which analyzablePlots applies): a missing plot is never
// shown "in the fit". Plots invented for the check.
import { describe, expect, it } from 'vitest';
import { analyzablePlots, outOfFitReason, type Plot } from '../shared/table/plotTable';

const plot: Plot = {
  id: 'f|s|2',
  site: 'Test Site',
  year: null,
  block: '1',
  plotLabel: '101',
  treatment: null,
  rateKgHa: 120,
  yieldKgHa: 9000,
  moisturePct: null,
  testWeight: null,
  notes: null,
  groups: {},
  excluded: null,
  original: {},
};

describe('outOfFitReason', () => {
  it('names why a plot is out, and agrees with analyzablePlots plot by plot', () => {
    const cases: [Partial<Plot>, string | null][] = [
      [{}, null],
      [{ yieldKgHa: null }, 'no yield'],
      [{ rateKgHa: null }, 'no rate'],
      [{ rateKgHa: -40 }, 'rate negative'],
      [{ yieldKgHa: 1e9 }, 'yield beyond any practice'],
      [{ excluded: { reason: 'hail', by: 'user' } as Plot['excluded'] }, 'excluded (user): hail'],
    ];
    const plots = cases.map(([change], i) => ({ ...plot, id: `p${i}`, ...change }));
    cases.forEach(([, reason], i) => expect(outOfFitReason(plots[i])).toBe(reason));
    const table = { crop: 'corn' as const, standardMoisturePct: 15.5, plots, sources: [] };
    expect(analyzablePlots(table as never).map((p) => p.id)).toEqual(['p0']);
  });
});
