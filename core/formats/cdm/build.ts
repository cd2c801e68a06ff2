/**
 * Turns the sections either reader found into a validated Cdm, or into errors and no message.
 * Every check of CCSDS 508.0-B-1 that does not depend on the syntax lives here: placement of
 * keywords, duplicates, units, value syntax, mandatory keywords, two objects, covariance size
 * and positive semi-definiteness.
 */
import type { Rejection, ErrorCode } from '../../errors.js';
import { vec3 } from '../../units.js';
import { quoteValue } from '../result.js';
import {
  CDM_KEYWORDS, COV_AXES, COV_MANDATORY_DIM, COV_TERMS, OBJECT_BLOCKS, specsOf,
  type CdmBlock, type CdmKeywordSpec,
} from './keywords.js';
import type {
  Cdm, CdmBlockInfo, CdmCovariance, CdmExtra, CdmObject, CdmStateVector, CdmRefFrame,
} from './model.js';
import type { RawCdm, RawSection } from './raw.js';
import { parseCcsdsTime, parseCdmInteger, parseCdmNumber } from './values.js';
import { assembleCovariance, judgeCovariance } from './covariance.js';

export interface CdmParseResult {
  /** The complete validated message, or null when anything was refused. */
  readonly cdm: Cdm | null;
  readonly errors: Rejection[];
  /** Notes on what was changed to make the message usable (covariance repairs). */
  readonly repairs: string[];
}

export interface CdmReadOptions {
  /**
   * A covariance that is not PSD beyond rounding (judged by core/risk/covariancePsd.ts): 'refuse'
   * (default) refuses the message with CDM_COVARIANCE; 'flag' keeps the message with that
   * object's covariance status 'not-psd' and `usable` null, so risk can fall back to another
   * covariance source or maximum Pc. An all-zero position block is always kept that way (status
   * 'zero', `usable` null, a note in `repairs`): it says "no covariance", not a wrong one.
   */
  readonly badCovariance?: 'refuse' | 'flag';
}

const BLOCK_NAMES: Record<CdmBlock, string> = {
  header: 'header', relative: 'relative metadata/data', metadata: 'metadata', od: 'OD parameters',
  additional: 'additional parameters', state: 'state vector', covariance: 'covariance',
};

type Value = string | number;
interface Read {
  readonly values: Map<string, Value>;
  readonly infos: Record<CdmBlock, CdmBlockInfo>;
}

const newInfo = (): CdmBlockInfo => ({ comments: [], lines: {}, extras: {} });

class Builder {
  readonly errors: Rejection[] = [];
  readonly repairs: string[] = [];
  constructor(readonly file: string) {}

  reject(code: ErrorCode, line: number, reason: string): void {
    this.errors.push({ code, file: this.file, line, reason });
  }

  /** Checks one value against its spec; returns the typed value or undefined after an error. */
  value(spec: CdmKeywordSpec, text: string, unit: string | undefined, line: number, where: string): Value | undefined {
    const kw = spec.keyword;
    if (unit !== undefined && unit !== spec.unit) {
      this.reject('CDM_UNITS', line, spec.unit === undefined
        ? `${where} ${kw} has unit [${unit}] but CCSDS 508.0-B-1 defines no unit for it; remove the unit`
        : `${where} ${kw} has unit [${unit}], expected [${spec.unit}] (CCSDS 508.0-B-1); convert the value to ${spec.unit} and correct the unit`);
      return undefined;
    }
    if (text.trim() === '') {
      this.reject('CDM_FIELD', line, `${where} ${kw} has no value; give a value or remove the keyword`);
      return undefined;
    }
    const bad = (what: string): undefined => {
      this.reject('CDM_FIELD', line, `${where} ${kw} = "${quoteValue(text)}" ${what}`);
      return undefined;
    };
    switch (spec.kind) {
      case 'text':
        return text.trim();
      case 'version':
        return /^\d+\.\d+$/.test(text.trim()) ? text.trim() : bad('is not a version number; write it as 1.0');
      case 'number': {
        const x = parseCdmNumber(text);
        return x !== null && Number.isFinite(x) ? x : bad('is not a number; write a decimal such as 715 or 4.835E-05');
      }
      case 'integer': {
        const x = parseCdmInteger(text);
        return x !== null ? x : bad('is not a whole number; write an integer such as 592');
      }
      case 'time': {
        const t = parseCcsdsTime(text);
        return t !== null ? t : bad('is not a CCSDS UTC time; write YYYY-MM-DDThh:mm:ss.sss or YYYY-DDDThh:mm:ss.sss');
      }
      case 'enum': {
        const v = text.trim().toUpperCase();
        return spec.values!.includes(v) ? v : bad(`is not allowed; CCSDS 508.0-B-1 allows ${spec.values!.join(', ')}`);
      }
    }
  }

