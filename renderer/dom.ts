/** Small DOM helpers: the page is built from index.html plus these; no framework. */
export function byId<T extends HTMLElement>(id: string, type: { new (): T }): T {
  const el = document.getElementById(id);
  if (!(el instanceof type)) throw new Error(`renderer: element #${id} missing from index.html`);
  return el;
}

export function el<K extends keyof HTMLElementTagNameMap>(tag: K, props: { class?: string; text?: string; title?: string } = {}, ...children: (Node | string)[]): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  if (props.class) e.className = props.class;
  if (props.text !== undefined) e.textContent = props.text;
  if (props.title) e.title = props.title;
  e.append(...children);
  return e;
}

export const messageOf = (err: unknown): string => (err instanceof Error ? err.message : String(err));

/** Offers text as a file download (reports, exports); nothing leaves the machine. */
export function saveText(fileName: string, mediaType: string, text: string): void {
  const url = URL.createObjectURL(new Blob([text], { type: mediaType }));
  const a = el('a');
  a.href = url;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** "2026-12-07T00:00:00.000Z" ↔ the value of an <input type="datetime-local"> read as UTC. */
export function isoToLocalInput(iso: string): string {
  return iso.replace(/\.\d+Z$|Z$/, '').slice(0, 19);
}
export function localInputToMs(value: string): number | null {
  if (value === '') return null;
  const ms = Date.parse(`${value.length === 16 ? `${value}:00` : value}Z`);
  return Number.isFinite(ms) ? ms : null;
}
