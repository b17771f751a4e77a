/**
 * The README's two commands stay true: the test command installs exactly the
 * Debian packages the test preflight checks for, and `npm start` / `npm test`
 * are the scripts package.json defines.
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '..', '..');
const readme = fs.readFileSync(path.join(root, 'README.md'), 'utf8');
const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8')) as { scripts: Record<string, string> };

/** The shell blocks of the README before its first second-level heading. */
function topCommands(): string[] {
  const top = readme.slice(0, readme.indexOf('\n## '));
  return Array.from(top.matchAll(/```sh\n([\s\S]*?)```/g), m => m[1].trim());
}

describe('README commands', () => {
  it('has two commands up top: one that starts the demo, one that runs the tests', () => {
    const commands = topCommands();
    expect(commands).toHaveLength(2);
    expect(commands[0]).toMatch(/^npm ci && npm start\b/);
    expect(commands[1]).toMatch(/&& npm ci && npm test$/);
    expect(pkg.scripts.start).toBeDefined();
    expect(pkg.scripts.test.startsWith('node scripts/preflight.mjs && ')).toBe(true);
  });

  it('installs exactly the packages the preflight checks for', () => {
    const listed = execFileSync(process.execPath, [path.join(root, 'scripts', 'preflight.mjs'), '--list']).toString().trim().split(/\s+/);
    const install = /apt-get install -y --no-install-recommends ([^&]+)&&/.exec(topCommands()[1]);
    expect(install).not.toBeNull();
    expect(install![1].trim().split(/\s+/)).toEqual(listed);
  });
});
