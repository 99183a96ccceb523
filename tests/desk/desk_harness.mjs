// Shared by the desk's browser test and its screenshot script: a planned,
// rendered study with a field team in a temporary folder, the desk serving
// it on a free 127.0.0.1 port, and Debian's chromium driven headless through
// the DevTools protocol by puppeteer-core.
import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, appendFileSync, rmSync, cpSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import puppeteer from 'puppeteer-core';

export const NOW = '2027-03-01T12:00:00Z';  // the demo's first sending day

export function twinprobe(bin, study, args, actor = 'setup') {
  const r = spawnSync(bin, ['--study', study, ...args], {
    encoding: 'utf8', env: { ...process.env, TWINPROBE_NOW: NOW, TWINPROBE_ACTOR: actor } });
  if (r.status !== 0) throw new Error(`twinprobe ${args.join(' ')} failed (${r.status}): ${r.stderr}`);
  return r.stdout;
}

// init, plan, render, and [team]; returns the study folder.
export function makeStudy(bin) {
  const dir = mkdtempSync(join(tmpdir(), 'twinprobe-desk-'));
  const study = join(dir, 'veldmark');
  twinprobe(bin, study, ['init']);
  twinprobe(bin, study, ['plan']);
  twinprobe(bin, study, ['render']);
  appendFileSync(join(study, 'study.toml'), '\n[team]\nmembers = ["Ada Moss", "Bo Lind"]\n');
  return { dir, study, cleanup: () => rmSync(dir, { recursive: true, force: true }) };
}

// The mail fixture study (tests/fixtures/mail/study: 10 probes, an mbox and
// a Maildir of invented employers' replies), planned, every probe sent, its
// mail read into the review queue, with the same team.
export function makeMailStudy(bin) {
  const dir = mkdtempSync(join(tmpdir(), 'twinprobe-desk-mail-'));
  const study = join(dir, 'mail-study');
  const here = dirname(fileURLToPath(import.meta.url));
  cpSync(join(here, '..', 'fixtures', 'mail', 'study'), study, { recursive: true });
  twinprobe(bin, study, ['plan']);
  twinprobe(bin, study, ['mail']);
  // A reviewed message is recorded only for a probe with a sending: all ten
  // left on the schedule's first day.
  const sendings = ['probe,sent_at'];
  for (let i = 1; i <= 10; ++i) sendings.push(`P${String(i).padStart(5, '0')},2027-03-01`);
  writeFileSync(join(study, 'sendings.csv'), sendings.join('\n') + '\n');
  twinprobe(bin, study, ['import', 'sendings', join(study, 'sendings.csv')]);
  appendFileSync(join(study, 'study.toml'), '\n[team]\nmembers = ["Ada Moss", "Bo Lind"]\n');
  return { dir, study, cleanup: () => rmSync(dir, { recursive: true, force: true }) };
}

// Starts `twinprobe desk --port 0` and resolves with its address.
export function startDesk(bin, study, now = NOW) {
  const child = spawn(bin, ['--study', study, 'desk', '--port', '0'], {
    env: { ...process.env, TWINPROBE_NOW: now }, stdio: ['ignore', 'pipe', 'inherit'] });
  return new Promise((resolve, reject) => {
    let out = '';
    child.on('exit', (code) => reject(new Error(`desk exited early with ${code}: ${out}`)));
    child.stdout.on('data', (chunk) => {
      out += chunk;
      const m = out.match(/ at (http:\/\/127\.0\.0\.1:\d+\/) /);
      if (m) resolve({ url: m[1], child, stop: () => stopDesk(child) });
    });
  });
}

function stopDesk(child) {
  return new Promise((resolve) => {
    child.removeAllListeners('exit');
    child.on('exit', (code, signal) => resolve({ code, signal }));
    child.kill('SIGTERM');
  });
}

export async function launchBrowser() {
  return puppeteer.launch({
    executablePath: process.env.CHROMIUM || '/usr/bin/chromium',
    headless: true,
    // --no-sandbox: CI runs as root, where chromium's sandbox cannot start.
    args: ['--no-sandbox', '--disable-gpu', '--no-first-run', '--no-proxy-server'],
  });
}

// Signs in as `member` in `page`, setting `passphrase` on first use.
export async function signIn(page, base, member, passphrase) {
  await page.goto(base + 'signin');
  await page.select('#member', member);
  await page.type('#passphrase', passphrase);
  await Promise.all([page.waitForNavigation(), page.click('button[type=submit]')]);
  if (await page.$('#new_passphrase')) {
    await page.type('#new_passphrase', passphrase);
    await page.type('#repeat_passphrase', passphrase);
    await Promise.all([page.waitForNavigation(), page.click('form button[type=submit]')]);
  }
  if (!page.url().endsWith('/today')) throw new Error(`sign-in as ${member} ended at ${page.url()}`);
}

export const text = (page, selector) => page.$eval(selector, (e) => e.textContent.trim());
export const readText = (path) => readFileSync(path, 'utf8');
