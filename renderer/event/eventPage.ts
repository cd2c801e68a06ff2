/**
 * One event: every number with unit and source, warnings, received messages, the series, the
 * 3-D view, the encounter-plane and RTN plots (SVG drawn by the host from the reports' specs),
 * the manoeuvre panel, report and export — the caution wherever a decision is shown.
 */
import type { EventRow, EventView, ExportFormat } from '../../core/bridge/contract.js';
import type { PageBridge } from '../bridge.js';
import { byId, el, messageOf, saveText } from '../dom.js';
import { tierDisplay } from '../format.js';
import type { JobsView } from '../jobs/jobsView.js';
import { renderPlan } from './planPanel.js';
import { Scene3dPanel } from './scene3d.js';

/** Parses the host's SVG as XML (never as HTML, so nothing in it runs) and adopts it. */
function svgNode(svg: string): Node {
  const doc = new DOMParser().parseFromString(svg, 'image/svg+xml');
  const root = doc.documentElement;
  if (root.nodeName !== 'svg' || doc.getElementsByTagName('parsererror').length > 0) return el('p', { text: 'The plot could not be read.' });
  for (const bad of Array.from(root.querySelectorAll('script, foreignObject'))) bad.remove();
  return document.importNode(root, true);
}

export class EventPage {
  private current: EventRow | null = null;
  private seq = 0;
  private readonly scene: Scene3dPanel;
  private readonly ui = {
    page: byId('event', HTMLElement),
    title: byId('event-title', HTMLHeadingElement),
    tier: byId('event-tier', HTMLSpanElement),
    facts: byId('facts', HTMLTableElement),
    warnings: byId('warnings', HTMLUListElement),
    messages: byId('messages', HTMLDivElement),
    series: byId('series', HTMLParagraphElement),
    plots: byId('plots', HTMLDivElement),
    planForm: byId('plan-form', HTMLFormElement),
    planGo: byId('plan-go', HTMLButtonElement),
    planMiss: byId('plan-miss', HTMLInputElement),
    planPc: byId('plan-pc', HTMLInputElement),
    planMass: byId('plan-mass', HTMLInputElement),
    planIsp: byId('plan-isp', HTMLInputElement),
    planResult: byId('plan-result', HTMLDivElement),
    report: byId('event-report', HTMLButtonElement),
    exportFormat: byId('export-format', HTMLSelectElement),
    exportGo: byId('export', HTMLButtonElement),
  };

  constructor(
    private readonly bridge: PageBridge,
    private readonly jobs: JobsView,
    private readonly status: (text: string, isError?: boolean) => void,
  ) {
    this.scene = new Scene3dPanel(bridge, byId('view3d', HTMLDivElement));
    this.ui.planForm.addEventListener('submit', (e) => {
      e.preventDefault();
      void this.plan();
    });
    this.ui.report.addEventListener('click', () => void this.report());
    this.ui.exportGo.addEventListener('click', () => void this.export());
  }

  get shown(): boolean {
    return !this.ui.page.hidden;
  }

  hide(): void {
    this.ui.page.hidden = true;
    this.scene.clear();
    this.current = null;
  }

  async show(e: EventRow): Promise<void> {
    const mine = ++this.seq;
    this.current = e;
    this.ui.page.hidden = false;
    this.ui.page.dataset['eventId'] = e.id;
    this.ui.title.textContent = `${e.id}: ${e.primary} – ${e.secondary}`;
    const tier = tierDisplay(e.tier);
    this.ui.tier.className = `tier-badge tier-${e.tier ?? 'none'}`;
    this.ui.tier.textContent = tier.label;
    this.ui.tier.title = tier.meaning;
    this.ui.planResult.replaceChildren();
    this.ui.facts.tBodies[0]!.replaceChildren(el('tr', {}, el('td', { text: 'Loading…' })));
    this.ui.plots.replaceChildren(el('p', { text: 'Drawing the plots…' }));
    this.ui.plots.dataset['ready'] = 'no';
    void this.scene.show(e.id);
    try {
      const view = await this.bridge.invoke('events.view', { eventId: e.id });
      if (mine !== this.seq) return;
      this.fill(view);
    } catch (err) {
      if (mine === this.seq) this.status(`Could not load event ${e.id}: ${messageOf(err)}`, true);
    }
  }

