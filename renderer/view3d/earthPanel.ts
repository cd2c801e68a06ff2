/**
 * The Earth-centred panel (TEME, km, z up): the Earth drawn by us (WGS-84 ellipsoid, graticule
 * every 15°, lit from the camera), both orbits over one revolution around TCA, the catalogue at
 * TCA as points, and markers where the two objects are at the scrubber's time. The Earth turns
 * with sidereal time so its meridians sit where they are at that instant.
 */
import {
  BufferGeometry,
  Float32BufferAttribute,
  Group,
  Line,
  LineBasicMaterial,
  LineSegments,
  Mesh,
  Points,
  PointsMaterial,
  SphereGeometry,
  Vector3,
} from 'three';
import type { EncounterScene, SceneObject } from '../../core/scene/encounterScene.js';
import { trackPointAt } from '../../core/scene/track.js';
import { shadedMaterial } from './materials.js';
import { Panel, type PanelOptions } from './panel.js';
import {
  CATALOGUE_COLOUR,
  EARTH_COLOUR,
  EQUATOR_COLOUR,
  GRATICULE_COLOUR,
  markerTexture,
  PRIMARY_COLOUR,
  SPACE_BACKGROUND,
  tierColour,
  tierShape,
} from './style.js';

/** Graticule spacing (deg) and the lift above the surface that keeps lines out of the sea's depth. */
const GRATICULE_STEP_DEG = 15;
const GRATICULE_LIFT = 1.002;
/** Catalogue point size in px (not attenuated: a distant object stays visible). */
const CATALOGUE_POINT_PX = 2;
const MARKER_PX = 14;

/**
 * Segments around the drawn Earth: at a 300-px radius the silhouette's chord sag is
 * r(1 − cos(π/64)) ≈ 0.4 px. (96 cost twice the frame time on software rendering for nothing visible.)
 */
const EARTH_SEGMENTS = 64;


/**
 * Share of the catalogue drawn while the user drags (the whole catalogue returns when the drag
 * ends). On software rendering each point costs about as much as a small triangle (measured: 30,000
 * points cut the frame rate by more than half), so a uniform sample keeps turning fluid.
 */
export const DEFAULT_CATALOGUE_SHARE_WHILE_DRAGGING = 0.25;

/** The points in a fixed pseudo-random order, so any leading part is a uniform sample (seeded: every mount is the same). */
function shuffledPoints(flat: readonly number[]): Float32Array {
  const n = flat.length / 3;
  const out = new Float32Array(flat);
  let seed = 0x9e3779b9;
  const next = () => {
    // xorshift32 (Marsaglia 2003): cheap, deterministic, good enough to spread points
    seed ^= seed << 13;
    seed ^= seed >>> 17;
    seed ^= seed << 5;
    return (seed >>> 0) / 4294967296;
  };
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(next() * (i + 1));
    for (let c = 0; c < 3; c++) {
      const t = out[3 * i + c]!;
      out[3 * i + c] = out[3 * j + c]!;
      out[3 * j + c] = t;
    }
  }
  return out;
}

function graticule(radiusKm: number, polarScale: number): { lines: BufferGeometry; equator: BufferGeometry } {
  const pts: number[] = [];
  const eq: number[] = [];
  const at = (latDeg: number, lonDeg: number): [number, number, number] => {
    const la = (latDeg * Math.PI) / 180, lo = (lonDeg * Math.PI) / 180;
    const r = radiusKm * GRATICULE_LIFT;
    return [r * Math.cos(la) * Math.cos(lo), r * Math.cos(la) * Math.sin(lo), r * polarScale * Math.sin(la)];
  };
  const seg = (out: number[], a: [number, number, number], b: [number, number, number]) => out.push(...a, ...b);
  const step = 3; // deg between vertices along a line
  for (let lat = -90 + GRATICULE_STEP_DEG; lat < 90; lat += GRATICULE_STEP_DEG) {
    for (let lon = 0; lon < 360; lon += step) seg(lat === 0 ? eq : pts, at(lat, lon), at(lat, lon + step));
  }
  for (let lon = 0; lon < 360; lon += GRATICULE_STEP_DEG) {
    for (let lat = -90; lat < 90; lat += step) seg(lon === 0 ? eq : pts, at(lat, lon), at(lat + step, lon));
  }
  const g = (a: number[]) => {
    const b = new BufferGeometry();
    b.setAttribute('position', new Float32BufferAttribute(a, 3));
    return b;
  };
  return { lines: g(pts), equator: g(eq) };
}

