// Projects saved before site-years existed still load, and their plots are analyzed by site and
// year: the saved shape did not change (plots always kept `site` and `year`), so no migration
// step is needed. The projects are the invented example of tests/project.exampleProject.
import { describe, expect, it } from 'vitest';
import { sitePlots } from '../shared/analysis/sitePlots';
import { parseProject } from '../shared/project/parseProject';
import { PROJECT_FORMAT_VERSION } from '../shared/project/projectFormat';
import { exampleProject, exampleProjectV1, projectFileText } from './project.exampleProject';

describe('older projects and site-years', () => {
  it('a one-season project keeps its site names and gains the year beside them', () => {
    const { project } = parseProject(projectFileText(exampleProject()), 'example.plotrate');
    expect(sitePlots(project.table!).map((s) => [s.site, s.year])).toEqual([
      ['Hollow Creek', 2025],
      ['Marl Ridge', 2025],
    ]);
  });

  it('a version 1 project holding one site in two years migrates and splits into site-years', () => {
    const v1 = exampleProjectV1();
    // The second site's plots as the first site's previous season, as a two-season file had it.
    v1.table!.plots = v1.table!.plots.map((p) =>
      p.site === 'Marl Ridge' ? { ...p, site: 'Hollow Creek', year: 2024 } : p,
    );
    const { project, migratedFrom } = parseProject(projectFileText(v1), 'old.plotrate');
    expect(migratedFrom).toBe(1);
    expect(project.version).toBe(PROJECT_FORMAT_VERSION);
    const units = sitePlots(project.table!);
    expect(units.map((s) => [s.site, s.siteName, s.year])).toEqual([
      ['Hollow Creek 2025', 'Hollow Creek', 2025],
      ['Hollow Creek 2024', 'Hollow Creek', 2024],
    ]);
    // Each season keeps its own four blocks (B1–B4 in both), not eight plots per block label.
    for (const u of units) expect(u.block.filter((b) => b === 'B1').length).toBeLessThanOrEqual(6);
  });
});
