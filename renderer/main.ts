/**
 * The renderer: a run selector, the run's close approaches, and the details of one.
 * It talks only through `window.keepclear` (core/bridge/contract.ts), whichever host provides it.
 */
import type { BridgeApi, EventDetail, EventRow, RunSummary } from '../core/bridge/contract.js';
import {
  catalogLine,
  eventCells,
  formatFixed,
  formatPc,
  formatUtc,
  NONE,
  runLabel,
  tierDisplay,
} from './format.js';

function byId<T extends HTMLElement>(id: string, type: { new (): T }): T {
  const el = document.getElementById(id);
  if (!(el instanceof type)) throw new Error(`renderer: element #${id} missing from index.html`);
  return el;
}

const ui = {
  catalog: byId('catalog', HTMLParagraphElement),
  run: byId('run', HTMLSelectElement),
  refresh: byId('refresh', HTMLButtonElement),
  status: byId('status', HTMLParagraphElement),
  body: byId('events', HTMLTableElement).tBodies[0]!,
  empty: byId('empty', HTMLParagraphElement),
  detail: byId('detail', HTMLElement),
  detailTitle: byId('detail-title', HTMLHeadingElement),
  detailFields: byId('detail-fields', HTMLDListElement),
};

const NUMERIC_COLUMNS = new Set([3, 4, 5]);
const TIER_COLUMN = 6;

function setStatus(text: string, isError = false): void {
  ui.status.textContent = text;
  ui.status.classList.toggle('error', isError);
}

const messageOf = (err: unknown): string => (err instanceof Error ? err.message : String(err));

/** Drops answers that arrive after a newer request of the same kind was sent. */
function latestOnly(): () => () => boolean {
  let seq = 0;
  return () => {
    const mine = ++seq;
    return () => mine === seq;
  };
}
const nextRunRequest = latestOnly();
const nextEventRequest = latestOnly();

function clearDetail(): void {
  ui.detail.hidden = true;
  ui.detailFields.replaceChildren();
}

function renderEvents(events: readonly EventRow[], bridge: BridgeApi): void {
  clearDetail();
  const rows = events.map((e) => {
    const tr = document.createElement('tr');
    tr.tabIndex = 0;
    tr.dataset['eventId'] = e.id;
    eventCells(e).forEach((text, i) => {
      const td = document.createElement('td');
      td.textContent = text;
      if (NUMERIC_COLUMNS.has(i)) td.className = 'num';
      if (i === TIER_COLUMN) {
        const tier = tierDisplay(e.tier);
        td.className = 'tier';
        td.title = tier.meaning;
        if (tier.colour) td.style.setProperty('--tier-colour', tier.colour);
        else td.classList.add('tier-none');
      }
      tr.append(td);
    });
    const open = (): void => void showEvent(bridge, e.id, tr);
    tr.addEventListener('click', open);
    tr.addEventListener('keydown', (ev) => {
      if (ev.key === 'Enter' || ev.key === ' ') {
        ev.preventDefault();
        open();
      }
    });
    return tr;
  });
  ui.body.replaceChildren(...rows);
  ui.empty.hidden = events.length > 0;
  ui.empty.textContent = events.length > 0 ? '' : 'This run found no close approaches within its screening volume.';
}

function field(term: string, value: string): HTMLElement[] {
  const dt = document.createElement('dt');
  dt.textContent = term;
  const dd = document.createElement('dd');
  dd.textContent = value;
  return [dt, dd];
}

const triple = (v: readonly [number, number, number], digits: number): string =>
  v.map((x) => formatFixed(x, digits)).join(', ');

