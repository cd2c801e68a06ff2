import { KeepclearError } from '../../core/errors.js';
import { canonicalObjectId } from '../../core/elements/objectId.js';
import { defineCommand, type ValueParser } from '../command.js';
import { dbOption, jsonOption, numberIn } from '../options.js';

interface SpacecraftOptions {
  id?: string;
  massKg?: number;
  ispS?: number;
  db?: string;
  json?: string;
}

const objectId: ValueParser<string> = (text, previous) => {
  if (previous !== undefined) throw new KeepclearError('BAD_ARGUMENT', 'option --id given twice');
  if (text.trim() === '') throw new KeepclearError('BAD_ARGUMENT', '--id needs an object id');
  return canonicalObjectId(text.trim());
};

/**
 * `keepclear spacecraft --id ID [--mass-kg X] [--isp-s Y] [--db FILE] [--json FILE|-]`: sets
 * (and shows) the owner's spacecraft data that manoeuvre planning needs — wet mass and thruster
 * Isp. Keepclear has no default for either.
 */
export default defineCommand<SpacecraftOptions>({
  name: 'spacecraft',
  summary: "set or show an owned spacecraft's mass and thruster Isp (needed by plan)",
  synopsis: '--id ID [--mass-kg X] [--isp-s Y] [--db FILE] [--json FILE|-]',
  options: [
    { flags: '--id <ID>', description: 'catalogue number of the spacecraft (Alpha-5 allowed)', parse: objectId },
    { flags: '--mass-kg <X>', description: 'wet mass, kg', parse: numberIn('mass-kg', (x) => x > 0 && x <= 1e6, 'a mass in kg in (0, 1e6]') },
    { flags: '--isp-s <Y>', description: 'thruster specific impulse, s', parse: numberIn('isp-s', (x) => x > 0 && x <= 1e5, 'a specific impulse in s in (0, 1e5]') },
    dbOption,
    jsonOption,
  ],
  examples: ['keepclear spacecraft --id 100001 --mass-kg 100 --isp-s 220', 'keepclear spacecraft --id A0001'],
  async run(_args, o) {
    if (o.id === undefined) throw new KeepclearError('BAD_ARGUMENT', 'give --id ID; e.g. keepclear spacecraft --id 100001 --mass-kg 100 --isp-s 220');
    const { openDatabase, defaultDbPath, getSpacecraft, setSpacecraft, getObject } = await import('../../db/index.js');
    const { writeFileSync } = await import('node:fs');
    const db = openDatabase(o.db ?? defaultDbPath());
    try {
      const changing = o.massKg !== undefined || o.ispS !== undefined;
      if (changing)
        setSpacecraft(db, o.id, { ...(o.massKg !== undefined ? { massKg: o.massKg } : {}), ...(o.ispS !== undefined ? { ispS: o.ispS } : {}) });
      else if (!getObject(db, o.id))
        throw new KeepclearError('NOT_FOUND', `no object "${o.id}" in the catalogue; import its element set first (keepclear import FILE)`);
      const sc = getSpacecraft(db, o.id);
      const doc = { id: o.id, massKg: sc?.massKg ?? null, ispS: sc?.ispS ?? null };
      if (o.json !== undefined) {
        const text = `${JSON.stringify(doc, null, 2)}\n`;
        if (o.json === '-') process.stdout.write(text);
        else writeFileSync(o.json, text);
      }
      if (o.json !== '-') {
        const show = (x: number | null, unit: string) => (x === null ? 'not set' : `${x} ${unit}`);
        process.stdout.write(`spacecraft ${o.id}: mass ${show(doc.massKg, 'kg')}, Isp ${show(doc.ispS, 's')}${changing ? ' (stored)' : ''}\n`);
      }
      return 0;
    } finally {
      db.close();
    }
  },
});
