/**
 * Evidence journeys at 390 and 1280 px against the real server and demo lab:
 * an analyst starts a small study, watches it finish and reads the results and plots; a reviewer
 * signs off a submission with the re-entered password; an auditor reads a validation report and
 * the audit trail with its integrity check. Each journey saves its last screen.
 */
import { request as playwrightRequest, type APIRequestContext, type Page } from 'playwright-core';
import { DEMO_PASSWORD, expect, openPage, screenshot, signIn, type Harness, type ViewportName } from './harness';

const T = 60_000;

type Item = { id: string; name: string };
type Page_<T> = { items: T[] };

/** An API session of a demo user, outside the browser (no Origin header: a non-browser client). */
async function apiAs(h: Harness, email: string): Promise<{ api: APIRequestContext; labId: string }> {
  const api = await playwrightRequest.newContext({ baseURL: h.server.url });
  const res = await api.post('/api/v1/auth/sign-in', { data: { email, password: DEMO_PASSWORD } });
  expect(res.ok(), `API sign-in of ${email} failed: ${res.status()}`);
  const me = (await res.json()) as { memberships: { labId: string }[] };
  return { api, labId: me.memberships[0].labId };
}

async function getJson<T>(api: APIRequestContext, path: string): Promise<T> {
  const res = await api.get(path);
  expect(res.ok(), `GET ${path} answered ${res.status()}`);
  return (await res.json()) as T;
}

async function byName(api: APIRequestContext, path: string, name: string): Promise<Item> {
  const list = await getJson<Page_<Item>>(api, `${path}?limit=200`);
  const found = list.items.find((i) => i.name === name);
  expect(found, `no "${name}" in ${path}`);
  return found;
}

/** How long the 2-seed evidence study may take on a busy machine before the journey fails. */
const STUDY_DEADLINE_MS = 180_000;

/** A pending submission for the reviewer: the demo study (phone) or a fresh 2-seed study (wide). */
async function prepareSubmission(h: Harness, viewport: ViewportName): Promise<string> {
  const { api, labId } = await apiAs(h, 'analyst@harborridge.test');
  const lab = `/api/v1/labs/${labId}`;
  try {
    let body;
    if (viewport === 'phone') {
      const recipe = await byName(api, `${lab}/recipes`, 'Frame survey, Hann 50 %');
      const studies = await getJson<Page_<Item & { recipe: { id: string } }>>(api, `${lab}/studies?status=finished`);
      const study = studies.items.find((s) => s.recipe.id === recipe.id);
      expect(study, 'the demo study is missing');
      body = {
        recipe: { id: recipe.id, version: 1 }, studyIds: [study.id], purpose: 'Survey standard for the fan frame programme',
        scope: { structureType: 'rooftop fan mounting frame', band: { lowHz: 20, highHz: 120 }, dampingPercent: { min: 0.55, max: 1.2 }, excitations: ['random'] },
        justification: 'H1 is biased low by force-channel noise; the programme keeps the force SNR high, as the output-noise scenario shows.',
      };
    } else {
      const recipe = await byName(api, `${lab}/recipes`, 'Arm shaker, burst random, rectangular');
      const scenario = await byName(api, `${lab}/scenarios`, 'Arm, burst random excitation');
      const started = await api.post(`${lab}/studies`, { data: { name: 'Arm evidence for review', recipe: { id: recipe.id }, scenarios: [{ id: scenario.id }], seeds: 2 } });
      expect(started.status() === 202, `starting the evidence study answered ${started.status()}`);
      const { id } = (await started.json()) as { id: string };
      // Wait for it to finish; at the deadline fail saying so, rather than submit an unfinished study.
      const deadline = Date.now() + STUDY_DEADLINE_MS;
      for (;;) {
        const s = await getJson<{ status: string; progress: { done: number; total: number } }>(api, `${lab}/studies/${id}`);
        if (s.status === 'finished') break;
        expect(s.status === 'queued' || s.status === 'running', `the evidence study ended ${s.status}`);
        expect(
          Date.now() < deadline,
          `the evidence study was still ${s.status} (${s.progress.done} of ${s.progress.total} runs) after ${STUDY_DEADLINE_MS / 1000} s`,
        );
        await new Promise((r) => setTimeout(r, 500));
      }
      body = {
        recipe: { id: recipe.id, version: 1 }, studyIds: [id], purpose: 'Shaker standard for the motor arm',
        scope: { structureType: 'drone motor arm', band: { lowHz: 200, highHz: 1000 }, dampingPercent: { min: 0.5, max: 1.2 }, excitations: ['burst-random'] },
        justification: 'Every criterion is expected to pass; given in case a seed falls outside.',
      };
    }
    const res = await api.post(`${lab}/reviews`, { data: body });
    expect(res.status() === 201, `submitting for review answered ${res.status()}: ${await res.text()}`);
    return ((await res.json()) as { id: string }).id;
  } finally {
    await api.dispose();
  }
}

