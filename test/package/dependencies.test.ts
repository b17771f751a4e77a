/**
 * package.json's `dependencies` are exactly the packages the extension's own
 * code imports: every bare specifier in src/ (static, type-only and dynamic
 * `import()`) and style/ (JS imports and CSS @import). Everything else —
 * test, demo and build tooling — belongs in devDependencies.
 */
import fs from 'node:fs';
import path from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '..', '..');
const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8')) as {
  dependencies: Record<string, string>;
  devDependencies: Record<string, string>;
  jupyterlab: { sharedPackages?: Record<string, unknown> };
};

function files(dir: string, pattern: RegExp): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap(entry => {
    const full = path.join(dir, entry.name);
    return entry.isDirectory() ? files(full, pattern) : pattern.test(entry.name) ? [full] : [];
  });
}

/** `@scope/name/sub` → `@scope/name`, `name/sub` → `name`; null for relative paths and URLs. */
function packageOf(specifier: string): string | null {
  if (/^(\.|\/|[a-z]+:)/i.test(specifier)) {
    return null;
  }
  const parts = specifier.split('/');
  return specifier.startsWith('@') ? parts.slice(0, 2).join('/') : parts[0];
}

function importedPackages(): Map<string, string[]> {
  const found = new Map<string, string[]>();
  const add = (specifier: string, file: string) => {
    const name = packageOf(specifier);
    if (name) {
      found.set(name, [...(found.get(name) ?? []), path.relative(root, file)]);
    }
  };
  for (const file of [...files(path.join(root, 'src'), /\.(ts|tsx|js|mjs)$/), ...files(path.join(root, 'style'), /\.(js|mjs)$/)]) {
    const info = ts.preProcessFile(fs.readFileSync(file, 'utf8'), true, true);
    for (const ref of [...info.importedFiles, ...info.typeReferenceDirectives]) {
      add(ref.fileName, file);
    }
  }
  for (const file of files(path.join(root, 'style'), /\.css$/)) {
    // In CSS a plain name is a relative file; packages are written `~name/…` (or `~@scope/name/…`).
    for (const m of fs.readFileSync(file, 'utf8').matchAll(/@import\s+(?:url\()?\s*['"]?~([^'")\s;]+)/g)) {
      add(m[1], file);
    }
  }
  return found;
}

describe('npm dependencies', () => {
  const imported = importedPackages();

  it('should see static, type-only and dynamic imports (the scan itself works)', () => {
    const seen = ts
      .preProcessFile("import a from 'pa';\nimport type { B } from '@s/pb/sub';\nconst c = await import('pc');\n", true, true)
      .importedFiles.map(f => packageOf(f.fileName));
    expect(seen).toEqual(['pa', '@s/pb', 'pc']);
    expect(imported.get('mathjs')?.length).toBeGreaterThan(0);
  });

  it('should declare every package that src/ or style/ imports as a dependency', () => {
    const undeclared = [...imported.keys()].filter(name => !(name in pkg.dependencies));
    expect(undeclared).toEqual([]);
  });

  it('should keep in dependencies only packages that src/ or style/ import', () => {
    const unused = Object.keys(pkg.dependencies).filter(name => !imported.has(name));
    expect(unused).toEqual([]);
  });

  it('should list a package in dependencies or devDependencies, not both', () => {
    const both = Object.keys(pkg.dependencies).filter(name => name in pkg.devDependencies);
    expect(both).toEqual([]);
  });

  it('should bundle only packages it depends on', () => {
    const stray = Object.keys(pkg.jupyterlab.sharedPackages ?? {}).filter(name => !(name in pkg.dependencies));
    expect(stray).toEqual([]);
  });
});
