/**
 * The week: a run's close approaches in a virtualised list with tier counts, sort, filters
 * (tier, object, TCA window), search and keyboard navigation. Opening an event hands it to the
 * event page.
 */
import type { EventRow, RunSummary } from '../../core/bridge/contract.js';
import { TIERS } from '../../core/risk/tiers.js';
import type { PageBridge } from '../bridge.js';
import { byId, el, localInputToMs, messageOf, saveText } from '../dom.js';
import { runLabel, tierDisplay } from '../format.js';
import { COLUMNS, ROW_HEIGHT_PX } from './columns.js';
import { ALL_TIERS, applyQuery, DEFAULT_QUERY, prepareRows, tierCounts, type ListQuery, type ListRow, type SortKey, type TierFilter } from './listModel.js';
import { VirtualList } from './virtualList.js';

const TIER_NAMES: Record<TierFilter, { glyph: string; label: string }> = {
  plan: { glyph: TIERS.plan.glyph, label: TIERS.plan.label },
  monitor: { glyph: TIERS.monitor.glyph, label: TIERS.monitor.label },
  routine: { glyph: TIERS.routine.glyph, label: TIERS.routine.label },
  none: { glyph: '×', label: 'Not assessed' },
};

export interface WeekCallbacks {
  readonly open: (e: EventRow) => void;
  readonly status: (text: string, isError?: boolean) => void;
}

export class WeekView {
  private rows: ListRow[] = [];
  private shown: ListRow[] = [];
  private query: ListQuery = DEFAULT_QUERY;
  private runs: readonly RunSummary[] = [];
  private readonly list: VirtualList<ListRow>;
  private readonly ui = {
    run: byId('run', HTMLSelectElement),
    refresh: byId('refresh', HTMLButtonElement),
    runReport: byId('run-report', HTMLButtonElement),
    counts: byId('tier-counts', HTMLParagraphElement),
    tierBoxes: byId('tier-boxes', HTMLSpanElement),
    object: byId('f-object', HTMLInputElement),
    from: byId('f-from', HTMLInputElement),
    to: byId('f-to', HTMLInputElement),
    search: byId('f-search', HTMLInputElement),
    shown: byId('shown', HTMLParagraphElement),
    head: byId('list-head', HTMLDivElement),
    body: byId('list-body', HTMLDivElement),
    empty: byId('empty', HTMLParagraphElement),
    filters: byId('filters', HTMLFormElement),
  };

  constructor(private readonly bridge: PageBridge, private readonly cb: WeekCallbacks) {
    this.list = new VirtualList<ListRow>({
      rowHeightPx: ROW_HEIGHT_PX,
      build: (row) => {
        for (const c of COLUMNS) {
          const cell = el('span', { class: `cell c-${c.id}${c.numeric ? ' num' : ''}` });
          cell.setAttribute('role', 'gridcell');
          if (c.id === 'tier') cell.append(el('span', { class: 'glyph' }), el('span', { class: 'label' }));
          row.append(cell);
        }
      },
      fill: (row, r) => fillRow(row, r.event),
      onOpen: (r) => cb.open(r.event),
    });
    this.list.element.setAttribute('aria-label', 'Close approaches of the run');
    this.ui.body.append(this.list.element);
    this.buildHead();
    this.buildTierBoxes();
    this.ui.filters.addEventListener('submit', (e) => e.preventDefault());
    this.ui.filters.addEventListener('input', () => this.readFilters());
    this.ui.run.addEventListener('change', () => void this.showRun(this.ui.run.value));
    this.ui.refresh.addEventListener('click', () => void this.refresh());
    this.ui.runReport.addEventListener('click', () => void this.report());
  }

  focusList(): void {
    this.list.element.focus();
  }

  focusSearch(): void {
    this.ui.search.focus();
    this.ui.search.select();
  }

  get runId(): string {
    return this.ui.run.value;
  }

  /** The run's primaries, for the screening form's default. */
  get currentRun(): RunSummary | null {
    return this.runs.find((r) => r.id === this.ui.run.value) ?? null;
  }

  async refresh(preferRun?: string): Promise<void> {
    try {
      const { runs } = await this.bridge.invoke('runs.list', {});
      this.runs = runs;
      const keep = preferRun ?? this.ui.run.value;
      this.ui.run.replaceChildren(...(runs.length ? runs.map((r) => new Option(runLabel(r), r.id)) : [new Option('No runs yet', '')]));
      this.ui.run.disabled = runs.length === 0;
      const chosen = runs.some((r) => r.id === keep) ? keep : (runs.find((r) => r.status === 'done')?.id ?? runs[0]?.id ?? '');
      this.ui.run.value = chosen;
      await this.showRun(chosen);
    } catch (err) {
      this.cb.status(`Could not list the runs: ${messageOf(err)}`, true);
    }
  }