  /** Reads one section: placement, duplicates, values, comments, extras, then mandatory keywords. */
  read(section: RawSection, allowed: readonly CdmBlock[], label: string): Read {
    const values = new Map<string, Value>();
    const infos = Object.fromEntries(allowed.map((b) => [b, newInfo()])) as Record<CdmBlock, CdmBlockInfo>;
    let current: CdmBlock = allowed[0]!;
    for (const e of section.entries) {
      const spec = CDM_KEYWORDS.get(e.keyword);
      if (!spec) {
        const info = infos[e.place && allowed.includes(e.place) ? e.place : current];
        if (info.extras[e.keyword]) this.duplicate(e.keyword, e.line, info.extras[e.keyword]!.line, label);
        else info.extras[e.keyword] = { value: e.value.trim(), unit: e.unit, line: e.line } satisfies CdmExtra;
        continue;
      }
      if (!allowed.includes(spec.block)) {
        this.reject('CDM_STRUCTURE', e.line,
          `${e.keyword} belongs in the ${BLOCK_NAMES[spec.block]} section, not in ${label}; move it there`);
        continue;
      }
      current = spec.block;
      const info = infos[spec.block];
      const first = info.lines[e.keyword];
      if (first !== undefined) {
        this.duplicate(e.keyword, e.line, first, label);
        continue;
      }
      info.lines[e.keyword] = e.line;
      const v = this.value(spec, e.value, e.unit, e.line, label);
      if (v !== undefined) values.set(e.keyword, v);
    }
    // 'data' comments belong to the object as a whole; the caller keeps them.
    for (const c of section.comments)
      if (c.place !== 'data') (infos[c.place] ?? infos[allowed[0]!]).comments.push(c.text);
    for (const block of allowed) {
      const missing = specsOf(block).filter((s) => s.mandatory && infos[block].lines[s.keyword] === undefined);
      if (missing.length > 0)
        this.reject('CDM_MISSING_KEYWORD', section.startLine,
          `${label === BLOCK_NAMES[block] ? label : `${label} ${BLOCK_NAMES[block]}`} lacks mandatory keyword${missing.length > 1 ? 's' : ''} ` +
          `${missing.map((s) => s.keyword).join(', ')}; add ${missing.length > 1 ? 'them' : 'it'} as CCSDS 508.0-B-1 requires`);
    }
    return { values, infos };
  }

  duplicate(kw: string, line: number, first: number, label: string): void {
    this.reject('CDM_FIELD', line, `${label} ${kw} appears twice (first at line ${first}); keep one`);
  }

  /** Size of the covariance from which optional rows are present; rows must be complete and in order. */
  covDimension(read: Read, label: string, line: number): 6 | 7 | 8 | 9 {
    const lines = read.infos.covariance.lines;
    let top = COV_MANDATORY_DIM - 1;
    for (let row = COV_MANDATORY_DIM; row < COV_AXES.length; row++)
      if (COV_TERMS.some((t) => t.row === row && lines[t.keyword] !== undefined)) top = row;
    const missing = COV_TERMS.filter((t) => t.row >= COV_MANDATORY_DIM && t.row <= top && lines[t.keyword] === undefined);
    if (missing.length > 0)
      this.reject('CDM_MISSING_KEYWORD', line,
        `${label} covariance has ${COV_AXES[top]} terms, so every row up to ${COV_AXES[top]} must be complete; ` +
        `missing ${missing.map((t) => t.keyword).join(', ')}; add them or remove the ${COV_AXES[top]} row`);
    return (top + 1) as 6 | 7 | 8 | 9;
  }
}