  private fill(v: EventView): void {
    for (const c of Array.from(document.querySelectorAll<HTMLElement>('[data-caution]'))) c.textContent = v.caution;
    this.ui.facts.tBodies[0]!.replaceChildren(
      ...v.facts.map((f) => el('tr', {}, el('th', { text: f.label }), el('td', { class: 'num', text: f.value }), el('td', { text: f.unit }), el('td', { class: 'source', text: f.source }))),
    );
    this.ui.warnings.replaceChildren(...(v.warnings.length ? v.warnings.map((w) => el('li', { class: 'warn', text: w })) : [el('li', { text: 'No warnings from the assessment.' })]));
    this.ui.messages.replaceChildren(
      v.messages.length
        ? el('ul', {}, ...v.messages.map((m) => el('li', { text: `${m.originator} ${m.messageId}, created ${m.creationDate}: miss ${m.missDistanceM.toFixed(1)} m, reported Pc ${m.reportedPc === null ? '—' : m.reportedPc.toExponential(2)}` })))
        : el('p', { text: 'No received message is linked to this event.' }),
    );
    this.ui.planMass.value = v.spacecraft.massKg === null ? '' : String(v.spacecraft.massKg);
    this.ui.planIsp.value = v.spacecraft.ispS === null ? '' : String(v.spacecraft.ispS);
    this.ui.series.textContent = v.series ? `${v.series.id}: ${v.series.state} (${v.series.sightings} sighting${v.series.sightings === 1 ? '' : 's'})` : 'Not part of a recorded series.';
    this.ui.plots.replaceChildren(
      ...v.plots.map((p) => {
        const fig = el('figure', { class: 'plot' }, svgNode(p.svg), el('figcaption', { text: p.caption }));
        fig.dataset['plot'] = p.name;
        return fig;
      }),
      ...v.notes.map((n) => el('p', { class: 'note', text: n })),
    );
    this.ui.plots.dataset['ready'] = 'yes';
  }

  private async plan(): Promise<void> {
    const e = this.current;
    if (!e) return;
    const byMiss = (this.ui.planForm.elements.namedItem('target') as RadioNodeList).value === 'miss';
    const pc = Number(this.ui.planPc.value);
    const mass = this.ui.planMass.valueAsNumber;
    const isp = this.ui.planIsp.valueAsNumber;
    const req = {
      kind: 'plan' as const,
      eventId: e.id,
      ...(byMiss ? { targetMissKm: this.ui.planMiss.valueAsNumber } : { targetPc: pc }),
      ...(Number.isFinite(mass) ? { massKg: mass } : {}),
      ...(Number.isFinite(isp) ? { ispS: isp } : {}),
    };
    this.ui.planGo.disabled = true;
    this.ui.planResult.replaceChildren(el('p', { text: 'Planning… (progress above)' }));
    try {
      const s = await this.jobs.run(req);
      if (this.current?.id !== e.id) return;
      if (s.result?.kind === 'plan') this.ui.planResult.replaceChildren(renderPlan(s.result.plan));
      else this.ui.planResult.replaceChildren(el('p', { class: 'warn', text: s.error ?? `Planning ${s.state}.` }));
    } catch (err) {
      this.ui.planResult.replaceChildren(el('p', { class: 'warn', text: `Planning not started: ${messageOf(err)}` }));
    } finally {
      this.ui.planGo.disabled = false;
    }
  }

  private async report(): Promise<void> {
    const e = this.current;
    if (!e) return;
    try {
      const doc = await this.bridge.invoke('reports.make', { target: 'event', id: e.id });
      saveText(doc.fileName, doc.mediaType, doc.text);
      this.status(`Report of ${e.id} saved as ${doc.fileName}`);
    } catch (err) {
      this.status(`Could not make the report: ${messageOf(err)}`, true);
    }
  }

  private async export(): Promise<void> {
    const e = this.current;
    if (!e) return;
    const format = this.ui.exportFormat.value as ExportFormat;
    try {
      const doc = await this.bridge.invoke('exports.make', { eventId: e.id, format });
      saveText(doc.fileName, doc.mediaType, doc.text);
      this.status(`${e.id} exported as ${doc.fileName}`);
    } catch (err) {
      this.status(`Could not export ${e.id}: ${messageOf(err)}`, true);
    }
  }
}