function orbitLine(o: SceneObject, colour: string): Line {
  const g = new BufferGeometry();
  g.setAttribute('position', new Float32BufferAttribute(o.positionsTemeKm, 3));
  return new Line(g, new LineBasicMaterial({ color: colour }));
}

function marker(colour: string, shape: Parameters<typeof markerTexture>[0]): Points {
  const g = new BufferGeometry();
  g.setAttribute('position', new Float32BufferAttribute([0, 0, 0], 3));
  const m = new PointsMaterial({ color: colour, size: MARKER_PX, sizeAttenuation: false, map: markerTexture(shape), alphaTest: 0.5, depthTest: false, transparent: true });
  const p = new Points(g, m);
  p.renderOrder = 10;
  return p;
}

export class EarthPanel {
  readonly panel: Panel;
  private readonly earth = new Group();
  private readonly primaryMarker: Points;
  private readonly secondaryMarker: Points;

  constructor(
    host: HTMLElement,
    private readonly data: EncounterScene,
    opts: Pick<PanelOptions, 'halfResolutionWhileDragging' | 'onFrame'> & { readonly catalogueShareWhileDragging: number },
  ) {
    const count = data.catalogue.count;
    const whileDragging = Math.ceil(Math.min(1, Math.max(0, opts.catalogueShareWhileDragging)) * count);
    this.panel = new Panel(host, {
      name: 'earth', background: SPACE_BACKGROUND, up: [0, 0, 1], ...opts,
      onDrag: (dragging) => cat.setDrawRange(0, dragging ? whileDragging : count),
    });
    const { scene } = this.panel;
    const re = data.earth.equatorialRadiusKm;
    const polar = 1 - data.earth.flattening;

    const sea = new Mesh(new SphereGeometry(re, EARTH_SEGMENTS, Math.round((EARTH_SEGMENTS * 2) / 3)), shadedMaterial(EARTH_COLOUR));
    // SphereGeometry's poles are on y; the Earth's axis is TEME z.
    sea.rotation.x = Math.PI / 2;
    sea.scale.set(1, polar, 1);
    const grid = graticule(re, polar);
    this.earth.add(
      sea,
      new LineSegments(grid.lines, new LineBasicMaterial({ color: GRATICULE_COLOUR, transparent: true, opacity: 0.55 })),
      new LineSegments(grid.equator, new LineBasicMaterial({ color: EQUATOR_COLOUR })),
    );
    scene.add(this.earth);


    const cat = new BufferGeometry();
    cat.setAttribute('position', new Float32BufferAttribute(shuffledPoints(data.catalogue.positionsTemeKm), 3));
    scene.add(new Points(cat, new PointsMaterial({ color: CATALOGUE_COLOUR, size: CATALOGUE_POINT_PX, sizeAttenuation: false })));

    const sColour = tierColour(data.tier);
    scene.add(orbitLine(data.primary, PRIMARY_COLOUR), orbitLine(data.secondary, sColour));
    this.primaryMarker = marker(PRIMARY_COLOUR, 'circle');
    this.secondaryMarker = marker(sColour, tierShape(data.tier));
    scene.add(this.primaryMarker, this.secondaryMarker);

    // Start looking at the primary from outside its orbit, a little above its orbit plane.
    const s = data.primary.stateAtTcaTeme;
    const r = new Vector3(s[0], s[1], s[2]);
    const h = r.clone().cross(new Vector3(s[3], s[4], s[5])).normalize();
    const dir = r.clone().normalize().multiplyScalar(1).add(h.multiplyScalar(0.6));
    this.panel.camera.near = 50;
    this.panel.camera.far = 1e6;
    this.panel.controls.minDistance = re * 1.2;
    this.panel.controls.maxDistance = re * 40;
    this.panel.frameOn(new Vector3(0, 0, 0), dir, Math.max(3.6 * re, 2.8 * r.length()));
  }

  markerPosition(which: 'primary' | 'secondary'): Vector3 {
    return (which === 'primary' ? this.primaryMarker : this.secondaryMarker).position;
  }

  setTime(t: number): void {
    const d = this.data;
    this.earth.rotation.z = d.earth.gmstAtTcaRad + d.earth.rotationRateRadS * t;
    const p = trackPointAt(d.primary.timesS, d.primary.positionsTemeKm, t);
    const s = trackPointAt(d.secondary.timesS, d.secondary.positionsTemeKm, t);
    this.primaryMarker.position.set(p[0], p[1], p[2]);
    this.secondaryMarker.position.set(s[0], s[1], s[2]);
    this.panel.requestRender();
  }
}
