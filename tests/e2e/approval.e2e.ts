/**
 * Return, resubmit and sign-off at 390 and 1280 px against the real server and demo lab: the demo
 * analyst submits a recipe version with a finished study as evidence; the demo reviewer returns it
 * with a reason; the analyst finds it "Returned to you" on the Bench and resubmits it from the
 * review page (the submit form comes filled); the reviewer signs it off with the password entered
 * again; the standard page and the validation report then show the signed version's settings,
 * and their link to the version opens the recipe, which says that version is approved.
 * Every wait has a deadline and fails with what did not happen.
 */
import path from 'node:path';
import { request as playwrightRequest, type Page } from 'playwright-core';
import { DEMO_PASSWORD, expect, openPage, screenshot, SCREENSHOTS, signIn, type Harness, type ViewportName } from './harness';

const T = 60_000;
const IMPACT_RECIPE = 'Arm impact, force + exponential';
const IMPACT_SCENARIO = 'Arm, impact test with force and exponential windows';

/** As the analyst, through the API: a copy of the impact recipe under a new name, and a finished study of it. */
async function prepareEvidence(h: Harness, recipeName: string): Promise<{ studyName: string }> {
  const api = await playwrightRequest.newContext({ baseURL: h.server.url });
  try {
    const signed = await api.post('/api/v1/auth/sign-in', { data: { email: 'analyst@harborridge.test', password: DEMO_PASSWORD } });
    expect(signed.ok(), `API sign-in of the analyst failed: ${signed.status()}`);
    const lab = `/api/v1/labs/${((await signed.json()) as { memberships: { labId: string }[] }).memberships[0].labId}`;
    const find = async (kind: string, name: string) => {
      const list = (await (await api.get(`${lab}/${kind}?limit=200`)).json()) as { items: { id: string; name: string }[] };
      const item = list.items.find((i) => i.name === name);
      expect(item, `no "${name}" among the demo ${kind}`);
      return item.id;
    };
    const source = (await (await api.get(`${lab}/recipes/${await find('recipes', IMPACT_RECIPE)}`)).json()) as { definition: Record<string, unknown> };
    const made = await api.post(`${lab}/recipes`, { data: { definition: { ...source.definition, name: recipeName } } });
    expect(made.status() === 201, `creating the recipe copy answered ${made.status()}: ${await made.text()}`);
    const recipeId = ((await made.json()) as { id: string }).id;
    const studyName = `${recipeName}: impact evidence`;
    const started = await api.post(`${lab}/studies`, { data: { name: studyName, recipe: { id: recipeId }, scenarios: [{ id: await find('scenarios', IMPACT_SCENARIO) }], seeds: 2 } });
    expect(started.status() === 202, `starting the evidence study answered ${started.status()}: ${await started.text()}`);
    const { id } = (await started.json()) as { id: string };
    const deadline = Date.now() + 120_000;
    for (;;) {
      const s = (await (await api.get(`${lab}/studies/${id}`)).json()) as { status: string };
      if (s.status === 'finished') break;
      expect(s.status === 'queued' || s.status === 'running', `the evidence study ended ${s.status}`);
      expect(Date.now() < deadline, 'the evidence study did not finish within 120 s');
      await new Promise((r) => setTimeout(r, 250)); // polling interval of a deadline-bounded wait
    }
    return { studyName };
  } finally {
    await api.dispose();
  }
}

async function waitText(page: Page, testId: string, pattern: RegExp, what: string) {
  const el = page.getByTestId(testId).first();
  try {
    await el.filter({ hasText: pattern }).waitFor({ timeout: T });
  } catch {
    const seen = (await el.textContent().catch(() => null)) ?? '(not on the page)';
    throw new Error(`${what}: expected ${pattern} in ${testId}, saw "${seen.slice(0, 300)}"`);
  }
}

/** The settings panel alone (the app scrolls inside its panes, so a page shot shows only the top). */
const settingsShot = (page: Page, name: string) => page.getByTestId('settings-summary').first().screenshot({ path: path.join(SCREENSHOTS, `${name}.png`) });

