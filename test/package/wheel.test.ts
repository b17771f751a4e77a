/**
 * The wheel users pip-install: it must carry the prebuilt labextension
 * (package.json with _build.load, the remoteEntry it names, the settings
 * schema) and install.json, under share/jupyter/labextensions/<npm name>.
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '..', '..');
const python = '/usr/bin/python3';
const prefix = 'jupyterlab_psiscape-0.1.0.data/data/share/jupyter/labextensions/jupyterlab-psiscape/';

function hasWheelBuilder(): boolean {
  try {
    execFileSync(python, ['-c', 'import build, hatchling'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

const canBuild = hasWheelBuilder();
if (!canBuild) {
  console.warn('wheel test skipped: /usr/bin/python3 lacks python3-build / python3-hatchling (apt-get install -y python3-build python3-hatchling)');
}

describe.skipIf(!canBuild)('wheel', () => {
  let names: string[] = [];
  let read: (name: string) => string;

  beforeAll(() => {
    execFileSync(process.execPath, [path.join(root, 'scripts', 'package-wheel.mjs')], { cwd: root, stdio: 'pipe' });
    const wheel = fs.readdirSync(path.join(root, 'dist')).find(f => f.endsWith('.whl'))!;
    const file = path.join(root, 'dist', wheel);
    names = JSON.parse(execFileSync(python, ['-c', 'import sys, zipfile, json; print(json.dumps(zipfile.ZipFile(sys.argv[1]).namelist()))', file], { encoding: 'utf8' }));
    read = (name: string) => execFileSync(python, ['-c', 'import sys, zipfile; sys.stdout.write(zipfile.ZipFile(sys.argv[1]).read(sys.argv[2]).decode())', file, name], { encoding: 'utf8' });
  }, 120000);

  it('should hold the labextension package.json with a load entry that is in the wheel', () => {
    const pkg = JSON.parse(read(`${prefix}package.json`));
    expect(pkg.name).toBe('jupyterlab-psiscape');
    const load: string = pkg.jupyterlab._build.load;
    expect(load).toMatch(/^static\/remoteEntry\.[0-9a-f]+\.js$/);
    expect(names).toContain(`${prefix}${load}`);
  });

  it('should hold install.json and the settings schema', () => {
    const install = JSON.parse(read(`${prefix}install.json`));
    expect(install.packageName).toBe('jupyterlab_psiscape');
    const schema = JSON.parse(read(`${prefix}schemas/jupyterlab-psiscape/plugin.json`));
    expect(schema.properties.pointSize.default).toBe(40);
  });

  it('should ship only the chunks of the current build', () => {
    const statics = names.filter(n => n.startsWith(`${prefix}static/`) && n.endsWith('.js'));
    const built = fs.readdirSync(path.join(root, 'jupyterlab_psiscape', 'labextension', 'static')).filter(f => f.endsWith('.js'));
    expect(statics.map(n => path.basename(n)).sort()).toEqual(built.sort());
  });
});
