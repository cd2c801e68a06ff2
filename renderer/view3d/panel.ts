/**
 * One 3-D panel: its own canvas, WebGL renderer, camera and orbit controls. Frames are drawn on
 * demand (a change of camera, time or size asks for one frame), never in a free-running loop, so
 * an idle view costs nothing. While the user drags, the drawing buffer drops to half resolution:
 * on software rendering the cost is mostly per pixel, and a quarter of the pixels keeps the
 * motion fluid; the full-resolution frame follows when the drag ends.
 */
import { Color, PerspectiveCamera, Scene, Vector3, WebGLRenderer } from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';

export type PanelName = 'earth' | 'rtn';

export interface PanelOptions {
  readonly name: PanelName;
  readonly background: string;
  /** the axis that stays up while orbiting */
  readonly up: readonly [number, number, number];
  readonly halfResolutionWhileDragging: boolean;
  /** called after each frame with the time spent in renderer.render (ms) */
  readonly onFrame?: ((panel: PanelName, renderMs: number, atMs: number) => void) | undefined;
  /** called before each frame (labels, clip planes that follow the camera) */
  readonly beforeRender?: () => void;
  /** called when a drag starts (true) and ends (false), before the next frame */
  readonly onDrag?: (dragging: boolean) => void;
}

/** Share of the device pixel ratio used while dragging (0.5 = a quarter of the pixels). */
export const DRAG_RESOLUTION_FACTOR = 0.5;

export class Panel {
  readonly root: HTMLDivElement;
  readonly canvas: HTMLCanvasElement;
  readonly renderer: WebGLRenderer;
  readonly scene = new Scene();
  readonly camera: PerspectiveCamera;
  readonly controls: OrbitControls;
  private frame = 0;
  private dragging = false;
  private disposed = false;
  private readonly observer: ResizeObserver;
  private readonly dpr: number;

  constructor(host: HTMLElement, private readonly opts: PanelOptions) {
    this.root = document.createElement('div');
    this.root.dataset['panel'] = opts.name;
    Object.assign(this.root.style, { position: 'relative', flex: '1 1 0', minWidth: '0', minHeight: '0', overflow: 'hidden' });
    this.canvas = document.createElement('canvas');
    Object.assign(this.canvas.style, { display: 'block', width: '100%', height: '100%', touchAction: 'none' });
    this.canvas.tabIndex = 0;
    this.root.append(this.canvas);
    host.append(this.root);

    this.renderer = new WebGLRenderer({ canvas: this.canvas, antialias: false, powerPreference: 'high-performance' });
    this.dpr = Math.min(window.devicePixelRatio || 1, 2);
    this.renderer.setPixelRatio(this.dpr);
    this.scene.background = new Color(opts.background);

    this.camera = new PerspectiveCamera(40, 1, 1, 1e6);
    this.camera.up.set(...opts.up);
    this.controls = new OrbitControls(this.camera, this.canvas);
    this.controls.enableDamping = false;
    this.controls.listenToKeyEvents(this.canvas);
    this.controls.addEventListener('change', this.requestRender);
    this.controls.addEventListener('start', this.onStart);
    this.controls.addEventListener('end', this.onEnd);

    this.observer = new ResizeObserver(() => this.resize());
    this.observer.observe(this.root);
    this.resize();
  }

  /** Frames the camera on `target` from `distance` along `direction`. */
  frameOn(target: Vector3, direction: Vector3, distance: number): void {
    this.controls.target.copy(target);
    this.camera.position.copy(direction.clone().normalize().multiplyScalar(distance).add(target));
    this.controls.update();
    this.requestRender();
  }

  readonly requestRender = (): void => {
    if (this.disposed || this.frame !== 0) return;
    this.frame = requestAnimationFrame(this.draw);
  };

  private readonly draw = (): void => {
    this.frame = 0;
    if (this.disposed) return;
    this.opts.beforeRender?.();
    const t0 = performance.now();
    this.renderer.render(this.scene, this.camera);
    const t1 = performance.now();
    this.opts.onFrame?.(this.opts.name, t1 - t0, t1);
  };

  private readonly onStart = (): void => {
    this.dragging = true;
    this.opts.onDrag?.(true);
    if (this.opts.halfResolutionWhileDragging) this.setResolution(this.dpr * DRAG_RESOLUTION_FACTOR);
  };

  private readonly onEnd = (): void => {
    this.dragging = false;
    this.opts.onDrag?.(false);
    if (this.opts.halfResolutionWhileDragging) this.setResolution(this.dpr);
    this.requestRender();
  };

  get isDragging(): boolean {
    return this.dragging;
  }

  private setResolution(ratio: number): void {
    this.renderer.setPixelRatio(ratio);
    this.resize();
  }

  private resize(): void {
    if (this.disposed) return;
    const w = Math.max(1, this.root.clientWidth), h = Math.max(1, this.root.clientHeight);
    this.renderer.setSize(w, h, false);
    this.camera.aspect = w / h;
    this.camera.updateProjectionMatrix();
    this.requestRender();
  }

  /** Width of the view at the target's distance (scene units): for scale read-outs. */
  viewWidthAtTarget(): number {
    const d = this.camera.position.distanceTo(this.controls.target);
    return 2 * d * Math.tan((this.camera.fov * Math.PI) / 360) * this.camera.aspect;
  }

  /** Frees everything the panel made: GPU objects, the WebGL context, listeners, DOM. */
  dispose(): void {
    if (this.disposed) return;
    this.disposed = true;
    if (this.frame !== 0) cancelAnimationFrame(this.frame);
    this.observer.disconnect();
    this.controls.removeEventListener('change', this.requestRender);
    this.controls.removeEventListener('start', this.onStart);
    this.controls.removeEventListener('end', this.onEnd);
    this.controls.stopListenToKeyEvents();
    this.controls.dispose();
    this.scene.traverse((o) => {
      const obj = o as { geometry?: { dispose(): void }; material?: { dispose(): void; map?: { dispose(): void } | null } | { dispose(): void }[] };
      obj.geometry?.dispose();
      const mats = Array.isArray(obj.material) ? obj.material : obj.material ? [obj.material] : [];
      for (const m of mats) {
        (m as { map?: { dispose(): void } | null }).map?.dispose();
        m.dispose();
      }
    });
    this.renderer.dispose();
    this.renderer.forceContextLoss();
    this.root.remove();
  }
}