async function submitForm(page: Page, recipeName: string, studyName: string) {
  await page.getByTestId('submit-send').waitFor({ timeout: T });
  await page.getByLabel('Recipe', { exact: true }).selectOption({ label: recipeName });
  await page.getByLabel('Version', { exact: true }).selectOption({ label: 'Version 1' });
  await page.getByRole('checkbox', { name: studyName }).click();
  await page.getByLabel('Structure type').fill('drone motor arm');
  await page.getByLabel('Band from (Hz)').fill('200');
  await page.getByLabel('Band to (Hz)').fill('1000');
  await page.getByLabel('Damping from (% of critical)').fill('0.5');
  await page.getByLabel('Damping to (% of critical)').fill('1.2');
  await page.getByTestId('submit-excitations').getByRole('checkbox', { name: 'Impact', exact: true }).click();
  await page.getByLabel('Purpose (optional)').fill('Hammer standard for the motor arm programme');
}

async function fillJustificationIfAsked(page: Page) {
  const field = page.getByTestId('submit-justification');
  if (await field.count()) await field.locator('textarea, input').first().fill('The failed figure sits outside the band the programme reads; the modes themselves are within tolerance.');
}

function approvalJourney(viewport: ViewportName) {
  return {
    name: `analyst submits, reviewer returns, analyst resubmits, reviewer signs off at ${viewport} width`,
    async run(h: Harness) {
      const recipeName = `Arm impact sign-off (${viewport})`;
      const { studyName } = await prepareEvidence(h, recipeName);
      const analyst = await openPage(h, viewport);
      const reviewer = await openPage(h, viewport);
      try {
        // 1. The analyst submits version 1 with its study.
        await signIn(analyst.page, 'analyst@harborridge.test');
        await analyst.page.getByTestId('screen-title').filter({ hasText: 'Bench' }).waitFor({ timeout: T });
        await analyst.page.goto('/reviews/submit');
        await submitForm(analyst.page, recipeName, studyName);
        await analyst.page.getByTestId('submit-send').click();
        await fillJustificationIfAsked(analyst.page);
        if (await analyst.page.getByTestId('submit-justification').count()) await analyst.page.getByTestId('submit-send').click();
        await analyst.page.waitForURL(/\/reviews\/[0-9a-f-]{36}$/, { timeout: T }).catch(async () => {
          throw new Error(`the submission did not open its review page: ${(await analyst.page.getByTestId('submit-refusal').textContent().catch(() => '')) ?? ''}`);
        });
        const firstId = analyst.page.url().split('/').pop()!;
        await waitText(analyst.page, 'settings-summary', /Line spacing Δf asked/, 'the review page lists the settings');

        // 2. The reviewer returns it with a reason.
        await signIn(reviewer.page, 'reviewer@harborridge.test');
        await reviewer.page.getByTestId('home-reviews').getByTestId(`review-row-${firstId}`).click({ timeout: T });
        await reviewer.page.getByTestId('open-return').click({ timeout: T });
        await reviewer.page.getByLabel('Reason for returning it').fill('State the trigger level you use on the hammer in the purpose.');
        await reviewer.page.getByTestId('dialog-confirm').click();
        await waitText(reviewer.page, 'decision-record', /Returned/, 'the return was not recorded');
        const returned = (await reviewer.page.getByTestId('decision-record').textContent()) ?? '';
        expect(!/signature sha256/.test(returned), `a return shows a signature hash: "${returned.slice(0, 200)}"`);
        await screenshot(reviewer.page, `approval-returned-${viewport}`);
        await reviewer.page.getByTestId('decision-record').screenshot({ path: path.join(SCREENSHOTS, `approval-returned-record-${viewport}.png`) });

        // 3. The analyst sees it returned on the Bench and resubmits from the review page.
        await analyst.page.goto('/');
        await waitText(analyst.page, 'home-returned', new RegExp(recipeName.replace(/[()]/g, '\\$&')), 'the Bench does not list the submission as returned to you');
        await waitText(analyst.page, 'home-returned', /State the trigger level/, 'the Bench does not show the reason');
        await screenshot(analyst.page, `approval-home-returned-${viewport}`);
        await analyst.page.getByTestId('home-returned').getByTestId(`review-row-${firstId}`).click();
        await analyst.page.getByTestId('resubmit').click({ timeout: T });
        await waitText(analyst.page, 'resubmit-source', /was returned by/, 'the submit form does not say what it resubmits');
        expect((await analyst.page.getByLabel('Structure type').inputValue()) === 'drone motor arm', 'the submit form is not filled from the returned submission');
        await analyst.page.getByLabel('Purpose (optional)').fill('Hammer standard for the motor arm programme; trigger at 10 % of the force peak');
        await screenshot(analyst.page, `approval-resubmit-form-${viewport}`);
        await analyst.page.getByTestId('submit-send').click();
        await fillJustificationIfAsked(analyst.page);
        if (await analyst.page.getByTestId('submit-justification').count()) await analyst.page.getByTestId('submit-send').click();
        await analyst.page.waitForURL((url) => /\/reviews\/[0-9a-f-]{36}$/.test(url.pathname) && !url.pathname.endsWith(firstId), { timeout: T });
        const secondId = analyst.page.url().split('/').pop()!;

        // 4. The reviewer signs the new submission off, the password entered again.
        await reviewer.page.goto(`/reviews/${secondId}`);
        await reviewer.page.getByTestId('open-sign-off').click({ timeout: T });
        await reviewer.page.getByLabel('What your signature means').fill('Approved as the lab hammer standard for the motor arm, 200–1000 Hz');
        await reviewer.page.getByLabel('Your password').fill(DEMO_PASSWORD);
        await reviewer.page.getByTestId('dialog-confirm').click();
        await waitText(reviewer.page, 'decision-record', /signature sha256 [0-9a-f]{64}/, 'the sign-off was not recorded with its signature');
        await waitText(reviewer.page, 'settings-summary', /Settings signed off/, 'the signed review does not head its settings as signed off');

        // 5. The standard page and the report show the signed settings.
        await reviewer.page.getByRole('link', { name: 'Open the standard it became' }).click();
        await waitText(reviewer.page, 'settings-summary', /Force window[\s\S]*2 % of the block/, 'the standard page lacks the settings');
        await waitText(reviewer.page, 'settings-summary', /Phase error, 95th percentile over seeds, worst line≤ 10°/, 'the standard page lacks the criteria with tolerances');
        await screenshot(reviewer.page, `approval-standard-${viewport}`);
        await settingsShot(reviewer.page, `approval-standard-settings-${viewport}`);
        await reviewer.page.getByTestId('standard-report').click();
        await waitText(reviewer.page, 'report-identity', /revision 1 · sha256 [0-9a-f]{64}/, 'the report does not show its revision and hash');
        await waitText(reviewer.page, 'report-sheet', /Exponential window on the response, τ25 % of the block/, 'the report lacks the settings');
        await screenshot(reviewer.page, `approval-report-${viewport}`);
        await settingsShot(reviewer.page, `approval-report-settings-${viewport}`);

        // 6. The link to the signed version opens the recipe, which says the version is approved.
        await reviewer.page.getByTestId('settings-recipe-link').click();
        await waitText(reviewer.page, 'recipe-version-1', /Approved[\s\S]*approved: a standard of the lab/, 'the recipe page does not say version 1 is approved');
        await reviewer.page.getByTestId('recipe-standard-1').waitFor({ timeout: T });
        await reviewer.page.getByTestId('recipe-review-state').screenshot({ path: path.join(SCREENSHOTS, `approval-recipe-state-${viewport}.png`) });
        expect(analyst.problems.length === 0 && reviewer.problems.length === 0, `console errors:\n${[...analyst.problems, ...reviewer.problems].join('\n')}`);
      } finally {
        await analyst.close();
        await reviewer.close();
      }
    },
  };
}

export const journeys = (['phone', 'wide'] as const).map(approvalJourney);