async function openArea(page: Page, viewport: ViewportName, label: string, inTabs: boolean) {
  if (viewport === 'wide') await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: label }).click();
  else if (inTabs) await page.getByRole('tablist').getByRole('tab', { name: label }).click();
  else {
    await page.getByRole('tablist').getByRole('tab', { name: 'More' }).click();
    await page.getByTestId(`more-${label.toLowerCase()}`).click();
  }
}

function analystJourney(viewport: ViewportName) {
  return {
    name: `analyst runs a study and reads the results at ${viewport} width`,
    async run(h: Harness) {
      const { page, problems, close } = await openPage(h, viewport);
      try {
        await signIn(page, 'analyst@harborridge.test');
        await openArea(page, viewport, 'Studies', true);
        await page.getByTestId('start-study').click();
        await page.getByTestId('start-study-form').waitFor({ timeout: T });
        await page.getByLabel('Study name').fill(`Arm burst check (${viewport})`);
        await page.getByLabel('Recipe', { exact: true }).selectOption({ label: 'Arm shaker, burst random, rectangular (v1)' });
        await page.getByRole('checkbox', { name: 'Arm, burst random excitation' }).click();
        await page.getByRole('checkbox', { name: 'Arm, delay between the channels' }).click();
        await page.getByLabel('Seeds per scenario').fill('2');
        expect((await page.getByTestId('study-runs').textContent())?.startsWith('4 runs'), 'the run count does not read 4 runs');
        await page.getByTestId('start-study-submit').click();

        await page.getByTestId('study-title').filter({ hasText: `Arm burst check (${viewport})` }).waitFor({ timeout: T });
        await page.getByTestId('study-verdict').waitFor({ timeout: 90_000 });
        const status = await page.getByTestId('study-status').textContent();
        expect(status?.includes('Finished'), `the study did not finish (${status})`);
        const matrix = page.getByTestId('results-matrix');
        await matrix.waitFor({ timeout: T });
        const text = (await matrix.textContent()) ?? '';
        expect(/Pass/.test(text) && /Fail/.test(text), 'the matrix does not show both Pass and Fail words (the delay scenario should fail)');
        expect(/dB/.test(text) && /°/.test(text), 'the matrix does not show values with units');
        const summary = await page.getByTestId('results-summary').textContent();
        expect(/of \d+ criteria passed over 2 scenarios/.test(summary ?? ''), `summary reads "${summary}"`);
        await screenshot(page, `evidence-study-${viewport}`);

        await page.getByTestId('matrix-row-0').click();
        await page.getByTestId('scenario-plots').waitFor({ timeout: T });
        await page.getByTestId('plot-frf').waitFor({ timeout: T });
        for (const id of ['plot-magnitude-error', 'plot-phase-error', 'plot-coherence']) expect(await page.getByTestId(id).isVisible(), `${id} is not shown`);
        const criteria = (await page.getByTestId('scenario-criteria').textContent()) ?? '';
        expect(/limit/.test(criteria), 'the scenario criteria show no limits');
        await screenshot(page, `evidence-scenario-${viewport}`);
        expect(problems.length === 0, `console errors:\n${problems.join('\n')}`);
      } finally {
        await close();
      }
    },
  };
}

