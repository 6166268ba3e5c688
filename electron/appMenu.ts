import type { MenuItemConstructorOptions } from 'electron';
import type { MenuCommand } from '../shared/desktop/desktopContract';

/** What the menu needs from the shell. */
export interface MenuActions {
  /** Send a command to the page. */
  send(command: MenuCommand): void;
  /** Recent files, newest first, for the "Open Recent" submenu. */
  recent: { label: string; open: () => void }[];
  clearRecent(): void;
  /** Show the about box. */
  about(): void;
  /** Open the folder with the error log. */
  showLogFolder(): void;
}

/**
 * The application menu. Shortcuts are the platform's usual ones via
 * CmdOrCtrl; undo and redo go to the page (which knows its own history and
 * lets text fields undo typing), the rest of Edit uses Chromium's roles.
 *
 * @param platform process.platform; macOS gets the app menu and Window menu
 * @param developer true when not packaged: adds reload and developer tools
 */
export function buildMenuTemplate(
  actions: MenuActions,
  platform: NodeJS.Platform,
  developer: boolean,
): MenuItemConstructorOptions[] {
  const mac = platform === 'darwin';
  const command = (
    label: string,
    cmd: MenuCommand,
    accelerator?: string,
  ): MenuItemConstructorOptions => ({
    label,
    ...(accelerator ? { accelerator } : {}),
    click: () => actions.send(cmd),
  });
  const recentItems: MenuItemConstructorOptions[] =
    actions.recent.length === 0
      ? [{ label: 'No recent files', enabled: false }]
      : [
          ...actions.recent.map((r) => ({ label: r.label, click: r.open })),
          { type: 'separator' as const },
          { label: 'Clear Recent', click: actions.clearRecent },
        ];
  const file: MenuItemConstructorOptions = {
    label: '&File',
    submenu: [
      command('New Project', 'new-project', 'CmdOrCtrl+N'),
      command('Open Trial Spreadsheets…', 'open-trial-files', 'CmdOrCtrl+O'),
      command('Open Project…', 'open-project', 'CmdOrCtrl+Shift+O'),
      { label: 'Open Recent', submenu: recentItems },
      { type: 'separator' },
      command('Save Project', 'save', 'CmdOrCtrl+S'),
      command('Save Project As…', 'save-as', 'CmdOrCtrl+Shift+S'),
      command('Export Workbook…', 'export-workbook', 'CmdOrCtrl+E'),
      { type: 'separator' },
      command('Print Grower Page…', 'print-grower-page', 'CmdOrCtrl+P'),
      command('Save Grower Page as PDF…', 'save-grower-pdf', 'CmdOrCtrl+Shift+P'),
      ...(mac
        ? []
        : [
            { type: 'separator' as const },
            { role: 'quit' as const, label: 'Quit', accelerator: 'CmdOrCtrl+Q' },
          ]),
    ],
  };
  const edit: MenuItemConstructorOptions = {
    label: '&Edit',
    submenu: [
      command('Undo', 'undo', 'CmdOrCtrl+Z'),
      command('Redo', 'redo', mac ? 'Cmd+Shift+Z' : 'Ctrl+Y'),
      { type: 'separator' },
      { role: 'cut' },
      { role: 'copy' },
      { role: 'paste' },
      { role: 'selectAll' },
    ],
  };
  const view: MenuItemConstructorOptions = {
    label: '&View',
    submenu: [
      { role: 'resetZoom', accelerator: 'CmdOrCtrl+0' },
      { role: 'zoomIn', accelerator: 'CmdOrCtrl+=' },
      { role: 'zoomOut', accelerator: 'CmdOrCtrl+-' },
      { type: 'separator' },
      { role: 'togglefullscreen' },
      ...(developer
        ? [
            { type: 'separator' as const },
            { role: 'reload' as const },
            { role: 'toggleDevTools' as const },
          ]
        : []),
    ],
  };
  const help: MenuItemConstructorOptions = {
    label: '&Help',
    role: 'help',
    submenu: [
      ...(mac ? [] : [{ label: 'About Plotrate', click: actions.about }]),
      { label: 'Show Error Log Folder', click: actions.showLogFolder },
    ],
  };
  const template: MenuItemConstructorOptions[] = [file, edit, view];
  if (mac) {
    template.unshift({
      label: 'Plotrate',
      submenu: [
        { label: 'About Plotrate', click: actions.about },
        { type: 'separator' },
        { role: 'services' },
        { type: 'separator' },
        { role: 'hide' },
        { role: 'hideOthers' },
        { role: 'unhide' },
        { type: 'separator' },
        { role: 'quit', label: 'Quit Plotrate' },
      ],
    });
    template.push({ role: 'windowMenu' });
  }
  template.push(help);
  return template;
}
