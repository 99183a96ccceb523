// The desk in a real browser: Debian's chromium, headless, through the
// DevTools protocol (puppeteer-core). Usage: node desk_browser_test.mjs TWINPROBE
// (CTest runs it as "desk: browser" against the built binary).
//
// A member signs in, marks three probes sent, records a response and its
// correction, confirms a mail suggestion, declines the invitation, and sees
// each in the probe's history and in `twinprobe history` and `verify`; a hostile note comes back as text;
// a form without its CSRF token is refused; two members record at once and
// both entries land.
import assert from 'node:assert/strict';
import { makeStudy, makeMailStudy, startDesk, launchBrowser, signIn, text, twinprobe } from './desk_harness.mjs';

const bin = process.argv[2];
if (!bin) {
  console.error('usage: node desk_browser_test.mjs PATH/TO/twinprobe');
  process.exit(2);
}

const HOSTILE = '<script>window.pwned = 1</script>"><svg onload="window.pwned = 2">';

async function submit(page, selector = 'main form[method=post] button[type=submit]') {
  const [response] = await Promise.all([page.waitForNavigation(), page.click(selector)]);
  return response;
}

async function main() {
  const { study, cleanup } = makeStudy(bin);
  const desk = await startDesk(bin, study);
  const browser = await launchBrowser();
  const dialogs = [];
  try {
    const page = await browser.newPage();
    page.on('dialog', async (d) => { dialogs.push(d.message()); await d.dismiss(); });
    await page.setJavaScriptEnabled(false);  // the desk must work without it
    await signIn(page, desk.url, 'Ada Moss', 'meadow lantern river');
    console.log('ok signed in as Ada Moss (first use set the passphrase)');

    // Today: tick the first three due probes and give the sending time.
    const due = await page.$$eval('main table tbody input[type=checkbox]', (boxes) => boxes.slice(0, 3).map((b) => b.value));
    assert.equal(due.length, 3);
    for (const probe of due) await page.click(`#sent-${probe}`);
    await page.type('#sent_at', '2027-03-01T10:00');
    await submit(page, 'form[action="/today"] button[type=submit]');
    assert.equal(await text(page, '.notice.ok'),
      due.map((p) => `Marked ${p} as sent at 2027-03-01T10:00:00Z.`).join(' '));
    console.log(`ok marked ${due.join(', ')} sent`);

    // Record: find the first probe, enter a response, then correct it.
    const probe = due[0];
    await page.goto(desk.url + 'record');
    await page.type('#find', probe);
    await Promise.all([page.waitForNavigation(), page.click('form[action="/record"][method=get] button')]);
    await page.select('#code', 'info_request');
    await page.type('#received_at', '2027-03-01T11:30');
    await page.select('#channel', 'phone');
    await page.type('#note', HOSTILE);
    await submit(page, 'form[action="/record"][method=post] button');
    assert.equal(await text(page, '.notice.ok'),
      `Recorded info_request for ${probe} at 2027-03-01T11:30:00Z (positive callback).`);
    await page.select('#code', 'invitation');
    await page.type('#received_at', '2027-03-01T11:30');
    await page.select('#channel', 'phone');
    await submit(page, 'form[action="/record"][method=post] button');
    assert.equal(await text(page, '.notice.ok'),
      `Recorded invitation for ${probe} at 2027-03-01T11:30:00Z (positive callback); it supersedes response 1, which is kept.`);
    assert.equal(await page.$$eval('tr.superseded', (rows) => rows.length), 1);
    assert.match(await text(page, 'tr.superseded'), /superseded by response 2/);
    console.log(`ok recorded a response to ${probe} and its correction`);

    // A refused entry: the command's message beside the field, nothing stored.
    await page.select('#code', 'offer');
    await page.type('#received_at', 'yesterday');
    const refused = await submit(page, 'form[action="/record"][method=post] button');
    assert.equal(refused.status(), 400);
    assert.equal(await text(page, '#received_at-refused'),
      "'yesterday' is not a date or time \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)");
    assert.equal(await page.$eval('#received_at', (e) => e.getAttribute('aria-invalid')), 'true');
    console.log('ok a refused entry shows record\'s message beside the field');

    // Declines: the invitation is due; decline it.
    await page.goto(desk.url + 'declines');
    assert.match(await text(page, 'main'), new RegExp(`${probe}\\s+due`));
    await page.type(`#declined_at-${probe}`, '2027-03-01T11:45');
    await page.select(`#channel-${probe}`, 'mail');
    await submit(page, 'form[action="/declines"] button');
    assert.equal(await text(page, '.notice.ok'),
      `Recorded that the invitation to ${probe} was declined at 2027-03-01T11:45:00Z.`);
    console.log(`ok declined the invitation to ${probe}`);

    // Probe history in the browser: the note is text, every entry Ada's.
    await page.goto(`${desk.url}probe?id=${probe}`);
    const rows = await page.$$eval('main table tbody tr', (trs) => trs.map((tr) => tr.textContent));
    assert.equal(rows.length, 4);  // sending, two responses, decline
    assert.ok(rows.every((r) => r.includes('Ada Moss')));
    assert.match(rows[0], /sending/);
    assert.match(rows[1], /superseded by response 2/);
    assert.match(rows[3], /declined/);
    await page.setJavaScriptEnabled(true);
    await page.reload();
    assert.equal(await page.$eval('.pre bdi', (e) => e.textContent), HOSTILE);
    assert.equal(await page.$$eval('main script, main svg', (els) => els.length), 0);
    assert.equal(await page.evaluate(() => window.pwned), undefined);
    console.log('ok the hostile note comes back as text and runs nothing');

    // The same in the store, through the commands.
    const history = twinprobe(bin, study, ['history', probe]);
    assert.match(history, /Ada Moss +sent at 2027-03-01T10:00:00Z/);
    assert.match(history, /Ada Moss +response 1: info_request .*from desk; superseded by 2/);
    assert.match(history, /Ada Moss +response 2: invitation .*from desk; supersedes 1; current/);
    assert.match(history, /Ada Moss +declined at 2027-03-01T11:45:00Z/);
    // render seals its materials in an audit entry of its own (one more than the desk writes).
    assert.match(twinprobe(bin, study, ['verify']), /^The audit chain is intact: 9 entries/);
    console.log('ok history and verify show every entry');

    // A forged form without its CSRF token: refused, nothing stored.
    await page.goto(desk.url + 'today');
    const forged = await Promise.all([page.waitForNavigation(), page.evaluate((p) => {
      const f = document.createElement('form');
      f.method = 'post';
      f.action = '/record';
      for (const [k, v] of [['probe', p], ['code', 'offer']]) {
        const i = document.createElement('input');
        i.name = k; i.value = v; f.appendChild(i);
      }
      document.body.appendChild(f);
      f.submit();
    }, due[1])]);
    assert.equal(forged[0].status(), 403);
    assert.match(await text(page, '.notice.error'), /^This form did not come from this desk/);
    assert.doesNotMatch(twinprobe(bin, study, ['history', due[1]]), /offer/);
    console.log('ok a forged form without its token is refused');

    // Two members record at once, each in their own browser session.
    const bo = await (await browser.createBrowserContext()).newPage();
    await signIn(bo, desk.url, 'Bo Lind', 'harbour kettle stone');
    const pages = [[page, due[1], 'rejection'], [bo, due[2], 'invitation']];
    for (const [p, id, code] of pages) {
      await p.goto(`${desk.url}record?probe=${id}`);
      await p.select('#code', code);
      await p.type('#received_at', '2027-03-01T11:50');
    }
    await Promise.all(pages.map(([p]) => submit(p, 'form[action="/record"][method=post] button')));
    for (const [p, id, code] of pages)
      assert.match(await text(p, '.notice.ok'), new RegExp(`^Recorded ${code} for ${id} at 2027-03-01T11:50:00Z`));
    assert.match(twinprobe(bin, study, ['history', due[1]]), /Ada Moss +response \d+: rejection/);
    assert.match(twinprobe(bin, study, ['history', due[2]]), /Bo Lind +response \d+: invitation/);
    assert.match(twinprobe(bin, study, ['verify']), /^The audit chain is intact: 12 entries/);
    console.log('ok two members recorded at once and both entries landed');

    // Mail: confirm a suggestion in the review queue of the mail fixture study.
    const mail = makeMailStudy(bin);
    const mailDesk = await startDesk(bin, mail.study, '2027-03-06T12:00:00Z');
    try {
      const m = await (await browser.createBrowserContext()).newPage();
      await m.setJavaScriptEnabled(false);
      await signIn(m, mailDesk.url, 'Ada Moss', 'meadow lantern river');
      await m.goto(mailDesk.url + 'mail');
      assert.match(await text(m, 'main'), /12 messages wait for a decision/);
      await m.select('#decision-1', 'confirm');
      await submit(m, 'form:has(input[name=message][value="1"]) button');
      assert.equal(await text(m, '.notice.ok'),
        'Recorded invitation for P00001 at 2027-03-04T09:15:00Z from message 1 (confirmed as suggested), a positive callback.');
      assert.match(twinprobe(bin, mail.study, ['history', 'P00001']),
        /Ada Moss +response 1: invitation \(positive\), received 2027-03-04T09:15:00Z by mail, from mail-review; current/);
      assert.match(twinprobe(bin, mail.study, ['verify']), /^The audit chain is intact/);
      console.log('ok confirmed a mail suggestion');
    } finally {
      await mailDesk.stop();
      mail.cleanup();
    }

    assert.deepEqual(dialogs, []);
  } finally {
    await browser.close();
    const stopped = await desk.stop();
    assert.deepEqual(stopped, { code: 0, signal: null });
    cleanup();
  }
  console.log('desk browser test passed');
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
