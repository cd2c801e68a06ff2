/**
 * The 3-D view of one conjunction: two panels side by side (stacked when narrow) — the Earth with
 * both orbits and the catalogue, and the encounter in the primary's RTN frame — and a time
 * scrubber around TCA that moves the markers in both. Everything drawn comes from an
 * EncounterScene (core/scene), built by the host; this module only draws.
 *
 *   const view = mountEncounterView(el, scene);
 *   view.setTime(-30);   // 30 s before TCA
 *   view.dispose();      // frees GPU objects, both WebGL contexts, listeners and the DOM it made
 */
import { DECISION_AID_NOTE } from '../../core/risk/decisionAid.js';
import type { EncounterScene } from '../../core/scene/encounterScene.js';
import { DEFAULT_CATALOGUE_SHARE_WHILE_DRAGGING, EarthPanel } from './earthPanel.js';
import type { PanelName } from './panel.js';
import { projectPx, RtnPanel, type EllipsoidKind } from './rtnPanel.js';
import { el, formatDistanceM, formatFromTca, LABEL_INK, PRIMARY_COLOUR, SPACE_BACKGROUND, tierColour, tierGlyph, tierLabel } from './style.js';

export interface EncounterViewOptions {
  /** ellipsoids drawn at k σ (default 3) */
  readonly sigmaScale?: number;
  /** drop to half resolution while the user drags (default true) */
  readonly halfResolutionWhileDragging?: boolean;
  /** share of the catalogue drawn while dragging (default DEFAULT_CATALOGUE_SHARE_WHILE_DRAGGING, 0.25; 1 = all) */
  readonly catalogueShareWhileDragging?: number;
  /** starting time, s from TCA (default 0) */
  readonly initialTimeS?: number;
  /** called after each frame with the time spent in renderer.render (ms): benchmarks */
  readonly onFrame?: (panel: PanelName, renderMs: number, atMs: number) => void;
}

export interface EncounterView {
  dispose(): void;
  /** moves both panels to this time (s from TCA), clamped to the scene's range */
  setTime(secondsFromTca: number): void;
  /** where the markers are now (CSS px inside each panel's canvas), and the time shown: for tests */
  inspect(): { readonly timeS: number; readonly earth: { primary: [number, number]; secondary: [number, number] }; readonly rtn: { secondary: [number, number] } };
}

/**
 * Side by side or stacked: whichever gives panels closer to square (|ln aspect| smaller), since a
 * globe and a tumbling ellipsoid need both directions. Ties stack.
 */
export function stackPanels(width: number, height: number): boolean {
  if (!(width > 0 && height > 0)) return false;
  return Math.abs(Math.log(width / (height / 2))) <= Math.abs(Math.log(width / 2 / height));
}
const SCRUB_STEP_S = 0.5;

const pc = (x: number | null): string => (x === null ? 'no Pc' : x < 1e-10 ? 'Pc < 1e-10' : `Pc ${x.toExponential(1)}`);

