import { realpath } from 'node:fs/promises';
import path from 'node:path';
import { ProtectedFileError } from './shellErrors';

/**
 * Remembers every spreadsheet the user imported from, so that no save or
 * export can land on one: source spreadsheets are never written to. Paths are
 * compared after resolving symbolic links, and case-insensitively on Windows
 * and macOS, whose usual file systems ignore case.
 */
export class SourceGuard {
  readonly #sources = new Set<string>();

  /** @param caseInsensitive true on win32 and darwin */
  constructor(private readonly caseInsensitive: boolean = process.platform !== 'linux') {}

  /** Record a file the user imported from. */
  async remember(filePath: string): Promise<void> {
    this.#sources.add(await this.#key(filePath));
  }

  /**
   * Throw when target is a remembered source spreadsheet.
   * @throws ProtectedFileError naming the file
   */
  async assertWritable(target: string): Promise<void> {
    if (this.#sources.has(await this.#key(target)))
      throw new ProtectedFileError(
        target,
        'is a spreadsheet this project was imported from; Plotrate never writes to its sources — choose another name',
      );
  }

  async #key(filePath: string): Promise<string> {
    let resolved = path.resolve(filePath);
    try {
      resolved = await realpath(resolved);
    } catch {
      // A file that does not exist yet: resolve its folder instead, so a link to the folder still matches.
      try {
        resolved = path.join(await realpath(path.dirname(resolved)), path.basename(resolved));
      } catch {
        // Folder missing too: the write will fail on its own.
      }
    }
    return this.caseInsensitive ? resolved.toLowerCase() : resolved;
  }
}