/** Values of one block as model properties; branded units are plain numbers at run time. */
function blockOf<T>(read: Read, block: CdmBlock): T {
  const out: Record<string, unknown> = { ...read.infos[block] };
  for (const spec of specsOf(block)) {
    const v = read.values.get(spec.keyword);
    if (v !== undefined) out[spec.prop] = v;
  }
  return out as T;
}

function stateOf(read: Read): CdmStateVector {
  const n = (kw: string): number => read.values.get(kw) as number;
  return {
    ...read.infos.state,
    r: vec3<CdmRefFrame>(n('X'), n('Y'), n('Z')),
    v: vec3<CdmRefFrame>(n('X_DOT'), n('Y_DOT'), n('Z_DOT')),
  } as CdmStateVector;
}

export function buildCdm(raw: RawCdm, file: string, opts: CdmReadOptions = {}): CdmParseResult {
  const b = new Builder(file);
  const header = b.read(raw.header, ['header'], 'header');
  const relative = b.read(raw.relative, ['relative'], 'relative metadata/data');
  const names = ['OBJECT1', 'OBJECT2'] as const;
  if (raw.objects.length !== 2) {
    const last = raw.objects.at(-1);
    b.reject('CDM_STRUCTURE', last?.startLine ?? raw.relative.startLine,
      raw.objects.length === 0
        ? 'no OBJECT1 or OBJECT2 section; a CDM carries both objects of the conjunction'
        : raw.objects.length === 1
          ? 'only one object section; a CDM needs OBJECT1 and OBJECT2, add the missing object'
          : `${raw.objects.length} object sections; a CDM has exactly two (OBJECT1 and OBJECT2)`);
  }
  const objects = raw.objects.slice(0, 2).map((sec, i) => {
    const label = names[i]!;
    const read = b.read(sec, OBJECT_BLOCKS, label);
    const said = read.values.get('OBJECT');
    if (said !== undefined && said !== label)
      b.reject('CDM_STRUCTURE', read.infos.metadata.lines['OBJECT'] ?? sec.startLine,
        `object section ${i + 1} says OBJECT = ${said}; the first object must be OBJECT1 and the second OBJECT2`);
    const covLine = read.infos.covariance.lines['CR_R'] ?? sec.startLine;
    const dim = b.covDimension(read, label, covLine);
    return { read, label, dim, covLine, sec };
  });
  if (b.errors.length > 0) return { cdm: null, errors: b.errors, repairs: [] };

  const built = objects.map(({ read, label, dim, covLine, sec }): CdmObject => {
    const terms = new Map<string, number>();
    for (const t of COV_TERMS) {
      const v = read.values.get(t.keyword);
      if (typeof v === 'number') terms.set(t.keyword, v);
    }
    const matrix = assembleCovariance(terms, dim);
    const verdict = judgeCovariance(matrix, label);
    // An all-zero covariance is the usual placeholder for "none known" (Keepclear's own export
    // writes it so): the message is kept and only its covariance is refused, so the conjunction
    // (TCA, states, miss) is not lost; a covariance that contradicts itself refuses the message.
    if (verdict.status === 'not-psd' && opts.badCovariance !== 'flag')
      b.reject('CDM_COVARIANCE', covLine,
        `${verdict.note}; the message is refused — ask the originator for a valid covariance`);
    else if (verdict.note) b.repairs.push(`${file}:${covLine}: ${verdict.note}`);
    const covariance: CdmCovariance = {
      ...read.infos.covariance, dimension: dim, matrix, status: verdict.status, usable: verdict.usable,
      ...(verdict.note ? { note: verdict.note } : {}),
    };
    const metadata = blockOf<CdmObject['metadata']>(read, 'metadata');
    const dataComments = sec.comments.filter((c) => c.place === 'data').map((c) => c.text);
    return {
      metadata, dataComments, od: blockOf(read, 'od'),
      additional: blockOf(read, 'additional'),
      state: stateOf(read),
      covariance,
    };
  });
  if (b.errors.length > 0) return { cdm: null, errors: b.errors, repairs: [] };
  return {
    cdm: {
      header: blockOf(header, 'header'),
      relative: blockOf(relative, 'relative'),
      object1: built[0]!,
      object2: built[1]!,
    },
    errors: [],
    repairs: b.repairs,
  };
}
