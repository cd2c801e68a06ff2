/**
 * Long work on the page: the import and screening forms, and one line per job with a progress
 * bar and a Cancel button, fed by the bridge's job updates (pushed by serve, polled on desktop).
 */
import type { JobResult, JobStartRequest, JobStatus, UploadedFile } from '../../core/bridge/contract.js';
import type { PageBridge } from '../bridge.js';
import { byId, el, isoToLocalInput, localInputToMs, messageOf } from '../dom.js';

export interface JobsCallbacks {
  /** a job ended (done, failed or cancelled) */
  readonly finished: (s: JobStatus) => void;
  readonly status: (text: string, isError?: boolean) => void;
  /** defaults for the screening form: the shown run's primaries and window */
  readonly screenDefaults: () => { primaries: string; startIso: string; days: number; thresholdKm: number };
}

function resultText(r: JobResult | null): string {
  if (r === null) return '';
  switch (r.kind) {
    case 'import': {
      const ok = r.files.filter((f) => f.ok);
      const counts = ok.reduce((a, f) => ({ imported: a.imported + f.imported, updated: a.updated + f.updated, rejected: a.rejected + f.rejected }), { imported: 0, updated: 0, rejected: 0 });
      const failed = r.files.length - ok.length;
      return `${counts.imported} new, ${counts.updated} updated, ${counts.rejected} rejected${failed ? `; ${failed} file(s) not imported` : ''}`;
    }
    case 'screen':
      return `run ${r.runId}: ${r.eventCount} event(s), ${r.status}${r.flagged.length ? `, ${r.flagged.length} object(s) flagged` : ''}`;
    case 'plan':
      return r.plan.proposal ? `burn of ${r.plan.proposal.deltaVMs.toFixed(3)} m/s proposed` : (r.plan.note ?? 'no proposal');
  }
}

function problemsOf(r: JobResult | null): string[] {
  if (r?.kind !== 'import') return [];
  return r.files.flatMap((f) => f.problems.map((p) => `${f.name}: ${p}`));
}

export class JobsView {
  private readonly lines = new Map<string, HTMLElement>();
  private readonly waiters = new Map<string, ((s: JobStatus) => void)[]>();
  /** ended jobs: a late "running" (the answer to jobs.start after the pushed end) must not revive them */
  private readonly ended = new Map<string, JobStatus>();
  private readonly ui = {
    jobs: byId('jobs', HTMLElement),
    importDialog: byId('import-dialog', HTMLDialogElement),
    importForm: byId('import-form', HTMLFormElement),
    importFiles: byId('import-files', HTMLInputElement),
    importHbr: byId('import-hbr', HTMLInputElement),
    screenDialog: byId('screen-dialog', HTMLDialogElement),
    screenForm: byId('screen-form', HTMLFormElement),
    primaries: byId('screen-primaries', HTMLInputElement),
    start: byId('screen-start', HTMLInputElement),
    days: byId('screen-days', HTMLInputElement),
    km: byId('screen-km', HTMLInputElement),
  };

  constructor(private readonly bridge: PageBridge, private readonly cb: JobsCallbacks) {
    bridge.onJob((s) => this.update(s));
    byId('open-import', HTMLButtonElement).addEventListener('click', () => this.ui.importDialog.showModal());
    byId('open-screen', HTMLButtonElement).addEventListener('click', () => this.openScreen());
    for (const d of [this.ui.importDialog, this.ui.screenDialog]) {
      d.querySelector('[data-close]')?.addEventListener('click', () => d.close());
    }
    this.ui.importForm.addEventListener('submit', (e) => {
      e.preventDefault();
      void this.startImport();
    });
    this.ui.screenForm.addEventListener('submit', (e) => {
      e.preventDefault();
      void this.startScreen();
    });
  }

  /** Starts a job; resolves with its final status. */
  async run(req: JobStartRequest): Promise<JobStatus> {
    const s = await this.bridge.invoke('jobs.start', req);
    this.update(s, true);
    const end = this.ended.get(s.id);
    if (end) {
      this.report(end);
      return end;
    }
    return new Promise((resolve) => {
      const list = this.waiters.get(s.id) ?? [];
      list.push(resolve);
      this.waiters.set(s.id, list);
    });
  }

  private openScreen(): void {
    const d = this.cb.screenDefaults();
    if (this.ui.primaries.value === '') this.ui.primaries.value = d.primaries;
    if (this.ui.start.value === '') this.ui.start.value = isoToLocalInput(d.startIso);
    this.ui.days.value = String(d.days);
    this.ui.km.value = String(d.thresholdKm);
    this.ui.screenDialog.showModal();
  }

