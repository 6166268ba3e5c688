/**
 * Errors the shell's IPC handlers raise. Their messages reach the page (Electron
 * passes an invoked handler's error message through), so they say plainly what
 * and where.
 */

/** An IPC call with arguments of the wrong shape: names the call and the argument. */
export class IpcArgumentError extends Error {
  override readonly name = 'IpcArgumentError';
  constructor(
    readonly channel: string,
    readonly argument: string,
    detail: string,
  ) {
    super(`${channel}: argument ${argument} ${detail}`);
  }
}

/** An IPC call from a frame that is not the app's own page. */
export class IpcSenderError extends Error {
  override readonly name = 'IpcSenderError';
  constructor(
    readonly channel: string,
    readonly senderUrl: string,
  ) {
    super(
      `${channel}: refused a call from ${senderUrl || 'an unknown frame'}, which is not Plotrate's own page`,
    );
  }
}

/** A write the shell refuses because it would overwrite something the user gave. */
export class ProtectedFileError extends Error {
  override readonly name = 'ProtectedFileError';
  constructor(
    readonly filePath: string,
    detail: string,
  ) {
    super(`${filePath}: ${detail}`);
  }
}

/** A file that could not be read or is not of a kind Plotrate opens. */
export class OpenFileError extends Error {
  override readonly name = 'OpenFileError';
  constructor(
    readonly filePath: string,
    detail: string,
  ) {
    super(`${filePath}: ${detail}`);
  }
}
