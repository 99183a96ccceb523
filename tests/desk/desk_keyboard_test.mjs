// The desk with the keyboard alone, in Debian's chromium (headless, through
// puppeteer-core). Usage: node desk_keyboard_test.mjs TWINPROBE (CTest runs
// it as "desk: keyboard").
//
// No mouse click anywhere: a member signs in, skips to the content, moves
// through the navigation with Tab, finds a probe and records a response by
// typing and pressing Enter. On every page each control is reached by Tab
// (none left out, none trapping the focus), shows a visible focus outline,
// and has a label a screen reader announces.
import assert from 'node:assert/strict';
import { makeStudy, startDesk, launchBrowser, text, twinprobe } from './desk_harness.mjs';

const bin = process.argv[2];
if (!bin) {
  console.error('usage: node desk_keyboard_test.mjs PATH/TO/twinprobe');
  process.exit(2);
}

// What has the focus: "#id", "a:Label" or the tag name.
const focused = (page) => page.evaluate(() => {
  const e = document.activeElement;
  if (!e || e === document.body) return 'body';
  if (e.id) return '#' + e.id;
  if (e.tagName === 'A') return 'a:' + e.textContent.trim();
  return e.tagName.toLowerCase() + (e.textContent ? ':' + e.textContent.trim() : '');
});

// Presses Tab until `target` has the focus; fails after `limit` presses.
async function tabTo(page, target, limit = 60) {
  for (let i = 0; i < limit; ++i) {
    await page.keyboard.press('Tab');
    if (await focused(page) === target) return;
  }
  throw new Error(`Tab never reached ${target} on ${page.url()}`);
}

async function pressEnterAndWait(page) {
  await Promise.all([page.waitForNavigation(), page.keyboard.press('Enter')]);
}

// Every visible control of the page, in document order, as `focused` names it.
const controls = (page) => page.$$eval(
  'a[href], button, input:not([type=hidden]), select, textarea',
  (els) => els.filter((e) => e.offsetParent !== null || e.classList.contains('skip')).map((e) => {
    if (e.id) return '#' + e.id;
    if (e.tagName === 'A') return 'a:' + e.textContent.trim();
    return e.tagName.toLowerCase() + (e.textContent ? ':' + e.textContent.trim() : '');
  }));

// Tabs through the whole page once: every control is reached, each shows
// an outline while focused, and the focus comes back round (no trap).
async function checkTabOrder(page, name) {
  await page.goto(page.url().split('#')[0]);  // a fresh load: the Tab key starts at the top
  const expected = await controls(page);
  const seen = [];
  for (let i = 0; i < expected.length + 5; ++i) {
    await page.keyboard.press('Tab');
    const f = await focused(page);
    if (f === 'body' || seen.includes(f)) break;
    seen.push(f);
    const outline = await page.evaluate(() => getComputedStyle(document.activeElement).outlineStyle);
    assert.notEqual(outline, 'none', `${name}: ${f} shows no focus outline`);
  }
  const missed = expected.filter((c) => !seen.includes(c));
  const extra = seen.filter((c) => !expected.includes(c));
  assert.deepEqual({ missed, extra }, { missed: [], extra: [] }, `${name}: Tab order misses or adds controls`);
  assert.equal(seen.length, expected.length, `${name}: ${seen.length} Tab stops for ${expected.length} controls`);
  // Every form control has a label: <label for>, aria-label or an enclosing label.
  const unlabelled = await page.$$eval('input:not([type=hidden]), select, textarea', (els) => els
    .filter((e) => !(e.labels && e.labels.length) && !e.getAttribute('aria-label'))
    .map((e) => e.id || e.name));
  assert.deepEqual(unlabelled, [], `${name}: controls without a label`);
  console.log(`ok ${name}: ${seen.length} controls reached by Tab, each outlined and labelled`);
}

async function main() {
  const { study, cleanup } = makeStudy(bin);
  twinprobe(bin, study, ['sent', 'P00001', '--at', '2027-03-01T10:00']);
  const desk = await startDesk(bin, study);
  const browser = await launchBrowser();
  try {
    const page = await browser.newPage();
    await page.setViewport({ width: 1280, height: 900 });
    await page.goto(desk.url + 'signin');
    await checkTabOrder(page, 'sign-in');

    // Sign in: the member list takes the typed name, Enter submits.
    await page.evaluate(() => document.activeElement && document.activeElement.blur());
    await tabTo(page, '#member');
    await page.keyboard.type('Ada Moss');
    await tabTo(page, '#passphrase');
    await page.keyboard.type('meadow lantern river');
    await pressEnterAndWait(page);
    // First use: choose the passphrase, again by keyboard.
    await tabTo(page, '#new_passphrase');
    await page.keyboard.type('meadow lantern river');
    await tabTo(page, '#repeat_passphrase');
    await page.keyboard.type('meadow lantern river');
    await pressEnterAndWait(page);
    assert.ok(page.url().endsWith('/today'), `signed in at ${page.url()}`);
    console.log('ok signed in with the keyboard');

    // The first Tab stop is the skip link; Enter moves the focus to the content.
    await page.evaluate(() => document.activeElement && document.activeElement.blur());
    await page.keyboard.press('Tab');
    assert.equal(await focused(page), "a:Skip to the page's content");
    await page.keyboard.press('Enter');
    assert.equal(await focused(page), '#main');
    console.log('ok the skip link moves the focus past the navigation');
    await checkTabOrder(page, 'today');

    // Through the navigation to Record, then find a probe and record.
    await page.evaluate(() => document.activeElement && document.activeElement.blur());
    await tabTo(page, 'a:Record');
    await pressEnterAndWait(page);
    assert.ok(page.url().endsWith('/record'));
    await checkTabOrder(page, 'record (find)');
    await page.evaluate(() => document.activeElement && document.activeElement.blur());
    await tabTo(page, '#find');
    await page.keyboard.type('P00001');
    await pressEnterAndWait(page);
    await checkTabOrder(page, 'record (form)');
    await page.evaluate(() => document.activeElement && document.activeElement.blur());
    await tabTo(page, '#code');
    await page.keyboard.type('rejection');  // a closed select takes typed text
    await tabTo(page, '#received_at');
    await page.keyboard.type('2027-03-01T11:30');
    await pressEnterAndWait(page);  // Enter in a text field submits its form
    const notice = await text(page, '.notice');
    assert.match(notice, /^Recorded rejection for P00001 at 2027-03-01T11:30:00Z/);
    assert.match(twinprobe(bin, study, ['history', 'P00001']), /Ada Moss +response 1: rejection/);
    console.log('ok found a probe and recorded its response with the keyboard');

    for (const key of ['mail', 'declines', 'study']) {
      await page.goto(desk.url + key);
      await checkTabOrder(page, key);
    }
  } finally {
    await browser.close();
    await desk.stop();
    cleanup();
  }
  console.log('desk keyboard test passed');
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
