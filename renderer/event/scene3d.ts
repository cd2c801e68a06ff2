/**
 * The 3-D panel of the event page. The three.js view (renderer/view3d) is mounted here once it
 * is part of the build; until then the panel says so.
 */
import type { PageBridge } from '../bridge.js';
import { el } from '../dom.js';

export class Scene3dPanel {
  constructor(
    _bridge: PageBridge,
    private readonly host: HTMLDivElement,
    private readonly scrub: HTMLInputElement,
    _out: HTMLOutputElement,
  ) {}

  async show(_eventId: string): Promise<void> {
    this.scrub.disabled = true;
    this.host.replaceChildren(el('p', { class: 'note', text: 'The 3-D view is not part of this build yet.' }));
  }

  clear(): void {
    this.host.replaceChildren();
  }
}
