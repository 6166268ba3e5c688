import { describe, expect, it } from 'vitest';
import { syntheticPlotTable } from '../shared/demo/syntheticTrial';
import { parseProject } from '../shared/project/parseProject';
import { serializeProject } from '../shared/project/serializeProject';
import { canonicalPrices, ILLUSTRATIVE_PRICES } from '../renderer/src/analysis/priceInputs';
import { projectFromWorkspace, sessionFromProject } from '../renderer/src/lib/projectView';
import type { Session } from '../renderer/src/lib/session';

describe('project file and workspace', () => {
  it('a saved project reopens with the same table, edits, prices and view (file bytes stay out)', () => {
    const table = syntheticPlotTable({ sites: 2 });
    const session: Session = {
      version: 1,
      files: [{ name: 'two.xlsx', base64: 'aGk=' }],
      edits: {
        mappings: {},
        settings: { crop: 'corn', rateBasis: 'nutrient' },
        decisions: { [table.plots[0].id]: { action: 'exclude', reason: 'flooded corner' } },
      },
      prices: { ...ILLUSTRATIVE_PRICES, illustrative: false, productPerKg: 0.7 },
      unitSystem: 'us',
      locale: 'de-DE',
      choices: { 'Site 0001': 'quadratic' },
      blocks: 'fixed',
      step: 'sites',
      selectedSite: 'Site 0002',
    };
    const prices = canonicalPrices(session.prices);
    const project = projectFromWorkspace(
      session,
      table,
      prices,
      { rate: 'lb/ac', yield: 'bu/ac' },
      new Date('2026-03-01T08:00:00Z'),
      '0.1.0',
    );
    const text = serializeProject(project, new Date('2026-03-01T09:00:00Z'));
    expect(text).not.toContain('aGk=');
    const reopened = parseProject(text, 'trial.plotrate').project;
    expect(reopened.table!.plots).toHaveLength(table.plots.length);
    expect(reopened.prices.nutrientPerKg).toBeCloseTo(prices.nutrientPricePerKg, 12);
    expect(sessionFromProject(reopened)).toEqual({ ...session, files: [] });
  });
});
