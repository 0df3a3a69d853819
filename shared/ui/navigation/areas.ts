/**
 * The areas of the signed-in app, in the order the side rail lists them. `inTabs` marks the five
 * a phone shows in its bottom bar; the rest are reached through "More".
 */
export type AreaId =
  | 'bench'
  | 'systems'
  | 'scenarios'
  | 'recipes'
  | 'studies'
  | 'standards'
  | 'reviews'
  | 'lab'
  | 'about';

export type AreaGroup = 'Work' | 'Evidence' | 'Lab';

export type Area = {
  id: AreaId;
  label: string;
  href: string;
  group: AreaGroup;
  inTabs: boolean;
  /** What the area is for, in a sentence or two (its screen's intro and the More list). */
  purpose: string;
  /** What its empty state says will appear there. */
  emptyTitle: string;
  emptyBody: string;
};

export const areas: readonly Area[] = [
  {
    id: 'bench',
    label: 'Bench',
    href: '/',
    group: 'Work',
    inTabs: true,
    purpose: 'Your work in progress, and what is waiting for you.',
    emptyTitle: 'Nothing on the bench yet',
    emptyBody:
      'Studies you have running, results that need a look and work sent to you for sign-off will gather here, newest first.',
  },
  {
    id: 'systems',
    label: 'Systems',
    href: '/systems',
    group: 'Work',
    inTabs: true,
    purpose:
      'Known-answer systems: single- and multi-degree-of-freedom models whose FRF is known exactly, as receptance, mobility or accelerance. Every score is measured against one.',
    emptyTitle: 'No systems defined',
    emptyBody:
      'A system is given by its modal parameters, or by masses, springs and dampers. The ones your lab defines will be listed here with their modes and damping.',
  },
  {
    id: 'scenarios',
    label: 'Scenarios',
    href: '/scenarios',
    group: 'Work',
    inTabs: true,
    purpose:
      'A scenario puts a system under test conditions: an excitation, and the error sources you switch on and size, from channel noise and delay to leakage, clipping and gain mismatch.',
    emptyTitle: 'No scenarios yet',
    emptyBody:
      'Each scenario will show its system, its excitation (random, burst random, periodic random, chirp or impact) and the error sources it adds.',
  },
  {
    id: 'recipes',
    label: 'Recipes',
    href: '/recipes',
    group: 'Work',
    inTabs: true,
    purpose:
      "A recipe is a lab's processing settings: block length, window, overlap, averages, detrending, estimator (H1, H2 or Hv), band of interest and the tolerances a result must meet.",
    emptyTitle: 'No recipes yet',
    emptyBody: 'Recipes your team drafts or uses will be listed here, each with its settings and tolerances.',
  },
  {
    id: 'studies',
    label: 'Studies',
    href: '/studies',
    group: 'Work',
    inTabs: true,
    purpose:
      'A study runs one recipe against a suite of scenarios over many seeds, in the background, and scores each estimated FRF against the exact one.',
    emptyTitle: 'No studies run yet',
    emptyBody:
      'Studies will appear here with their progress while they run, and with their scores once they finish. Each can be reproduced bit for bit.',
  },
  {
    id: 'standards',
    label: 'Standards',
    href: '/standards',
    group: 'Evidence',
    inTabs: false,
    purpose:
      "The lab's approved processing standards, each with its evidence, versions and audit trail. An approved standard never changes; an edit makes a new version.",
    emptyTitle: 'No approved standards yet',
    emptyBody:
      'When a reviewer signs off a recipe and its evidence, it becomes a standard and is kept here, ready for an assessor.',
  },
  {
    id: 'reviews',
    label: 'Reviews',
    href: '/reviews',
    group: 'Evidence',
    inTabs: false,
    purpose:
      'Work submitted for sign-off, waiting for an independent reviewer. Nobody signs off their own work.',
    emptyTitle: 'Nothing waiting for review',
    emptyBody:
      'Submissions will queue here with their evidence. A reviewer signs off with their password and a stated meaning, or sends the work back with a reason.',
  },
  {
    id: 'lab',
    label: 'Lab',
    href: '/lab',
    group: 'Lab',
    inTabs: false,
    purpose: "The lab's members, their roles, and its settings. Lab admins make changes here.",
    emptyTitle: 'Lab settings are on their way',
    emptyBody: 'Members and their roles (admin, analyst, reviewer, auditor) will be listed here.',
  },
  {
    id: 'about',
    label: 'About',
    href: '/about',
    group: 'Lab',
    inTabs: false,
    purpose: 'What Plumbline checks, what it does not, and which version is running.',
    emptyTitle: '',
    emptyBody: '',
  },
];

export const tabAreas = areas.filter((area) => area.inTabs);
export const moreAreas = areas.filter((area) => !area.inTabs);
export const moreHref = '/more';

export function areaById(id: AreaId): Area {
  const area = areas.find((candidate) => candidate.id === id);
  if (!area) throw new Error(`areaById: unknown area "${id}"`);
  return area;
}

/** The area a path belongs to: `/studies/42` is in Studies; `/` and `/bench/…` are the Bench. */
export function areaForPath(pathname: string): Area | undefined {
  if (pathname === '/' || pathname === '' || pathname.startsWith('/bench/')) return areaById('bench');
  return areas.find((area) => area.href !== '/' && (pathname === area.href || pathname.startsWith(`${area.href}/`)));
}
