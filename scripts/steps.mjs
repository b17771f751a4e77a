// Progress for long build steps: one line when a step starts, a line every
// 15 s while it runs, one line with its duration when it ends. A step's own
// output is kept and shown only when it fails (or with PSISCAPE_VERBOSE=1),
// so `npm start` reads as a list of stages rather than pages of bundler logs.
import { spawn } from 'node:child_process';

const t0 = Date.now();
const since = start => `${((Date.now() - start) / 1000).toFixed(1)} s`;

/** Print one progress line, stamped with the time since this process began. */
export function progress(tag, text) {
  console.log(`[${tag}] ${since(t0).padStart(7)}  ${text}`);
}

/**
 * Run a command as one named step.
 * @param {string} tag prefix of the progress lines, e.g. "start"
 * @param {string} label what the step does, in a few words
 * @param {string} cmd executable
 * @param {string[]} args its arguments
 * @param {{ cwd: string, env?: NodeJS.ProcessEnv }} options
 * @returns {Promise<number>} the step's duration in milliseconds
 */
export function runStep(tag, label, cmd, args, { cwd, env }) {
  const verbose = process.env.PSISCAPE_VERBOSE === '1';
  const start = Date.now();
  progress(tag, `${label}…`);
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { cwd, env: env ?? process.env, stdio: verbose ? 'inherit' : ['ignore', 'pipe', 'pipe'] });
    const output = [];
    child.stdout?.on('data', chunk => output.push(chunk));
    child.stderr?.on('data', chunk => output.push(chunk));
    const ticker = setInterval(() => progress(tag, `${label}: still working (${since(start)})`), 15000);
    child.on('error', error => {
      clearInterval(ticker);
      reject(new Error(`${label}: could not start ${cmd} (${error.message})`));
    });
    child.on('close', code => {
      clearInterval(ticker);
      if (code === 0) {
        progress(tag, `${label}: done in ${since(start)}`);
        resolve(Date.now() - start);
      } else {
        process.stderr.write(Buffer.concat(output));
        reject(new Error(`${label} failed (exit status ${code}); its output is above`));
      }
    });
  });
}
