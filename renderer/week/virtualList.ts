/**
 * A list that stays smooth with tens of thousands of rows: only the rows in view (plus a few
 * either side) exist in the DOM, a fixed pool re-filled as the list scrolls, each placed with a
 * transform (compositor-only, no layout of the rest). Rows have one fixed height, so the
 * position of row i is i × height and nothing is measured while scrolling.
 *
 * Keyboard: the list itself takes focus; arrows, Page Up/Down, Home/End move the selection
 * (scrolled into view), Enter opens it. The selection is announced with aria-activedescendant.
 */
import { navigate } from './listModel.js';

export interface VirtualListOptions<T> {
  readonly rowHeightPx: number;
  /** fills a pooled row element for item `item` (called often: set text, not structure) */
  readonly fill: (row: HTMLElement, item: T, index: number) => void;
  /** makes the cells of a pooled row once */
  readonly build: (row: HTMLElement) => void;
  readonly onOpen: (item: T, index: number) => void;
  readonly onSelect?: (item: T, index: number) => void;
  /** rows kept beyond each edge of the view */
  readonly overscan?: number;
}

export class VirtualList<T> {
  readonly element: HTMLDivElement;
  private readonly spacer: HTMLDivElement;
  private readonly pool: HTMLDivElement[] = [];
  private items: readonly T[] = [];
  private selected = -1;
  private frame = 0;
  private readonly overscan: number;
  private readonly resize: ResizeObserver;

  constructor(private readonly opts: VirtualListOptions<T>) {
    this.overscan = opts.overscan ?? 6;
    this.element = document.createElement('div');
    this.element.className = 'vlist';
    this.element.tabIndex = 0;
    this.element.setAttribute('role', 'grid');
    this.spacer = document.createElement('div');
    this.spacer.className = 'vlist-spacer';
    this.element.append(this.spacer);
    this.element.addEventListener('scroll', () => this.schedule(), { passive: true });
    this.element.addEventListener('keydown', (ev) => this.onKey(ev));
    this.element.addEventListener('click', (ev) => this.onClick(ev));
    this.resize = new ResizeObserver(() => this.schedule());
    this.resize.observe(this.element);
  }

  setItems(items: readonly T[], keepSelected?: (item: T) => boolean): void {
    this.items = items;
    this.selected = keepSelected ? items.findIndex(keepSelected) : -1;
    this.spacer.style.height = `${items.length * this.opts.rowHeightPx}px`;
    this.element.setAttribute('aria-rowcount', String(items.length));
    this.render();
  }

  get selectedIndex(): number {
    return this.selected;
  }

  select(index: number, scroll = true): void {
    if (index < 0 || index >= this.items.length) return;
    this.selected = index;
    if (scroll) this.scrollIntoView(index);
    this.render();
    this.opts.onSelect?.(this.items[index]!, index);
  }

  dispose(): void {
    this.resize.disconnect();
    cancelAnimationFrame(this.frame);
  }

  private get pageRows(): number {
    return Math.max(1, Math.floor(this.element.clientHeight / this.opts.rowHeightPx) - 1);
  }

  private scrollIntoView(index: number): void {
    const h = this.opts.rowHeightPx;
    const top = index * h;
    const view = this.element.clientHeight;
    if (top < this.element.scrollTop) this.element.scrollTop = top;
    else if (top + h > this.element.scrollTop + view) this.element.scrollTop = top + h - view;
  }

  private schedule(): void {
    if (this.frame !== 0) return;
    this.frame = requestAnimationFrame(() => {
      this.frame = 0;
      this.render();
    });
  }

  private render(): void {
    const h = this.opts.rowHeightPx;
    const first = Math.max(0, Math.floor(this.element.scrollTop / h) - this.overscan);
    const visible = Math.ceil(this.element.clientHeight / h) + 2 * this.overscan;
    const last = Math.min(this.items.length, first + visible);
    if (this.pool.length < visible) for (const row of this.pool) delete row.dataset['index'];
    while (this.pool.length < visible) {
      const row = document.createElement('div');
      row.className = 'vrow';
      row.setAttribute('role', 'row');
      this.opts.build(row);
      this.spacer.append(row);
      this.pool.push(row);
    }
    let activeId = '';
    // Row i always lives in slot i mod pool size: scrolling by a few rows refills only the rows
    // that came into view; the others keep their text and position (no work, no layout).
    const n = this.pool.length;
    for (let k = 0; k < n; k++) {
      const row = this.pool[k]!;
      // the one index in [first, first + n) that maps to slot k
      const i = first + ((k - (first % n) + n) % n);
      if (i >= last) {
        if (!row.hidden) row.hidden = true;
        continue;
      }
      if (row.hidden) row.hidden = false;
      if (row.dataset['index'] !== String(i)) {
        row.dataset['index'] = String(i);
        row.id = `vrow-${i}`;
        row.setAttribute('aria-rowindex', String(i + 1));
        row.style.transform = `translateY(${i * h}px)`;
        this.opts.fill(row, this.items[i]!, i);
      }
      const isSelected = i === this.selected;
      if (row.classList.contains('selected') !== isSelected) {
        row.classList.toggle('selected', isSelected);
        row.setAttribute('aria-selected', String(isSelected));
      }
      if (isSelected) activeId = row.id;
    }
    if (activeId) this.element.setAttribute('aria-activedescendant', activeId);
    else this.element.removeAttribute('aria-activedescendant');
  }

  /** Re-fills every pooled row (the items changed in place). */
  refresh(): void {
    for (const row of this.pool) delete row.dataset['index'];
    this.render();
  }

  private onKey(ev: KeyboardEvent): void {
    if (ev.altKey || ev.ctrlKey || ev.metaKey) return;
    if (ev.key === 'Enter' && this.selected >= 0) {
      ev.preventDefault();
      this.opts.onOpen(this.items[this.selected]!, this.selected);
      return;
    }
    const next = navigate(ev.key, this.selected < 0 ? -1 : this.selected, this.items.length, this.pageRows);
    if (next === null) return;
    ev.preventDefault();
    this.select(this.selected < 0 && (ev.key === 'ArrowDown' || ev.key === 'j') ? 0 : next);
  }

  private onClick(ev: MouseEvent): void {
    const row = (ev.target as Element | null)?.closest('.vrow');
    if (!(row instanceof HTMLElement) || row.dataset['index'] === undefined) return;
    const i = Number(row.dataset['index']);
    this.select(i, false);
    this.element.focus({ preventScroll: true });
    this.opts.onOpen(this.items[i]!, i);
  }
}
