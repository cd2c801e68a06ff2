/**
 * The encounter in the primary's RTN frame, to scale, in metres: the primary at the origin with
 * the hard-body sphere around it, the secondary's track relative to it over the scrubber's span,
 * and the covariance ellipsoids at TCA (k-σ, k = 3 unless set): the primary's at the origin, the
 * secondary's and the combined one at the secondary's TCA position.
 *
 * Screen axes: x = T (along-track), y = R (radial, up), z = −N, a proper rotation of (R, T, N),
 * so orbits and ellipsoids keep their handedness.
 */
import {
  BufferGeometry,
  Float32BufferAttribute,
  Group,
  Line,
  LineBasicMaterial,
  LineLoop,
  Mesh,
  Points,
  PointsMaterial,
  SphereGeometry,
  Vector3,
} from 'three';
import type { CovarianceEllipsoid, Vec3n } from '../../core/scene/ellipsoid.js';
import type { EncounterScene } from '../../core/scene/encounterScene.js';
import { trackPointAt } from '../../core/scene/track.js';
import { shadedMaterial } from './materials.js';
import { Panel, type PanelOptions } from './panel.js';
import {
  AXIS_COLOURS,
  COMBINED_COLOUR,
  el,
  formatDistanceM,
  HARD_BODY_COLOUR,
  LABEL_INK,
  markerTexture,
  PRIMARY_COLOUR,
  RTN_BACKGROUND,
  tierColour,
  tierShape,
} from './style.js';

/** (R, T, N) → screen (x, y, z) = (T, R, −N) */
export const rtnToView = (v: Vec3n, scale = 1): Vector3 => new Vector3(v[1] * scale, v[0] * scale, -v[2] * scale);

const MARKER_PX = 14;
const ELLIPSOID_OPACITY = 0.2;
const RING_SAMPLES = 96;

export type EllipsoidKind = 'primary' | 'secondary' | 'combined';

function ellipsoidGroup(e: CovarianceEllipsoid, k: number, colour: string, centreM: Vector3): Group {
  const g = new Group();
  const [a, b, c] = e.axesRtn.map((ax) => rtnToView(ax));
  g.matrixAutoUpdate = false;
  g.matrix.makeBasis(a!, b!, c!).scale(new Vector3(k * e.sigmaM[0], k * e.sigmaM[1], k * e.sigmaM[2])).setPosition(centreM);
  const shell = new Mesh(new SphereGeometry(1, 48, 24), shadedMaterial(colour, ELLIPSOID_OPACITY, 0.6));
  g.add(shell);
  // The three principal ellipses as rings: they carry the shape where the shell is faint.
  const ring = (i: number, j: number) => {
    const pts: number[] = [];
    for (let s = 0; s < RING_SAMPLES; s++) {
      const th = (2 * Math.PI * s) / RING_SAMPLES;
      const p = [0, 0, 0];
      p[i] = Math.cos(th);
      p[j] = Math.sin(th);
      pts.push(...p);
    }
    const geo = new BufferGeometry();
    geo.setAttribute('position', new Float32BufferAttribute(pts, 3));
    return new LineLoop(geo, new LineBasicMaterial({ color: colour }));
  };
  g.add(ring(0, 1), ring(0, 2), ring(1, 2));
  return g;
}

export class RtnPanel {
  readonly panel: Panel;
  private readonly secondaryMarker: Points;
  private readonly ellipsoids = new Map<EllipsoidKind, Group>();
  private readonly labels: { el: HTMLElement; at: Vector3 }[] = [];
  private readonly scaleText: HTMLElement;
  private readonly axisLengthM: number;

