// One column per role: detection, the screen's role edits and the command line's --map follow
// the one rule of shared/import/columnMapping.ts (roleTakesOneColumn), notes included. The rule
// is the project's own (a sheet read with two yield or two notes columns would have to guess).
import { assignColumnRole, unitForRole } from '../shared/import/assignColumnRole';
import { describe, expect, it } from 'vitest';
import {
  MAPPED_ROLES,
  columnForRole,
  roleTakesOneColumn,
  type ColumnAssignment,
} from '../shared/import/columnMapping';
import { detectColumns } from '../shared/import/detectColumns';
import { readTrialFile } from '../shared/import/readTrialFile';
import { importFiles } from '../shared/import/importFiles';
import { setColumnRole } from '../renderer/src/analysis/edits';

const CSV = [
  'Site,Block,Plot,N rate (kg N/ha),Yield (kg/ha),Notes,Comments,Soil,Previous crop',
  'Ashby,1,101,0,6100,lodged corner,wet spot,loam,soybean',
  'Ashby,1,102,120,8900,,,loam,soybean',
  'Ashby,2,201,0,6300,,hail,loam,soybean',
  'Ashby,2,202,120,9100,checked,,loam,soybean',
].join('\n');

async function file() {
  const bytes = new TextEncoder().encode(CSV);
  return { name: 'notes twice.csv', bytes };
}

const column = (col: number, role: ColumnAssignment['role']): ColumnAssignment => ({
  col,
  letter: String.fromCharCode(64 + col),
  header: `h${col}`,
  role,
  unit: null,
  evidence: '',
});

describe('roleTakesOneColumn', () => {
  it('lets only grouping, treatment-factor and left-out columns repeat; notes take one column', () => {
    const many = MAPPED_ROLES.filter((r) => !roleTakesOneColumn(r));
    // Two factors (source and timing) at one site: tests/analysis.factorCrossing.test.ts.
    expect(many).toEqual(['group', 'factor', 'ignore']);
    expect(roleTakesOneColumn('notes')).toBe(true);
  });

  it('assignColumnRole sets the previous holder of a one-column role aside, for every role', () => {
    for (const role of MAPPED_ROLES) {
      const columns = [column(1, role), column(2, 'ignore'), column(3, 'site')];
      const next = assignColumnRole(columns, 2, role, { chosen: () => 'x', setAside: 'y' });
      const holders = next.filter((c) => c.role === role).map((c) => c.col);
      expect(holders, role).toEqual(roleTakesOneColumn(role) ? [2] : [1, 2]);
      expect(columns[0].role, 'the input is not changed').toBe(role);
    }
  });

  it("a new role brings a unit it takes (the header's, the one kept, or its first) and closes any question", () => {
    const asked = {
      ...column(5, 'yield'),
      header: 'Harvested grain (lb/plot)',
      unit: 't/ha' as const,
      question: { readings: [], why: 'unsure' },
    };
    const [toWeight] = assignColumnRole([asked], 5, 'plotWeight', {
      chosen: () => 'x',
      setAside: 'y',
    });
    // "lb/plot" is a plot weight's unit (headerWords); t/ha is not one.
    expect(toWeight).toMatchObject({ role: 'plotWeight', unit: 'lb' });
    expect(toWeight.question).toBeUndefined();
    const plain = { ...column(6, 'yield'), header: 'Grain', unit: 't/ha' as const };
    expect(unitForRole(plain, 'plotWeight')).toBe('kg');
    expect(unitForRole(plain, 'yield')).toBe('t/ha');
    expect(unitForRole(plain, 'block')).toBeNull();
  });

  it('a column given the rate by hand reads its header for product or nutrient, as detection does', () => {
    const urea = { ...column(3, 'ignore'), header: 'Urea (lb/ac)' };
    const [rate] = assignColumnRole([urea], 3, 'rate', { chosen: () => 'x', setAside: 'y' });
    expect(rate).toMatchObject({ role: 'rate', unit: 'lb/ac', basis: 'product', product: 'urea' });
    // Already the rate: a basis the user set stays.
    const set = { ...rate, basis: 'nutrient' as const, product: null };
    expect(assignColumnRole([set], 3, 'rate', { chosen: () => 'x', setAside: 'y' })[0].basis).toBe(
      'nutrient',
    );
  });

  it('columnForRole reads the first of two columns an older mapping gave one role', () => {
    const columns = [column(1, 'notes'), column(2, 'yield'), column(3, 'notes')];
    expect(columnForRole(columns, 'notes')?.col).toBe(1);
    expect(columnForRole(columns, 'rate')).toBeUndefined();
  });
});

describe('one notes column in detection, screen edits and --map', () => {
  it('detection keeps the first notes column and leaves the second for the user', async () => {
    const mapping = detectColumns(await readTrialFile(await file()));
    const cols = mapping.sheets[0].columns;
    expect(cols.filter((c) => c.role === 'notes').map((c) => c.header)).toEqual(['Notes']);
    const comments = cols.find((c) => c.header === 'Comments')!;
    expect(comments.role).toBe('ignore');
    expect(comments.evidence).toMatch(/another "notes" column/);
  });

  it('the screen moves notes to the chosen column instead of reading two', async () => {
    const mapping = detectColumns(await readTrialFile(await file()));
    const sheet = mapping.sheets[0];
    const comments = sheet.columns.find((c) => c.header === 'Comments')!;
    const next = setColumnRole(mapping, sheet.sheet, comments.col, 'notes');
    const notes = next.sheets[0].columns.filter((c) => c.role === 'notes');
    expect(notes.map((c) => c.header)).toEqual(['Comments']);
    // Groups still repeat: two grouping columns stay groups.
    const soil = sheet.columns.find((c) => c.header === 'Soil')!;
    const crop = sheet.columns.find((c) => c.header === 'Previous crop')!;
    let grouped = setColumnRole(mapping, sheet.sheet, soil.col, 'group');
    grouped = setColumnRole(grouped, sheet.sheet, crop.col, 'group');
    expect(grouped.sheets[0].columns.filter((c) => c.role === 'group')).toHaveLength(2);
  });

  it("--map notes=Comments reads the comments as the plots' notes", async () => {
    const { table, mapping } = await importFiles([await file()], {
      crop: 'corn',
      overrides: [{ role: 'notes', header: 'Comments' }],
    });
    expect(mapping.filter((e) => e.role === 'notes').map((e) => e.header)).toEqual(['Comments']);
    expect(table.plots.map((p) => p.notes)).toEqual(['wet spot', null, 'hail', null]);
  });
});
