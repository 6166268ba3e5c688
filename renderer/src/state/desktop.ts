// The desktop shell's side of the workspace: menu commands, files handed in
// from outside, project save and open, unsaved-change notes and error logs.
import type { DesktopApi, MenuCommand } from '../../../shared/desktop/desktopContract';
import { currentProject, openProject } from './projectFile';
import type { Workspace } from './workspace.svelte';

function inTextField(): boolean {
  const el = document.activeElement;
  return (
    el instanceof HTMLTextAreaElement ||
    (el instanceof HTMLInputElement && !['radio', 'checkbox', 'range', 'button'].includes(el.type))
  );
}

async function command(ws: Workspace, api: DesktopApi, cmd: MenuCommand): Promise<void> {
  switch (cmd) {
    case 'open-trial-files':
      await ws.openFiles(await api.openTrialFiles());
      return;
    case 'open-project': {
      const opened = await api.openProject();
      if (opened) await openProject(ws, opened);
      return;
    }
    case 'save':
    case 'save-as': {
      const saved = await api.saveProject(currentProject(ws, api.appVersion), {
        saveAs: cmd === 'save-as',
      });
      if (saved) {
        api.noteUnsavedChanges(null);
        ws.messages.add('info', `Saved ${saved.name}`);
      }
      return;
    }
    case 'export-workbook':
      ws.step = 'report';
      await ws.report.exportWorkbook();
      return;
    case 'print-grower-page':
    case 'save-grower-pdf':
      ws.step = 'report';
      // One frame for the page to show before the shell prints it.
      await new Promise((resolve) => requestAnimationFrame(() => resolve(null)));
      if (cmd === 'print-grower-page') await ws.bridge.print();
      else await ws.bridge.savePdf(`Plotrate grower page ${ws.report.page?.subject ?? ''}.pdf`);
      return;
    case 'undo':
    case 'redo':
      if (inTextField()) document.execCommand(cmd);
      else if (cmd === 'undo') ws.trial.undo();
      else ws.trial.redo();
      return;
    case 'new-project':
      for (const file of [...ws.sources.files]) ws.sources.remove(file.name);
      ws.trial.projectTable = null;
      ws.step = 'files';
      api.noteUnsavedChanges(null);
      return;
  }
}

/**
 * Connects the workspace to the desktop shell.
 * @param ws - the workspace
 * @param api - window.plotrate
 * @returns a function that disconnects
 */
export function connectDesktop(ws: Workspace, api: DesktopApi): () => void {
  const fail = (where: string) => (error: unknown) => {
    const message = error instanceof Error ? error.message : String(error);
    ws.messages.add('error', 'That did not work', message);
    api.reportError({ message, stack: error instanceof Error ? error.stack : undefined, where });
  };
  const offMenu = api.onMenuCommand((cmd) => void command(ws, api, cmd).catch(fail(`menu ${cmd}`)));
  const offFiles = api.onFilesOpened((opened) => {
    for (const f of opened.failures)
      ws.messages.add('error', `${f.name} could not be opened`, f.message);
    void (async () => {
      if (opened.trialFiles.length > 0) await ws.openFiles(opened.trialFiles);
      if (opened.project) await openProject(ws, opened.project);
    })().catch(fail('files opened'));
  });
  const onError = (event: ErrorEvent) =>
    api.reportError({ message: event.message, stack: event.error?.stack, where: 'window.onerror' });
  window.addEventListener('error', onError);
  void api.pendingRecovery().then(async (recovered) => {
    if (!recovered) return;
    await openProject(ws, {
      name: recovered.name ?? 'unsaved work',
      project: recovered.project,
      migratedFrom: null,
    });
    ws.messages.add(
      'warning',
      'Recovered unsaved work',
      `Plotrate closed before this work was saved; it was kept at ${recovered.autosavedAt}. Save it to keep it.`,
    );
    await api.discardRecovery();
  }, fail('recovery'));
  return () => {
    offMenu();
    offFiles();
    window.removeEventListener('error', onError);
  };
}
