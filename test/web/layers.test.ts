// Imports point one way (shared design notes, Layers): web/components get values and callbacks and never
// import the shell (web/app) or a screen; core imports no other layer; office never imports web.
import { readFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT, sources } from '../support/store-writes';

/** "file → target" for every relative import of a file under `from` that lands under one of `forbidden`. */
function importsInto(from: string, forbidden: readonly string[]): string[] {
  return sources(from).flatMap((f) =>
    [...readFileSync(join(ROOT, f), 'utf8').matchAll(/(?:import|export)[^'"]*?from\s+'(\.[^']+)'|import\('(\.[^']+)'\)/g)].flatMap((m) => {
      const target = relative(ROOT, resolve(ROOT, dirname(f), m[1] ?? m[2]));
      return forbidden.some((d) => target === d || target.startsWith(`${d}/`)) ? [`${f} → ${target}`] : [];
    }),
  );
}

describe('imports point down', () => {
  it('components never import the shell or a screen', () => {
    expect(importsInto('web/components', ['web/app', 'web/screens'])).toEqual([]);
  });
  it('core imports no other layer; office and the worker never import the shell or screens', () => {
    expect(importsInto('core', ['web', 'office', 'sw'])).toEqual([]);
    expect(importsInto('office', ['web'])).toEqual([]);
    expect(importsInto('sw', ['web/app', 'web/screens', 'web/components'])).toEqual([]);
  });

  it("web/db's public surface is what the app uses: every name it exports is used outside the storage folder", () => {
    const index = readFileSync(join(ROOT, 'web/db/index.ts'), 'utf8');
    const names = [...index.matchAll(/export\s*(?:type\s*)?\{([^}]*)\}/g)].flatMap((m) => m[1].split(',').map((n) => n.replace('type ', '').trim()).filter(Boolean));
    const app = [...sources('web'), ...sources('sw')].filter((f) => !f.startsWith('web/db/')).map((f) => readFileSync(join(ROOT, f), 'utf8')).join('\n');
    expect(names.length).toBeGreaterThan(20);
    expect(names.filter((n) => !new RegExp(`\\b${n}\\b`).test(app))).toEqual([]);
  });
});
