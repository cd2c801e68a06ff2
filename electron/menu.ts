/** The application menu: File (Import…, Quit) and Help (About). */
import { Menu, type MenuItemConstructorOptions } from 'electron';

export interface MenuActions {
  /** absent: Import… is shown disabled */
  readonly importFiles?: (() => void) | undefined;
  readonly about: () => void;
}

export function buildAppMenu(actions: MenuActions, platform: NodeJS.Platform = process.platform): Menu {
  const template: MenuItemConstructorOptions[] = [];
  if (platform === 'darwin') template.push({ role: 'appMenu' });
  template.push(
    {
      label: '&File',
      submenu: [
        {
          label: 'Import…',
          accelerator: 'CmdOrCtrl+O',
          enabled: actions.importFiles !== undefined,
          click: () => actions.importFiles?.(),
        },
        { type: 'separator' },
        { role: 'quit', label: 'Quit' },
      ],
    },
    { role: 'editMenu' },
    {
      label: '&Help',
      role: 'help',
      submenu: [{ label: 'About Keepclear', click: () => actions.about() }],
    },
  );
  return Menu.buildFromTemplate(template);
}
