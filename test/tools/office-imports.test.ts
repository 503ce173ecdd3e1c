// The office folders import one way only: office/cli may use office/receiver, both use office/shared,
// and neither office/receiver nor office/shared imports office/cli (DEVELOPERS.md, "Layout").
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { REPO_ROOT } from '../support/waterml-kit';

function tsFiles(dir: string): string[] {
  return readdirSync(join(REPO_ROOT, dir), { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? tsFiles(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : []);
}

describe('office imports', () => {
  it('office/receiver and office/shared never import office/cli; office/shared never imports office/receiver', () => {
    const wrong: string[] = [];
    for (const file of [...tsFiles('office/receiver'), ...tsFiles('office/shared')]) {
      for (const m of readFileSync(join(REPO_ROOT, file), 'utf8').matchAll(/from '([^']+)'/g)) {
        const target = join(file, '..', m[1]);
        if (target.startsWith('office/cli') || (file.startsWith('office/shared') && target.startsWith('office/receiver'))) wrong.push(`${file} → ${m[1]}`);
      }
    }
    expect(tsFiles('office/shared').length).toBeGreaterThanOrEqual(3);
    expect(wrong).toEqual([]);
  });
});