function renderDetail(e: EventDetail): void {
  ui.detailTitle.textContent = `${e.primary} – ${e.secondary}`;
  const tier = tierDisplay(e.tier);
  ui.detailFields.replaceChildren(
    ...field('Event', e.id),
    ...field('TCA (UTC)', formatUtc(e.tca)),
    ...field('Miss (km)', formatFixed(e.missKm, 3)),
    ...field('Miss R, T, N (km)', triple(e.rtnKm, 3)),
    ...field('Relative speed (km/s)', formatFixed(e.relativeSpeedKmS, 3)),
    ...field('Approach angle (deg)', formatFixed(e.approachAngleDeg, 1)),
    ...field('Volume entry (UTC)', formatUtc(e.entry)),
    ...field('Volume exit (UTC)', formatUtc(e.exit)),
    ...field('Pc', formatPc(e.pc)),
    ...field('Pc method', e.pcMethod ?? NONE),
    ...field('Covariance source', e.covarianceSource ?? NONE),
    ...field('Hard-body radius (m)', formatFixed(e.hardBodyRadiusM, 2)),
    ...field('Tier', tier.colour ? `${tier.label}: ${tier.meaning}` : tier.label),
    ...field('Primary elements epoch (UTC)', formatUtc(e.primaryEpoch)),
    ...field('Secondary elements epoch (UTC)', formatUtc(e.secondaryEpoch)),
    ...field('Warnings', e.warnings.length > 0 ? e.warnings.join('; ') : 'none'),
  );
  ui.detail.hidden = false;
}

async function showEvent(bridge: BridgeApi, eventId: string, row: HTMLTableRowElement): Promise<void> {
  const current = nextEventRequest();
  for (const r of Array.from(ui.body.rows)) r.setAttribute('aria-selected', String(r === row));
  try {
    const { event } = await bridge.invoke('events.get', { eventId });
    if (current()) renderDetail(event);
  } catch (err) {
    if (current()) setStatus(`Could not load event ${eventId}: ${messageOf(err)}`, true);
  }
}

async function showRun(bridge: BridgeApi, runId: string): Promise<void> {
  const current = nextRunRequest();
  if (runId === '') {
    renderEvents([], bridge);
    ui.empty.textContent = 'No screening runs yet. Import a catalogue and run a screening first.';
    setStatus('');
    return;
  }
  setStatus(`Loading run ${runId}…`);
  try {
    const { events } = await bridge.invoke('runs.events', { runId });
    if (!current()) return;
    renderEvents(events, bridge);
    setStatus(`${events.length} close approach${events.length === 1 ? '' : 'es'} in run ${runId}`);
  } catch (err) {
    if (current()) setStatus(`Could not load run ${runId}: ${messageOf(err)}`, true);
  }
}

function fillRuns(runs: readonly RunSummary[], keep: string): string {
  const options = runs.map((r) => {
    const o = document.createElement('option');
    o.value = r.id;
    o.textContent = runLabel(r);
    return o;
  });
  if (options.length === 0) {
    const o = document.createElement('option');
    o.value = '';
    o.textContent = 'No runs yet';
    options.push(o);
  }
  ui.run.replaceChildren(...options);
  ui.run.disabled = runs.length === 0;
  const chosen = runs.some((r) => r.id === keep) ? keep : (runs[0]?.id ?? '');
  ui.run.value = chosen;
  return chosen;
}

async function refresh(bridge: BridgeApi): Promise<void> {
  setStatus('Loading…');
  try {
    const [summary, list] = await Promise.all([
      bridge.invoke('catalog.summary', {}),
      bridge.invoke('runs.list', {}),
    ]);
    ui.catalog.textContent = catalogLine(summary.objectCount, summary.latestEpoch);
    const runId = fillRuns(list.runs, ui.run.value);
    await showRun(bridge, runId);
  } catch (err) {
    setStatus(`Could not reach Keepclear: ${messageOf(err)}`, true);
  }
}

function start(): void {
  const bridge = window.keepclear;
  if (!bridge) {
    ui.catalog.textContent = 'Catalogue: not connected';
    ui.run.replaceChildren(new Option('No connection', ''));
    ui.refresh.disabled = true;
    setStatus('No Keepclear bridge on this page. Open it from the desktop app or through `keepclear serve`.', true);
    return;
  }
  ui.run.addEventListener('change', () => void showRun(bridge, ui.run.value));
  ui.refresh.addEventListener('click', () => void refresh(bridge));
  void refresh(bridge);
}

start();
