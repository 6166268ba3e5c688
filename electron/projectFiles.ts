/** Reading and writing `.plotrate` files: the I/O around shared/project. */
import path from 'node:path';
import { parseProject, type ParsedProject } from '../shared/project/parseProject';
import type { PlotrateProject } from '../shared/project/projectFormat';
import { serializeProject } from '../shared/project/serializeProject';
import { writeFileAtomic } from './atomicWrite';
import { MAX_PROJECT_FILE_BYTES } from '../shared/project/projectFormat';
import { readCappedFile } from './readCappedFile';
import { OpenFileError } from './shellErrors';

/**
 * Read, check and (when older) migrate a project file. The file is only read.
 *
 * @param filePath absolute path of the .plotrate file
 * @returns the project in the current version and the version it had
 * @throws OpenFileError when the file is missing, too large or not UTF-8;
 *   ProjectFileError (from parseProject) naming the field when its content is wrong
 */
export async function readProjectFile(filePath: string): Promise<ParsedProject> {
  const name = path.basename(filePath);
  const bytes = await readCappedFile(
    filePath,
    MAX_PROJECT_FILE_BYTES,
    (size) => `is ${size} bytes, more than the ${MAX_PROJECT_FILE_BYTES} a project can be`,
  );
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new OpenFileError(filePath, 'is not a Plotrate project: its bytes are not UTF-8 text');
  }
  return parseProject(text, name);
}

/**
 * Save a project atomically (see atomicWrite.ts), stamping savedAt.
 *
 * @param filePath absolute path of the .plotrate file to create or replace
 * @param project the project to write
 * @param now the moment of saving (caller's clock)
 * @returns the savedAt written, ISO 8601 UTC
 */
export async function writeProjectFile(
  filePath: string,
  project: PlotrateProject,
  now: Date,
): Promise<string> {
  await writeFileAtomic(filePath, serializeProject(project, now));
  return now.toISOString();
}
