/** Developer aid: screenshots of pages, signed in as a demo user. node dist/server/scripts/shot.js <email> <path> [name] [width] [height] */
import { launchBrowser, screenshot, signIn } from '../tests/support/browser';

async function main(): Promise<void> {
  const [email, p, name = 'shot', w = '1280', h = '800'] = process.argv.slice(2);
  const base = process.env.BASE_URL ?? 'http://127.0.0.1:3000';
  const ctx = await launchBrowser({ width: Number(w), height: Number(h) });
  const page = ctx.pages()[0] ?? (await ctx.newPage());
  page.on('console', (m) => m.type() === 'error' && console.log('console:', m.text()));
  if (email !== '-') {
    await signIn(page, base, email);
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
  }
  await page.goto(base + p);
  await page.waitForTimeout(1200);
  console.log(await screenshot(page, name));
  await ctx.close();
}
void main();