  private async showRun(runId: string): Promise<void> {
    this.ui.runReport.disabled = runId === '';
    if (runId === '') {
      this.setRows([]);
      this.ui.empty.textContent = 'No screening runs yet: import a catalogue, then start a new screening.';
      return;
    }
    this.cb.status(`Loading run ${runId}…`);
    try {
      const { events } = await this.bridge.invoke('runs.events', { runId });
      if (this.ui.run.value !== runId) return;
      this.setRows(events);
      this.ui.empty.textContent = 'This run found no close approaches within its screening volume.';
      this.cb.status('');
    } catch (err) {
      this.cb.status(`Could not load run ${runId}: ${messageOf(err)}`, true);
    }
  }

  private setRows(events: readonly EventRow[]): void {
    this.rows = prepareRows(events);
    const counts = tierCounts(this.rows);
    this.ui.counts.replaceChildren(
      ...ALL_TIERS.filter((t) => t !== 'none' || counts.none > 0).map((t) =>
        el('span', { class: `count tier-${t}` }, el('span', { class: 'glyph', text: TIER_NAMES[t].glyph }), ` ${counts[t]} ${TIER_NAMES[t].label}`),
      ),
    );
    this.apply();
  }

  private apply(): void {
    const selectedId = this.list.selectedIndex >= 0 ? this.shown[this.list.selectedIndex]?.event.id : undefined;
    this.shown = applyQuery(this.rows, this.query);
    this.list.setItems(this.shown, selectedId ? (r) => r.event.id === selectedId : undefined);
    this.ui.empty.hidden = this.rows.length > 0;
    this.ui.shown.textContent = this.rows.length ? `${this.shown.length.toLocaleString('en-US')} of ${this.rows.length.toLocaleString('en-US')} shown` : '';
    for (const b of Array.from(this.ui.head.querySelectorAll<HTMLButtonElement>('button[data-sort]'))) {
      const on = b.dataset['sort'] === this.query.sort;
      b.closest('[role=columnheader]')?.setAttribute('aria-sort', on ? (this.query.descending ? 'descending' : 'ascending') : 'none');
      b.dataset['dir'] = on ? (this.query.descending ? '▼' : '▲') : '';
    }
  }

  private readFilters(): void {
    const tiers = new Set<TierFilter>();
    for (const box of Array.from(this.ui.tierBoxes.querySelectorAll<HTMLInputElement>('input[type=checkbox]'))) if (box.checked) tiers.add(box.value as TierFilter);
    this.query = {
      ...this.query,
      tiers,
      object: this.ui.object.value,
      fromMs: localInputToMs(this.ui.from.value),
      toMs: localInputToMs(this.ui.to.value),
      search: this.ui.search.value,
    };
    this.apply();
  }

  private buildHead(): void {
    this.ui.head.style.height = `${ROW_HEIGHT_PX}px`;
    this.ui.head.replaceChildren(
      ...COLUMNS.map((c) => {
        const cell = el('span', { class: `cell c-${c.id}${c.numeric ? ' num' : ''}` });
        cell.setAttribute('role', 'columnheader');
        if (c.sort === null) {
          cell.textContent = c.label;
          return cell;
        }
        const b = el('button', { class: 'sort', text: c.label, title: `Sort by ${c.label}` });
        b.type = 'button';
        b.dataset['sort'] = c.sort;
        b.addEventListener('click', () => this.sortBy(c.sort!));
        cell.append(b);
        return cell;
      }),
    );
  }

  private sortBy(key: SortKey): void {
    const same = this.query.sort === key;
    // A new column starts in its natural order: urgent, close and likely first; otherwise ascending.
    const naturalDescending = key === 'pc' || key === 'tier';
    this.query = { ...this.query, sort: key, descending: same ? !this.query.descending : naturalDescending };
    this.apply();
  }

  private buildTierBoxes(): void {
    this.ui.tierBoxes.replaceChildren(
      ...ALL_TIERS.map((t) => {
        const box = el('input');
        box.type = 'checkbox';
        box.value = t;
        box.checked = true;
        return el('label', { class: `tier-box tier-${t}` }, box, el('span', { class: 'glyph', text: TIER_NAMES[t].glyph }), ` ${TIER_NAMES[t].label}`);
      }),
    );
  }

  private async report(): Promise<void> {
    const id = this.ui.run.value;
    if (!id) return;
    this.cb.status(`Making the report of run ${id}…`);
    try {
      const doc = await this.bridge.invoke('reports.make', { target: 'run', id });
      saveText(doc.fileName, doc.mediaType, doc.text);
      this.cb.status(`Report of run ${id} saved as ${doc.fileName}`);
    } catch (err) {
      this.cb.status(`Could not make the report: ${messageOf(err)}`, true);
    }
  }
}

function fillRow(row: HTMLElement, e: EventRow): void {
  const cells = row.children;
  const tier = tierDisplay(e.tier);
  const tierCell = cells[0] as HTMLElement;
  const t = e.tier ?? 'none';
  tierCell.className = `cell c-tier tier-${t}`;
  tierCell.title = tier.meaning;
  (tierCell.firstChild as HTMLElement).textContent = TIER_NAMES[t].glyph;
  (tierCell.lastChild as HTMLElement).textContent = ` ${tier.label === '—' ? 'n/a' : tier.label}`;
  for (let i = 1; i < COLUMNS.length; i++) (cells[i] as HTMLElement).textContent = COLUMNS[i]!.text(e);
  row.dataset['eventId'] = e.id;
}
