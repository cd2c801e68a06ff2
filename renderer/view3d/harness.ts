/**
 * Stand-alone page for the 3-D view's browser test and benchmark (test/view3d-chromium.test.ts,
 * bench/ui3d.ts). The page gets its scene from the driver (`window.keepclearView3d.mount(scene)`),
 * records every frame, and keeps the canvases so a test can check their WebGL contexts after
 * dispose. Built with esbuild by test/support/view3dHarness.ts; not part of the app bundle.
 */
import type { EncounterScene } from '../../core/scene/encounterScene.js';
import { mountEncounterView, type EncounterView, type EncounterViewOptions } from './index.js';
import type { PanelName } from './panel.js';

interface Frame {
  readonly panel: PanelName;
  readonly renderMs: number;
  readonly atMs: number;
}

const frames: Frame[] = [];
let view: EncounterView | null = null;
let canvases: HTMLCanvasElement[] = [];

const api = {
  mount(scene: EncounterScene, opts: Omit<EncounterViewOptions, 'onFrame'> = {}, size = { width: 1200, height: 640 }): void {
    const host = document.getElementById('view')!;
    Object.assign(document.body.style, { margin: '0' });
    Object.assign(host.style, { width: `${size.width}px`, height: `${size.height}px` });
    view = mountEncounterView(host, scene, { ...opts, onFrame: (panel, renderMs, atMs) => frames.push({ panel, renderMs, atMs }) });
    canvases = Array.from(host.querySelectorAll('canvas'));
  },
  view: (): EncounterView => view!,
  frames: (): Frame[] => frames.splice(0),
  /** resolves after two animation frames: whatever was requested has been drawn */
  settle: (): Promise<void> => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => r()))),
  /** per canvas made by the view: is its WebGL context lost (true after dispose) */
  contextsLost: (): boolean[] => canvases.map((c) => (c.getContext('webgl2') ?? c.getContext('webgl'))?.isContextLost() ?? true),
  canvasCount: (): number => document.querySelectorAll('#view canvas').length,
};

declare global {
  interface Window {
    keepclearView3d: typeof api;
  }
}
window.keepclearView3d = api;
