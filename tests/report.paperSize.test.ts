// Paper size: Letter where it is the usual paper size (the United States, Canada, Mexico, the
// Philippines, Chile, Colombia, Venezuela: common practice), A4 (ISO 216) elsewhere; without a
// region the display units decide.
import { describe, expect, it } from 'vitest';
import { paperSize } from '../shared/report/paperSize';

const metric = { rate: 'kg/ha', yield: 't/ha' } as const;
const us = { rate: 'lb/ac', yield: 'bu/ac' } as const;

describe('paperSize', () => {
  it.each([
    ['en-US', 'letter'],
    ['fr-CA', 'letter'],
    ['es-MX', 'letter'],
    ['en-GB', 'a4'],
    ['de-DE', 'a4'],
    ['zh-Hans-CN', 'a4'],
    ['US', 'letter'],
    ['AU', 'a4'],
  ] as const)('gives %s %s whatever the units', (region, paper) => {
    expect(paperSize(metric, region)).toBe(paper);
    expect(paperSize(us, region)).toBe(paper);
  });

  it('follows the units without a region (the command line)', () => {
    expect(paperSize(us)).toBe('letter');
    expect(paperSize(metric)).toBe('a4');
    expect(paperSize(metric, '')).toBe('a4');
    expect(paperSize(us, 'en')).toBe('letter');
  });
});
