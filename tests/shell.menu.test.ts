import type { MenuItemConstructorOptions } from 'electron';
import { describe, expect, it } from 'vitest';
import { buildMenuTemplate, type MenuActions } from '../electron/appMenu';
import type { MenuCommand } from '../shared/desktop/desktopContract';
import { filesFromArgv } from '../electron/launchArguments';

function flatten(items: MenuItemConstructorOptions[]): MenuItemConstructorOptions[] {
  return items.flatMap((i) => [i, ...(Array.isArray(i.submenu) ? flatten(i.submenu) : [])]);
}

function menu(platform: NodeJS.Platform, recent: MenuActions['recent'] = [], developer = false) {
  const sent: MenuCommand[] = [];
  const template = buildMenuTemplate(
    {
      send: (c) => sent.push(c),
      recent,
      clearRecent: () => undefined,
      about: () => undefined,
      showLogFolder: () => undefined,
    },
    platform,
    developer,
  );
  return { items: flatten(template), template, sent };
}

describe('buildMenuTemplate', () => {
  it('gives the usual shortcuts and sends each command to the page', () => {
    const { items, sent } = menu('linux');
    const expected: [string, string, MenuCommand][] = [
      ['Open Trial Spreadsheets…', 'CmdOrCtrl+O', 'open-trial-files'],
      ['Open Project…', 'CmdOrCtrl+Shift+O', 'open-project'],
      ['Save Project', 'CmdOrCtrl+S', 'save'],
      ['Save Project As…', 'CmdOrCtrl+Shift+S', 'save-as'],
      ['Export Workbook…', 'CmdOrCtrl+E', 'export-workbook'],
      ['Print Grower Page…', 'CmdOrCtrl+P', 'print-grower-page'],
      ['Undo', 'CmdOrCtrl+Z', 'undo'],
      ['Redo', 'Ctrl+Y', 'redo'],
    ];
    for (const [label, accelerator, command] of expected) {
      const item = items.find((i) => i.label === label);
      expect(item?.accelerator, label).toBe(accelerator);
      (item!.click as () => void)();
      expect(sent.at(-1)).toBe(command);
    }
    expect(items.find((i) => i.role === 'quit')?.accelerator).toBe('CmdOrCtrl+Q');
    for (const role of ['zoomIn', 'zoomOut', 'resetZoom', 'copy', 'paste'])
      expect(
        items.some((i) => i.role === role),
        role,
      ).toBe(true);
  });

  it('leaves developer tools out of a packaged app', () => {
    expect(menu('linux', [], false).items.some((i) => i.role === 'toggleDevTools')).toBe(false);
    expect(menu('linux', [], true).items.some((i) => i.role === 'toggleDevTools')).toBe(true);
  });

  it('follows macOS: an app menu with Quit first, Cmd+Shift+Z for redo, a Window menu', () => {
    const { template, items } = menu('darwin');
    expect(template[0].label).toBe('Plotrate');
    expect(flatten([template[0]]).some((i) => i.role === 'quit')).toBe(true);
    expect(items.find((i) => i.label === 'Redo')?.accelerator).toBe('Cmd+Shift+Z');
    expect(template.some((i) => i.role === 'windowMenu')).toBe(true);
  });

  it('lists recent files, newest first, and says so when there are none', () => {
    const opened: string[] = [];
    const { items } = menu('win32', [
      { label: 'North block.plotrate', open: () => opened.push('north') },
      { label: 'marl-ridge-n.csv', open: () => opened.push('marl') },
    ]);
    const recent = items.find((i) => i.label === 'Open Recent')!
      .submenu as MenuItemConstructorOptions[];
    expect(recent.map((i) => i.label ?? i.type)).toEqual([
      'North block.plotrate',
      'marl-ridge-n.csv',
      'separator',
      'Clear Recent',
    ]);
    (recent[1].click as () => void)();
    expect(opened).toEqual(['marl']);
    const empty = menu('win32').items.find((i) => i.label === 'Open Recent')!
      .submenu as MenuItemConstructorOptions[];
    expect(empty).toEqual([{ label: 'No recent files', enabled: false }]);
  });
});

describe('filesFromArgv', () => {
  it('takes project and trial files, skipping the program, switches and other files', () => {
    expect(
      filesFromArgv(
        [
          '/opt/Plotrate/plotrate',
          '--no-sandbox',
          'North.plotrate',
          '--type=x',
          'sheets/Hollow Creek.XLSX',
          'notes.docx',
          '/data/m.csv',
          'North.plotrate',
        ],
        '/home/ana/trials',
        1,
      ),
    ).toEqual([
      '/home/ana/trials/North.plotrate',
      '/home/ana/trials/sheets/Hollow Creek.XLSX',
      '/data/m.csv',
    ]);
  });

  it('skips "electron ." in development', () => {
    expect(filesFromArgv(['/x/electron', '.', 'a.tsv'], '/w', 2)).toEqual(['/w/a.tsv']);
    expect(filesFromArgv(['/x/electron', '/repo', 'a.tsv'], '/w', 2)).toEqual(['/w/a.tsv']);
  });
});
