import path from 'node:path';
import { PROJECT_FILE_EXTENSION } from '../shared/project/projectFormat';

/** Extensions of the trial spreadsheets import reads. */
export const TRIAL_FILE_EXTENSIONS = ['xlsx', 'xls', 'csv', 'tsv', 'txt'] as const;

/** What a path names, by its extension. */
export type FileKind = 'project' | 'trial' | 'other';

/**
 * Classify a file by its extension (case-insensitive).
 * @example fileKindOf('/data/Hollow Creek.XLSX') // 'trial'
 */
export function fileKindOf(filePath: string): FileKind {
  const ext = path.extname(filePath).slice(1).toLowerCase();
  if (ext === PROJECT_FILE_EXTENSION) return 'project';
  if ((TRIAL_FILE_EXTENSIONS as readonly string[]).includes(ext)) return 'trial';
  return 'other';
}

/**
 * The path with the given extension, added when the user typed a name without it.
 * @example withExtension('/t/North', 'plotrate') // '/t/North.plotrate'
 */
export function withExtension(filePath: string, extension: string): string {
  return path.extname(filePath).slice(1).toLowerCase() === extension.toLowerCase()
    ? filePath
    : `${filePath}.${extension}`;
}