export function mountEncounterView(host: HTMLElement, scene: EncounterScene, opts: EncounterViewOptions = {}): EncounterView {
  const k = opts.sigmaScale ?? 3;
  const half = opts.halfResolutionWhileDragging ?? true;
  const root = el('div', {
    display: 'flex', flexDirection: 'column', width: '100%', height: '100%', minHeight: '320px',
    background: SPACE_BACKGROUND, color: LABEL_INK, font: '13px sans-serif',
  });
  root.className = 'kc-view3d';
  const panels = el('div', { display: 'flex', flex: '1 1 auto', minHeight: '0', gap: '2px' });
  root.append(panels);
  host.append(root);

  const share = opts.catalogueShareWhileDragging ?? DEFAULT_CATALOGUE_SHARE_WHILE_DRAGGING;
  const earth = new EarthPanel(panels, scene, { halfResolutionWhileDragging: half, onFrame: opts.onFrame, catalogueShareWhileDragging: share });
  const rtn = new RtnPanel(panels, scene, { halfResolutionWhileDragging: half, onFrame: opts.onFrame, sigmaScale: k });

  const sColour = tierColour(scene.tier);
  const caption = (panel: HTMLElement, lines: (string | [string, string, string])[]) => {
    const box = el('div', {
      position: 'absolute', left: '6px', top: '6px', padding: '3px 6px', pointerEvents: 'none', lineHeight: '1.35',
      background: 'rgba(14, 20, 25, 0.72)', borderRadius: '3px',
    });
    for (const l of lines) {
      if (typeof l === 'string') box.append(el('div', {}, l));
      else {
        // The glyph carries the colour; the words stay in light ink (deep red on the dark ground is unreadable as text).
        const row = el('div');
        row.append(el('span', { color: l[1], textShadow: '0 0 2px #fff' }, l[0]), ` ${l[2]}`);
        box.append(row);
      }
    }
    panel.append(box);
  };
  caption(earth.panel.root, [
    'Around the Earth (TEME), one revolution each',
    ['●', PRIMARY_COLOUR, `${scene.primary.id} primary`],
    [tierGlyph(scene.tier), sColour, `${scene.secondary.id} secondary · ${tierLabel(scene.tier)}`],
    `catalogue at TCA: ${scene.catalogue.count.toLocaleString('en-GB')} objects` +
      (share < 1 ? ` (${Math.round(share * 100)} % shown while turning)` : ''),
  ]);
  const hbrNote = scene.hardBodyRadiusIsDefault ? ' (default)' : '';
  caption(rtn.panel.root, [
    `Encounter in ${scene.primary.id}'s RTN frame, to scale`,
    `miss ${formatDistanceM(scene.relative.missKm * 1000)} · ${scene.relative.relativeSpeedKmS.toFixed(2)} km/s · ${pc(scene.pc)}`,
    `ellipsoids ${k}σ · hard-body sphere ${formatDistanceM(scene.hardBodyRadiusM)}${hbrNote}`,
    ...(scene.covariance.source ? [`covariance: ${scene.covariance.source}`] : ['no covariance: ellipsoids not drawn']),
  ]);

  // Ellipsoid switches (only for the ellipsoids that exist).
  const switches = el('div', {
    // bottom left: the caption holds the top and the view-width read-out the bottom right
    position: 'absolute', left: '6px', bottom: '6px', padding: '3px 6px', display: 'flex', flexDirection: 'column', gap: '2px',
    background: 'rgba(14, 20, 25, 0.72)', borderRadius: '3px',
  });
  const names: Record<EllipsoidKind, string> = { combined: 'combined', primary: 'primary', secondary: 'secondary' };
  for (const kind of ['combined', 'primary', 'secondary'] as const) {
    if (!rtn.hasEllipsoid(kind)) continue;
    const label = el('label', { cursor: 'pointer' });
    const box = el('input');
    box.type = 'checkbox';
    box.checked = true;
    box.dataset['ellipsoid'] = kind;
    box.addEventListener('change', () => rtn.showEllipsoid(kind, box.checked));
    label.append(box, ` ${names[kind]} ellipsoid`);
    switches.append(label);
  }
  rtn.panel.root.append(switches);

  // The scrubber.
  const bar = el('div', { display: 'flex', alignItems: 'center', gap: '10px', padding: '6px 10px', flexWrap: 'wrap' });
  const range = el('input', { flex: '1 1 240px' });
  range.type = 'range';
  range.min = String(scene.timeRangeS[0]);
  range.max = String(scene.timeRangeS[1]);
  range.step = String(SCRUB_STEP_S);
  range.setAttribute('aria-label', 'Time from TCA (s)');
  const readout = el('output', { minWidth: '9em', fontVariantNumeric: 'tabular-nums' });
  const toTca = el('button', {}, 'Back to TCA');
  toTca.type = 'button';
  const note = el('div', { flexBasis: '100%', fontSize: '11px', opacity: '0.8' }, DECISION_AID_NOTE);
  bar.append(el('span', {}, 'Time'), range, readout, toTca, note);
  root.append(bar);

  let timeS = 0;
  const setTime = (t: number): void => {
    const [lo, hi] = scene.timeRangeS;
    timeS = Math.min(hi, Math.max(lo, Number.isFinite(t) ? t : 0));
    range.value = String(timeS);
    readout.value = formatFromTca(timeS);
    earth.setTime(timeS);
    rtn.setTime(timeS);
  };
  const onInput = () => setTime(Number(range.value));
  const onTca = () => setTime(0);
  range.addEventListener('input', onInput);
  toTca.addEventListener('click', onTca);

  const layout = (): void => {
    panels.style.flexDirection = stackPanels(panels.clientWidth, panels.clientHeight) ? 'column' : 'row';
  };
  const observer = new ResizeObserver(layout);
  observer.observe(root);
  layout();
  setTime(opts.initialTimeS ?? 0);

  let disposed = false;
  return {
    setTime: (t) => {
      if (!disposed) setTime(t);
    },
    inspect: () => ({
      timeS,
      earth: {
        primary: projectPx(earth.markerPosition('primary'), earth.panel),
        secondary: projectPx(earth.markerPosition('secondary'), earth.panel),
      },
      rtn: { secondary: rtn.secondaryMarkerPx() },
    }),
    dispose: () => {
      if (disposed) return;
      disposed = true;
      observer.disconnect();
      range.removeEventListener('input', onInput);
      toTca.removeEventListener('click', onTca);
      earth.panel.dispose();
      rtn.panel.dispose();
      root.remove();
    },
  };
}

export type { EncounterScene };