function reviewerJourney(viewport: ViewportName) {
  return {
    name: `reviewer signs off a submission at ${viewport} width`,
    async run(h: Harness) {
      const submissionId = await prepareSubmission(h, viewport);
      const { page, problems, close } = await openPage(h, viewport);
      try {
        await signIn(page, 'reviewer@harborridge.test');
        await page.getByTestId('home-reviews').getByTestId(`review-row-${submissionId}`).click();
        await page.getByTestId('evidence-studies').waitFor({ timeout: T });
        expect(((await page.getByTestId('coverage-checks').textContent()) ?? '').includes('Covered'), 'coverage checks are not shown');
        await page.getByTestId('open-sign-off').click();
        const dialog = page.getByTestId('sign-off-dialog');
        await dialog.waitFor({ timeout: T });
        // The schema refuses an empty signature before anything is sent.
        await page.getByTestId('dialog-confirm').click();
        await dialog.getByText('Enter your password to sign').waitFor({ timeout: T });
        await page.getByLabel('What your signature means').fill('Approved as the lab standard for this structure and band');
        await page.getByLabel('Your password').fill(DEMO_PASSWORD);
        await page.getByTestId('dialog-confirm').click();
        const record = page.getByTestId('decision-record');
        await record.waitFor({ timeout: T });
        const text = (await record.textContent()) ?? '';
        expect(text.includes('Signed off') && text.includes('Dana Whitcombe') && /signature sha256 [0-9a-f]{64}/.test(text), `decision record reads "${text.slice(0, 200)}"`);
        await screenshot(page, `evidence-signed-${viewport}`);
        expect(problems.length === 0, `console errors:\n${problems.join('\n')}`);
      } finally {
        await close();
      }
    },
  };
}

function auditorJourney(viewport: ViewportName) {
  return {
    name: `auditor reads the report and the audit trail at ${viewport} width`,
    async run(h: Harness) {
      const { page, problems, close } = await openPage(h, viewport);
      try {
        await signIn(page, 'auditor@harborridge.test');
        await openArea(page, viewport, 'Studies', true);
        await page.getByRole('link', { name: 'Frame survey against noise on either channel' }).first().click();
        await page.getByTestId('study-report').click();
        const sheet = page.getByTestId('report-sheet');
        await sheet.waitFor({ timeout: T });
        const report = (await sheet.textContent()) ?? '';
        expect(/PASS|FAIL/.test(report) && report.includes('Reproducibility') && report.includes('Harbor Ridge Test Lab'), 'the report lacks verdicts, reproducibility or the lab');
        expect((await page.getByTestId('report-pdf').getAttribute('href'))?.endsWith('.pdf'), 'no PDF link');
        await screenshot(page, `evidence-report-${viewport}`);

        await openArea(page, viewport, 'Standards', false);
        await page.getByRole('link', { name: 'Audit trail' }).click();
        const integrity = page.getByTestId('integrity-result');
        await integrity.waitFor({ timeout: T });
        const verdict = (await integrity.textContent()) ?? '';
        expect(verdict.includes('Intact') && /all \d+ entries were checked/.test(verdict), `integrity reads "${verdict}"`);
        await screenshot(page, `evidence-integrity-${viewport}`);
        await page.getByTestId('audit-list').waitFor({ timeout: T });
        await page.getByLabel('Action').fill('studies.*');
        await page.getByTestId('audit-apply').click();
        await page.getByTestId('audit-count').filter({ hasText: /of \d+/ }).waitFor({ timeout: T });
        const actions = await page.getByTestId('audit-list').locator('[role="listitem"]').allTextContents();
        expect(actions.length > 0 && actions.every((a) => a.includes('studies.')), 'the action filter did not narrow the trail to studies.*');
        await screenshot(page, `evidence-audit-${viewport}`);
        expect(problems.length === 0, `console errors:\n${problems.join('\n')}`);
      } finally {
        await close();
      }
    },
  };
}

export const journeys = (['phone', 'wide'] as const).flatMap((v) => [analystJourney(v), reviewerJourney(v), auditorJourney(v)]);
