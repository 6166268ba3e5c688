/**
 * How the page moves bytes in and out. In the desktop app the preload's
 * `window.plotrate` does it with native dialogs; in a browser the same calls
 * fall back to a file input and downloads. Components call only this, so
 * neither path leaks into the screens.
 */
import type {
  DesktopApi,
  ExportKind,
  TrialFileBytes,
} from '../../../shared/desktop/desktopContract';

/** What the screens need from either shell. */
export interface FileBridge {
  readonly isDesktop: boolean;
  /** Asks for trial files; resolves [] when the user cancels. */
  openTrialFiles(): Promise<TrialFileBytes[]>;
  /** Writes an export; resolves the name written, or null when cancelled. */
  exportFile(name: string, bytes: Uint8Array, kind: ExportKind): Promise<string | null>;
  /** Prints what is on screen (the grower page). */
  print(): Promise<void>;
  /** Saves what is on screen as a PDF; in a browser, the print dialog offers "Save as PDF". */
  savePdf(name: string): Promise<string | null>;
}

const mimeTypes: Record<ExportKind, string> = {
  xlsx: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
  csv: 'text/csv',
  pdf: 'application/pdf',
  json: 'application/json',
  png: 'image/png',
  svg: 'image/svg+xml',
};

/**
 * Reads the files a user chose or dropped into plain bytes.
 * @param files - a FileList or array of File
 * @returns name and bytes of each file, in the given order
 */
export async function readChosenFiles(files: ArrayLike<File>): Promise<TrialFileBytes[]> {
  const list = Array.from(files);
  return Promise.all(
    list.map(async (file) => ({
      name: file.name,
      bytes: new Uint8Array(await file.arrayBuffer()),
    })),
  );
}

/** The spreadsheet types the open dialog offers. */
export const TRIAL_FILE_ACCEPT = '.xlsx,.xls,.csv,.tsv,.txt';

/** The browser's bridge: a transient file input, anchor downloads, window.print. */
export function browserFileBridge(doc: Document = document): FileBridge {
  return {
    isDesktop: false,
    openTrialFiles() {
      return new Promise((resolve) => {
        const input = doc.createElement('input');
        input.type = 'file';
        input.multiple = true;
        input.accept = TRIAL_FILE_ACCEPT;
        input.addEventListener('change', () => {
          void readChosenFiles(input.files ?? []).then(resolve);
        });
        input.addEventListener('cancel', () => resolve([]));
        input.click();
      });
    },
    async exportFile(name, bytes, kind) {
      const blob = new Blob([bytes as BlobPart], { type: mimeTypes[kind] });
      const url = URL.createObjectURL(blob);
      const anchor = doc.createElement('a');
      anchor.href = url;
      anchor.download = name;
      doc.body.append(anchor);
      anchor.click();
      anchor.remove();
      // Revoke later: some browsers read the URL after click() returns.
      setTimeout(() => URL.revokeObjectURL(url), 60_000);
      return name;
    },
    async print() {
      window.print();
    },
    async savePdf() {
      window.print();
      return null;
    },
  };
}

/** The desktop bridge: every call goes to the shell through window.plotrate. */
export function desktopFileBridge(api: DesktopApi): FileBridge {
  return {
    isDesktop: true,
    openTrialFiles: () => api.openTrialFiles(),
    async exportFile(name, bytes, kind) {
      return (await api.exportFile(name, bytes, kind))?.name ?? null;
    },
    async print() {
      await api.printGrowerPage();
    },
    async savePdf(name) {
      return (await api.saveGrowerPdf(name))?.name ?? null;
    },
  };
}

/**
 * The bridge for where the page runs.
 * @returns the desktop bridge when window.plotrate is present, else the browser's
 */
export function chooseFileBridge(): FileBridge {
  const api = typeof window === 'undefined' ? undefined : window.plotrate;
  return api?.isDesktop ? desktopFileBridge(api) : browserFileBridge();
}
