import { defineCommand } from '../command.js';
import { dbOption, numberIn } from '../options.js';

interface ServeOptions {
  db?: string;
  port?: number;
}

/**
 * `keepclear serve [--db FILE] [--port N]`: the desktop app's interface for any browser, on
 * 127.0.0.1 only. Prints one line, the URL with its token, and runs until Ctrl-C.
 */
export default defineCommand<ServeOptions>({
  name: 'serve',
  summary: 'open the app in a browser: serves the interface and its data on 127.0.0.1 with a token',
  synopsis: '[--db FILE] [--port N]',
  options: [
    dbOption,
    {
      flags: '--port <N>',
      description: 'port on 127.0.0.1 (default: a free one chosen at start)',
      parse: numberIn('port', (x) => Number.isInteger(x) && x >= 1 && x <= 65535, 'a whole number 1..65535'),
    },
  ],
  examples: ['keepclear serve --db ops.db', 'keepclear serve --port 8710'],
  async run(_args, o) {
    const { openDatabase, defaultDbPath } = await import('../../db/index.js');
    const { startServe, rendererDir } = await import('../../app/serve/index.js');
    const dir = rendererDir();
    const db = openDatabase(o.db ?? defaultDbPath());
    let server;
    try {
      server = await startServe({ db, rendererDir: dir, ...(o.port !== undefined ? { port: o.port } : {}) });
    } catch (err) {
      db.close();
      const code = (err as NodeJS.ErrnoException).code;
      if (code === 'EADDRINUSE') {
        process.stderr.write(`keepclear: port ${o.port} on 127.0.0.1 is in use; choose another with --port N, or leave --port out\n`);
        return 1;
      }
      throw err;
    }
    process.stdout.write(`${server.url}\n`);
    process.stderr.write('keepclear: serving on 127.0.0.1 only; open the URL above in a browser. Ctrl-C stops.\n');
    const running = server;
    await new Promise<void>((resolve) => {
      const stop = (): void => {
        process.off('SIGINT', stop);
        process.off('SIGTERM', stop);
        resolve();
      };
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    });
    await running.close();
    db.close();
    return 0;
  },
});
