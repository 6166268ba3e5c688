// The committed demo workbook (invented farm, seeded generator), fetched as bytes.
import demoUrl from '../../../demo/wrenhollow-n-trials-2025.xlsx?url';
import type { TrialFileBytes } from '../../../shared/desktop/desktopContract';

/** File name the demo opens under. */
export const DEMO_FILE_NAME = 'wrenhollow-n-trials-2025.xlsx';

/**
 * Fetches the demo workbook shipped with the app.
 * @returns its name and bytes
 * @throws {Error} when the bundled file cannot be fetched (a broken build)
 */
export async function fetchDemoFile(): Promise<TrialFileBytes> {
  const response = await fetch(demoUrl);
  if (!response.ok)
    throw new Error(`the demo workbook is missing from this build (${response.status})`);
  return { name: DEMO_FILE_NAME, bytes: new Uint8Array(await response.arrayBuffer()) };
}