  constructor(
    host: HTMLElement,
    private readonly data: EncounterScene,
    opts: Pick<PanelOptions, 'halfResolutionWhileDragging' | 'onFrame'> & { readonly sigmaScale: number },
  ) {
    this.panel = new Panel(host, { name: 'rtn', background: RTN_BACKGROUND, up: [0, 1, 0], ...opts, beforeRender: () => this.beforeRender() });
    const { scene } = this.panel;
    const k = opts.sigmaScale;
    const sColour = tierColour(data.tier);
    const tcaM = rtnToView(data.relative.tcaRtnKm, 1000);

    // Hard-body sphere around the primary, to scale.
    const hb = new Mesh(new SphereGeometry(data.hardBodyRadiusM, 32, 16), shadedMaterial(HARD_BODY_COLOUR));
    scene.add(hb);

    const cov = data.covariance;
    const add = (kind: EllipsoidKind, e: CovarianceEllipsoid | null, colour: string, centre: Vector3) => {
      if (!e) return;
      const g = ellipsoidGroup(e, k, colour, centre);
      this.ellipsoids.set(kind, g);
      scene.add(g);
    };
    add('primary', cov.primary, PRIMARY_COLOUR, new Vector3());
    add('secondary', cov.secondary, sColour, tcaM);
    add('combined', cov.combined, COMBINED_COLOUR, tcaM);

    // Relative track (m) and the miss vector at TCA.
    const track = new BufferGeometry();
    const pos: number[] = [];
    for (let i = 0; i < data.relative.timesS.length; i++) {
      const v = rtnToView(data.relative.rtnKm.slice(3 * i, 3 * i + 3) as unknown as Vec3n, 1000);
      pos.push(v.x, v.y, v.z);
    }
    track.setAttribute('position', new Float32BufferAttribute(pos, 3));
    scene.add(new Line(track, new LineBasicMaterial({ color: sColour })));
    const miss = new BufferGeometry().setFromPoints([new Vector3(), tcaM]);
    scene.add(new Line(miss, new LineBasicMaterial({ color: LABEL_INK, transparent: true, opacity: 0.6 })));

    const prim = new Points(
      new BufferGeometry().setAttribute('position', new Float32BufferAttribute([0, 0, 0], 3)),
      new PointsMaterial({ color: PRIMARY_COLOUR, size: MARKER_PX, sizeAttenuation: false, map: markerTexture('circle'), alphaTest: 0.5, depthTest: false, transparent: true }),
    );
    prim.renderOrder = 10;
    this.secondaryMarker = new Points(
      new BufferGeometry().setAttribute('position', new Float32BufferAttribute([0, 0, 0], 3)),
      new PointsMaterial({ color: sColour, size: MARKER_PX, sizeAttenuation: false, map: markerTexture(tierShape(data.tier)), alphaTest: 0.5, depthTest: false, transparent: true }),
    );
    this.secondaryMarker.renderOrder = 11;
    scene.add(prim, this.secondaryMarker);

    // Frame the things that matter at TCA: the miss, the ellipsoids, the hard-body sphere.
    const sigmaMax = Math.max(0, ...[cov.primary, cov.secondary, cov.combined].map((e) => (e ? e.sigmaM[0] : 0)));
    const extent = Math.max(data.relative.missKm * 1000, k * sigmaMax, 4 * data.hardBodyRadiusM);
    this.axisLengthM = extent * 0.6;
    const axes: [keyof typeof AXIS_COLOURS, Vec3n][] = [['R', [1, 0, 0]], ['T', [0, 1, 0]], ['N', [0, 0, 1]]];
    for (const [name, dir] of axes) {
      const tip = rtnToView(dir, this.axisLengthM);
      scene.add(new Line(new BufferGeometry().setFromPoints([new Vector3(), tip]), new LineBasicMaterial({ color: AXIS_COLOURS[name] })));
      this.addLabel(`${name}`, tip, AXIS_COLOURS[name]);
    }
    this.scaleText = el('div', { position: 'absolute', right: '8px', bottom: '6px', color: LABEL_INK, font: '12px sans-serif', pointerEvents: 'none' });
    this.scaleText.dataset['role'] = 'scale';
    this.panel.root.append(this.scaleText);

    this.panel.controls.minDistance = Math.max(data.hardBodyRadiusM * 1.5, 0.5);
    this.panel.controls.maxDistance = 2e7;
    this.panel.frameOn(tcaM.clone().multiplyScalar(0.5), new Vector3(1, 0.7, 1.3), 3 * extent);
  }

  private addLabel(text: string, at: Vector3, colour: string): void {
    const e = el('div', { position: 'absolute', color: colour, font: 'bold 13px sans-serif', pointerEvents: 'none', transform: 'translate(-50%, -50%)' }, text);
    this.panel.root.append(e);
    this.labels.push({ el: e, at });
  }

  private beforeRender(): void {
    const cam = this.panel.camera;
    // Near and far follow the zoom: the view spans metres (hard-body sphere) to thousands of km (track).
    const d = cam.position.distanceTo(this.panel.controls.target);
    cam.near = Math.max(d * 1e-3, 1e-3);
    cam.far = d * 1e4;
    cam.updateProjectionMatrix();
    const w = this.panel.root.clientWidth, h = this.panel.root.clientHeight;
    for (const { el: e, at } of this.labels) {
      const p = at.clone().project(cam);
      e.hidden = p.z > 1;
      e.style.left = `${((p.x + 1) / 2) * w}px`;
      e.style.top = `${((1 - p.y) / 2) * h}px`;
    }
    this.scaleText.textContent = `view width ≈ ${formatDistanceM(this.panel.viewWidthAtTarget())}`;
  }

  setTime(t: number): void {
    const v = trackPointAt(this.data.relative.timesS, this.data.relative.rtnKm, t);
    this.secondaryMarker.position.copy(rtnToView(v, 1000));
    this.panel.requestRender();
  }

  showEllipsoid(kind: EllipsoidKind, visible: boolean): void {
    const g = this.ellipsoids.get(kind);
    if (g) g.visible = visible;
    this.panel.requestRender();
  }

  hasEllipsoid(kind: EllipsoidKind): boolean {
    return this.ellipsoids.has(kind);
  }

  /** Screen position (CSS px in the panel) of the secondary's marker, for tests. */
  secondaryMarkerPx(): [number, number] {
    return projectPx(this.secondaryMarker.position, this.panel);
  }
}

export function projectPx(at: Vector3, panel: Panel): [number, number] {
  const p = at.clone().project(panel.camera);
  return [((p.x + 1) / 2) * panel.root.clientWidth, ((1 - p.y) / 2) * panel.root.clientHeight];
}
