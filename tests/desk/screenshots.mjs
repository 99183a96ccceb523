// Screenshots of every desk page at 1280 and 360 pixels wide, for the field
// team's guide (docs/desk.md). Usage: node screenshots.mjs TWINPROBE OUT_DIR
// Not a test: run it by hand after changing a page, and look at the result.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { makeStudy, makeMailStudy, startDesk, launchBrowser, signIn, twinprobe } from './desk_harness.mjs';

const [bin, out] = process.argv.slice(2);
if (!bin || !out) {
  console.error('usage: node screenshots.mjs PATH/TO/twinprobe OUT_DIR');
  process.exit(2);
}
mkdirSync(out, { recursive: true });

const { study, cleanup } = makeStudy(bin);
// Some fieldwork first, made by the commands, so the pages have something to show.
for (const p of ['P00031', 'P00023', 'P00001', 'P00013'])
  twinprobe(bin, study, ['sent', p, '--at', '2027-03-01T09:45'], 'Bo Lind');
twinprobe(bin, study, ['record', 'P00031', 'info_request', '--at', '2027-03-01T10:40', '--channel', 'phone',
                       '--note', 'Asked when the applicant could start'], 'Bo Lind');
twinprobe(bin, study, ['record', 'P00031', 'invitation', '--at', '2027-03-01T10:40', '--channel', 'phone',
                       '--note', 'Invited to an interview on Thursday'], 'Bo Lind');
twinprobe(bin, study, ['record', 'P00023', 'rejection', '--at', '2027-03-01T11:10', '--channel', 'mail'], 'Bo Lind');
twinprobe(bin, study, ['report', '--out', join(study, 'reports', 'report.html')]);

const desk = await startDesk(bin, study);
const browser = await launchBrowser();
try {
  const page = await browser.newPage();
  const pages = [
    ['signin', 'signin'], ['today', 'today'], ['record', 'record?probe=P00031'],
    ['record-refused', null], ['declines', 'declines'], ['probe', 'probe?id=P00031'], ['study', 'study'],
  ];
  for (const width of [1280, 360]) {
    await page.setViewport({ width, height: width === 360 ? 740 : 900 });
    for (const [name, path] of pages) {
      if (name === 'signin') {
        await page.goto(desk.url + path);
      } else if (name === 'record-refused') {
        await page.goto(desk.url + 'record?probe=P00013');
        await page.select('#code', 'invitation');
        await page.type('#received_at', '2027-03-01T08:00');
        await Promise.all([page.waitForNavigation(), page.click('form[action="/record"][method=post] button')]);
      } else {
        if (page.url().includes('/signin')) await signIn(page, desk.url, 'Ada Moss', 'meadow lantern river');
        await page.goto(desk.url + path);
      }
      await page.screenshot({ path: join(out, `${name}-${width}.png`), fullPage: true });
      if (name === 'signin') await signIn(page, desk.url, 'Ada Moss', 'meadow lantern river');
    }
  }
  // The Mail page, on the mail fixture study's review queue.
  const mail = makeMailStudy(bin);
  const mailDesk = await startDesk(bin, mail.study, '2027-03-06T12:00:00Z');
  try {
    const m = await (await browser.createBrowserContext()).newPage();
    await signIn(m, mailDesk.url, 'Ada Moss', 'meadow lantern river');
    for (const width of [1280, 360]) {
      await m.setViewport({ width, height: width === 360 ? 740 : 900 });
      await m.goto(mailDesk.url + 'mail');
      await m.screenshot({ path: join(out, `mail-${width}.png`), clip: { x: 0, y: 0, width, height: width === 360 ? 1600 : 1100 } });
    }
  } finally {
    await mailDesk.stop();
    mail.cleanup();
  }
} finally {
  await browser.close();
  await desk.stop();
  cleanup();
}
console.log(`screenshots in ${out}`);
