/**
 * When a site's plots get block terms. One rule for the quality checks, the analysis, the curve
 * fits' default and the report's ANOVA: block offsets whenever every plot of the site has a
 * block label and there are two blocks or more. A site with a plot that has no label is
 * analyzed without blocks (a block of one unlabeled plot would be a guess), and a single block
 * has no offset to estimate.
 */

/**
 * Whether a plot's block label names a block (not missing, not blank).
 * @param label - the plot's block label, null where the sheet has none
 * @returns true for a usable label
 * @example
 * isBlockLabel('2') // true
 * isBlockLabel(' ') // false
 */
export function isBlockLabel(label: string | null | undefined): label is string {
  return typeof label === 'string' && label.trim() !== '';
}

/**
 * Whether a site's plots take block terms: every plot labeled and at least two blocks.
 * @param labels - the block label of each plot of one site (null where there is none)
 * @returns true when the rate + block model and the curve fits use block offsets
 * @example
 * hasBlocks(['1', '1', '2', '2']) // true
 * hasBlocks(['1', '1', null, '2']) // false: one plot has no block
 * hasBlocks(['1', '1', '1']) // false: a single block
 */
export function hasBlocks(labels: ReadonlyArray<string | null>): boolean {
  if (!labels.every(isBlockLabel)) return false;
  return new Set(labels).size >= 2;
}

/**
 * The block terms a site gets when the user has not chosen: `'fixed'` (one offset per block)
 * when {@link hasBlocks}, else `'none'` (the `BlockTerms` of the response models).
 * @param labels - the block label of each plot of one site
 * @returns 'fixed' or 'none'
 * @example
 * defaultBlockTerms(['A', 'B', 'A', 'B']) // 'fixed'
 */
export function defaultBlockTerms(labels: ReadonlyArray<string | null>): 'fixed' | 'none' {
  return hasBlocks(labels) ? 'fixed' : 'none';
}
