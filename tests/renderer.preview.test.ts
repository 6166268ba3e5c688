// The workspace shows a trial's sites before their resamples are drawn and before the regional
// mixed models are fitted (the analysis' preview), and nothing is reported from a preview: under Node, the window's state
// classes with the worker's job handlers on a MessageChannel (tests/support/nodeWorkspace). The
// state is read at the moment the preview arrives, then again at the end, where the whole
// result must equal the one-call analysis the command line runs. Invented sites (the project's
// seeded generator).
import { describe, expect, it } from 'vitest';
import { PENDING_REASON } from '../shared/analysis/acrossSites';
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { analyzeTrial } from '../shared/analysis/analyzeTrial';
import { syntheticCsv } from '../shared/demo/syntheticTrial';
import { illustrativePrices } from '../shared/economics/illustrativePrices';
import type { AnalysisPartial } from '../renderer/src/analysis/siteAnalysis';
import { nodeWorkspace } from './support/nodeWorkspace';

describe('the workspace’s preview of an analysis', () => {
  it('shows the sites with their draws and the regional models pending, reports nothing, then completes', async () => {
    const ws = nodeWorkspace();
    const name = 'Six sites.csv';
    await ws.openFiles([
      { name, bytes: new TextEncoder().encode(syntheticCsv({ sites: 6, seed: 12 })) },
    ]);
    const table = ws.trial.table!;
    const seen: {
      pending: boolean;
      drawsPending: boolean;
      withDraws: number;
      report: unknown;
      mixed: unknown;
      sites: number;
    }[] = [];
    // Watch the window's state as each early output arrives (the Jobs' own hook, wrapped).
    const run = ws.jobs.run.bind(ws.jobs);
    ws.jobs.run = ((label, kind, input, options = {}) =>
      run(label, kind, input, {
        ...options,
        onPartial: (output: AnalysisPartial) => {
          (options.onPartial as ((o: AnalysisPartial) => void) | undefined)?.(output);
          seen.push({
            pending: ws.analysis.regionalPending,
            drawsPending: ws.analysis.drawsPending,
            withDraws: ws.analysis.output!.across.sites.filter((s) => s.draws !== null).length,
            report: ws.report.report,
            mixed: ws.analysis.output?.across.mixed,
            sites: ws.analysis.sites.length,
          });
        },
      })) as typeof ws.jobs.run;
    await ws.analysis.run(table);
    const pendingMixed = { model: null, reason: PENDING_REASON };
    expect(seen).toEqual([
      {
        pending: true,
        drawsPending: true,
        withDraws: 0,
        report: null,
        mixed: pendingMixed,
        sites: 6,
      },
      {
        pending: true,
        drawsPending: false,
        withDraws: 6,
        report: null,
        mixed: pendingMixed,
        sites: 6,
      },
    ]);
    expect(ws.analysis.regionalPending).toBe(false);
    expect(ws.analysis.drawsPending).toBe(false);
    expect(ws.report.report).not.toBeNull();
    const settings = analysisSettings({
      prices: illustrativePrices(table.crop).canonical,
      blocks: 'auto',
    });
    const whole = analyzeTrial(table, settings);
    expect(ws.analysis.output!.across.mixed).toEqual(whole.across.mixed);
    expect(ws.analysis.output!.across.plateauMixed).toEqual(whole.across.plateauMixed);
    expect(ws.analysis.output!.across.groups).toEqual(whole.across.groups);
    // The draws laid into the preview are the one-call analysis' own.
    expect(ws.analysis.output!.across.sites).toEqual(whole.across.sites);
  });
});
