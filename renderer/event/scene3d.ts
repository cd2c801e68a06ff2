/**
 * The 3-D panel of the event page: asks the host for the event's scene (core/scene, built over
 * the bridge) and mounts the three.js view (renderer/view3d) with its own time scrubber. The
 * view's code is loaded on first use, so the week's list does not wait for three.js. Opening
 * another event or leaving the page disposes the view (WebGL contexts, listeners, DOM).
 */
import type { PageBridge } from '../bridge.js';
import { el, messageOf } from '../dom.js';

interface Mounted {
  dispose(): void;
}

export class Scene3dPanel {
  private view: Mounted | null = null;
  private seq = 0;

  constructor(
    private readonly bridge: PageBridge,
    private readonly host: HTMLDivElement,
  ) {}

  async show(eventId: string): Promise<void> {
    const mine = ++this.seq;
    this.clear();
    this.host.dataset['state'] = 'loading';
    this.host.replaceChildren(el('p', { class: 'note', text: 'Building the scene…' }));
    try {
      const [scene, { mountEncounterView }] = await Promise.all([this.bridge.invoke('events.scene', { eventId }), import('../view3d/index.js')]);
      if (mine !== this.seq) return;
      this.host.replaceChildren();
      this.view = mountEncounterView(this.host, scene);
      this.host.dataset['state'] = 'shown';
    } catch (err) {
      if (mine !== this.seq) return;
      this.host.dataset['state'] = 'failed';
      this.host.replaceChildren(el('p', { class: 'note', text: `No 3-D view: ${messageOf(err)}` }));
    }
  }

  clear(): void {
    this.view?.dispose();
    this.view = null;
    this.host.replaceChildren();
    delete this.host.dataset['state'];
  }
}