  private async startImport(): Promise<void> {
    const chosen = Array.from(this.ui.importFiles.files ?? []);
    if (chosen.length === 0) {
      this.cb.status('Choose at least one file to import.', true);
      return;
    }
    this.ui.importDialog.close();
    try {
      const files: UploadedFile[] = await Promise.all(chosen.map(async (f) => ({ name: f.name, text: await f.text() })));
      const hbr = this.ui.importHbr.valueAsNumber;
      await this.run({ kind: 'import', files, ...(Number.isFinite(hbr) ? { hbrM: hbr } : {}) });
    } catch (err) {
      this.cb.status(`Import not started: ${messageOf(err)}`, true);
    }
    this.ui.importFiles.value = '';
  }

  private async startScreen(): Promise<void> {
    const startMs = localInputToMs(this.ui.start.value);
    const primaries = this.ui.primaries.value.split(/[\s,]+/).filter((p) => p !== '');
    if (startMs === null || primaries.length === 0) {
      this.cb.status('Give the primaries and the window start.', true);
      return;
    }
    this.ui.screenDialog.close();
    try {
      await this.run({
        kind: 'screen',
        primaries,
        start: new Date(startMs).toISOString(),
        days: this.ui.days.valueAsNumber,
        thresholdKm: this.ui.km.valueAsNumber,
      });
    } catch (err) {
      this.cb.status(`Screening not started: ${messageOf(err)}`, true);
    }
  }

  private update(s: JobStatus, startedHere = false): void {
    if (this.ended.has(s.id)) return;
    let line = this.lines.get(s.id);
    if (!line) {
      line = el('div', { class: 'job' });
      line.dataset['jobId'] = s.id;
      line.dataset['kind'] = s.kind;
      this.lines.set(s.id, line);
      this.ui.jobs.prepend(line);
    }
    const previous = line.dataset['state'];
    line.dataset['state'] = s.state;
    const bar = el('progress');
    bar.max = Math.max(1, s.progress?.total ?? 1);
    if (s.progress) bar.value = s.progress.done;
    else if (s.state !== 'running') bar.value = bar.max;
    else bar.removeAttribute('value');
    const pct = s.progress && s.progress.total > 0 ? ` ${Math.floor((100 * s.progress.done) / s.progress.total)} %` : '';
    const children: (Node | string)[] = [el('b', { text: s.title }), bar];
    if (s.state === 'running') {
      children.push(el('span', { class: 'job-msg', text: `${s.progress?.message ?? 'starting'}${pct}` }));
      const cancel = el('button', { text: 'Cancel', class: 'job-cancel' });
      cancel.type = 'button';
      cancel.addEventListener('click', () => void this.bridge.invoke('jobs.cancel', { jobId: s.id }).catch((err) => this.cb.status(messageOf(err), true)));
      children.push(cancel);
    } else {
      const what = s.state === 'done' ? 'done' : s.state === 'cancelled' ? 'cancelled' : 'failed';
      children.push(el('span', { class: `job-msg job-${what}`, text: `${what}${s.error ? `: ${s.error}` : ''}${s.result ? ` · ${resultText(s.result)}` : ''}` }));
      const problems = problemsOf(s.result);
      if (problems.length) children.push(el('details', {}, el('summary', { text: `${problems.length} problem(s)` }), el('ul', {}, ...problems.map((p) => el('li', { text: p })))));
      const close = el('button', { text: 'Dismiss', class: 'job-dismiss' });
      close.type = 'button';
      close.addEventListener('click', () => {
        line!.remove();
        this.lines.delete(s.id);
      });
      children.push(close);
    }
    line.replaceChildren(...children);
    if (startedHere) line.dataset['mine'] = 'yes';
    if (s.state !== 'running') {
      this.ended.set(s.id, s);
      for (const w of this.waiters.get(s.id) ?? []) w(s);
      this.waiters.delete(s.id);
      // Jobs that ran while this page watched change what it shows (not old ones replayed on connect).
      if (previous === 'running' || line.dataset['mine'] === 'yes') this.report(s);
    }
  }

  private readonly reported = new Set<string>();
  private report(s: JobStatus): void {
    if (this.reported.has(s.id)) return;
    this.reported.add(s.id);
    this.cb.finished(s);
  }
}
