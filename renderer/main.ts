/**
 * The renderer: the week (a run's events), one event (numbers, plots, 3-D, plan), and the work
 * in progress (import, screening, plan). It talks only through the bridge (renderer/bridge.ts):
 * the desktop app's preload, or `keepclear serve` over loopback HTTP.
 */
import type { EventRow, JobStatus } from '../core/bridge/contract.js';
import { TIERS, TIER_ORDER } from '../core/risk/tiers.js';
import { pageBridge, type PageBridge } from './bridge.js';
import { byId, messageOf } from './dom.js';
import { EventPage } from './event/eventPage.js';
import { catalogLine } from './format.js';
import { JobsView } from './jobs/jobsView.js';
import { WeekView } from './week/weekView.js';

const statusLine = byId('status', HTMLParagraphElement);
function setStatus(text: string, isError = false): void {
  statusLine.textContent = text;
  statusLine.classList.toggle('error', isError);
}

/** The tier palette comes from core/risk/tiers.ts, the one place it is defined. */
function tierColours(): void {
  for (const id of TIER_ORDER) {
    document.documentElement.style.setProperty(`--tier-${id}`, TIERS[id].colour);
    document.documentElement.style.setProperty(`--tier-${id}-ink`, TIERS[id].textColour);
  }
}

async function catalog(bridge: PageBridge): Promise<void> {
  try {
    const s = await bridge.invoke('catalog.summary', {});
    byId('catalog', HTMLParagraphElement).textContent = catalogLine(s.objectCount, s.latestEpoch);
  } catch (err) {
    setStatus(`Could not reach Keepclear: ${messageOf(err)}`, true);
  }
}

function start(): void {
  tierColours();
  const bridge = pageBridge();
  if (!bridge) {
    byId('catalog', HTMLParagraphElement).textContent = 'Catalogue: not connected';
    setStatus('No connection to Keepclear on this page. Open it from the desktop app, or open the URL that `keepclear serve` printed (it carries a token).', true);
    for (const b of Array.from(document.querySelectorAll('button'))) b.disabled = true;
    return;
  }
  const weekSection = byId('week', HTMLElement);
  let week: WeekView;
  let eventPage: EventPage;

  const openEvent = (e: EventRow): void => {
    weekSection.hidden = true;
    if (location.hash !== `#/event/${encodeURIComponent(e.id)}`) history.pushState(null, '', `#/event/${encodeURIComponent(e.id)}`);
    void eventPage.show(e);
    byId('back', HTMLButtonElement).focus();
  };
  const showWeek = (): void => {
    eventPage.hide();
    weekSection.hidden = false;
    if (location.hash !== '') history.pushState(null, '', location.pathname + location.search);
    week.focusList();
  };

  const jobs = new JobsView(bridge, {
    status: setStatus,
    finished: (s: JobStatus) => {
      if (s.kind === 'import') void catalog(bridge);
      if (s.kind === 'screen' && s.result?.kind === 'screen') void week.refresh(s.result.runId);
      if (s.kind === 'plan') void week.refresh();
    },
    screenDefaults: () => {
      const run = week.currentRun;
      return {
        primaries: run && run.primaries !== 'all' ? run.primaries.join(',') : '',
        startIso: run?.start ?? new Date(Math.floor(Date.now() / 86_400_000) * 86_400_000).toISOString(),
        days: run ? Math.round(((Date.parse(run.end) - Date.parse(run.start)) / 86_400_000) * 100) / 100 : 7,
        thresholdKm: run?.volume.kind === 'sphere' ? run.volume.radiusKm : 5,
      };
    },
  });
  week = new WeekView(bridge, { open: openEvent, status: setStatus });
  eventPage = new EventPage(bridge, jobs, setStatus);

  byId('back', HTMLButtonElement).addEventListener('click', showWeek);
  window.addEventListener('popstate', () => {
    if (!location.hash.startsWith('#/event/') && eventPage.shown) showWeek();
  });
  document.addEventListener('keydown', (ev) => {
    const typing = ev.target instanceof HTMLInputElement || ev.target instanceof HTMLSelectElement || ev.target instanceof HTMLTextAreaElement;
    if (ev.key === 'Escape' && eventPage.shown && !document.querySelector('dialog[open]')) {
      ev.preventDefault();
      showWeek();
    } else if (ev.key === '/' && !typing && !eventPage.shown) {
      ev.preventDefault();
      week.focusSearch();
    }
  });
  void catalog(bridge);
  void week.refresh().then(() => week.focusList());
}

start();
