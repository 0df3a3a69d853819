/**
 * Repository of the versioned lab resources: systems, scenarios and recipes. A head row per
 * resource (lab, name, latest version) and an append-only row per version with its JSON body.
 * Callers validate the body before it gets here; every write takes the transaction it runs in.
 */
import { randomUUID } from 'node:crypto';
import type { Db } from './knex';
import { pageOf, type ListQuery } from './list-query';

export type VersionedKind = 'systems' | 'scenarios' | 'recipes';

const TABLES: Record<VersionedKind, { versions: string; fk: string }> = {
  systems: { versions: 'system_versions', fk: 'system_id' },
  scenarios: { versions: 'scenario_versions', fk: 'scenario_id' },
  recipes: { versions: 'recipe_versions', fk: 'recipe_id' },
};

export interface ResourceHeadRow {
  id: string;
  lab_id: string;
  name: string;
  description: string;
  latest_version: number;
  created_by: string;
  created_by_name: string;
  updated_by: string;
  updated_by_name: string;
  created_at: number;
  updated_at: number;
}

export interface ResourceVersionRow {
  resource_id: string;
  version: number;
  name: string;
  body: string;
  note: string;
  author_id: string;
  author_name: string;
  created_at: number;
}

export const RESOURCE_SORTS = {
  name: 'h.name collate nocase',
  createdAt: 'h.created_at',
  updatedAt: 'h.updated_at',
} as const;

function heads(db: Db, kind: VersionedKind) {
  return db({ h: kind })
    .join({ cu: 'users' }, 'cu.id', 'h.created_by')
    .join({ uu: 'users' }, 'uu.id', 'h.updated_by');
}

const HEAD_COLUMNS = [
  'h.id',
  'h.lab_id',
  'h.name',
  'h.description',
  'h.latest_version',
  'h.created_by',
  'cu.display_name as created_by_name',
  'h.updated_by',
  'uu.display_name as updated_by_name',
  'h.created_at',
  'h.updated_at',
];

export function listResources(db: Db, kind: VersionedKind, labId: string, query: ListQuery) {
  return pageOf<ResourceHeadRow>(heads(db, kind).where('h.lab_id', labId), query, {
    sortColumns: RESOURCE_SORTS,
    nameColumn: 'h.name',
    idColumn: 'h.id',
    select: HEAD_COLUMNS,
  });
}

/** The head row of one resource of the lab, or undefined (also when it belongs to another lab). */
export async function findResource(db: Db, kind: VersionedKind, labId: string, id: string): Promise<ResourceHeadRow | undefined> {
  return heads(db, kind).where({ 'h.lab_id': labId, 'h.id': id }).first(HEAD_COLUMNS);
}

function versions(db: Db, kind: VersionedKind) {
  const { versions: table, fk } = TABLES[kind];
  return {
    query: db({ v: table }).join({ a: 'users' }, 'a.id', 'v.author_id'),
    columns: [`v.${fk} as resource_id`, 'v.version', 'v.name', 'v.body', 'v.note', 'v.author_id', 'a.display_name as author_name', 'v.created_at'],
    fk,
  };
}

export async function findVersion(db: Db, kind: VersionedKind, id: string, version: number): Promise<ResourceVersionRow | undefined> {
  const v = versions(db, kind);
  return v.query.where({ [`v.${v.fk}`]: id, 'v.version': version }).first(v.columns);
}

/** Every version of a resource, newest first, without bodies. */
export async function listVersions(db: Db, kind: VersionedKind, id: string): Promise<Omit<ResourceVersionRow, 'body'>[]> {
  const v = versions(db, kind);
  return v.query
    .where(`v.${v.fk}`, id)
    .orderBy('v.version', 'desc')
    .select(v.columns.filter((c) => c !== 'v.body'));
}

export interface NewVersion {
  name: string;
  description: string;
  body: unknown;
  note: string;
  authorId: string;
  at: number;
}

/** Creates a resource at version 1. */
export async function insertResource(trx: Db, kind: VersionedKind, labId: string, v: NewVersion): Promise<string> {
  const id = randomUUID();
  await trx(kind).insert({
    id,
    lab_id: labId,
    name: v.name,
    description: v.description,
    latest_version: 1,
    created_by: v.authorId,
    updated_by: v.authorId,
    created_at: v.at,
    updated_at: v.at,
  });
  await insertVersionRow(trx, kind, id, 1, v);
  return id;
}

/**
 * Appends version `expected + 1`. The head moves only if it still says `expected`, so two
 * concurrent edits cannot both become the same version; returns false when it had moved on.
 */
export async function appendVersion(trx: Db, kind: VersionedKind, id: string, expected: number, v: NewVersion): Promise<boolean> {
  const moved = await trx(kind)
    .where({ id, latest_version: expected })
    .update({ latest_version: expected + 1, name: v.name, description: v.description, updated_by: v.authorId, updated_at: v.at });
  if (moved !== 1) return false;
  await insertVersionRow(trx, kind, id, expected + 1, v);
  return true;
}

async function insertVersionRow(trx: Db, kind: VersionedKind, id: string, version: number, v: NewVersion) {
  const { versions: table, fk } = TABLES[kind];
  await trx(table).insert({
    [fk]: id,
    version,
    name: v.name,
    body: JSON.stringify(v.body),
    note: v.note,
    author_id: v.authorId,
    created_at: v.at,
  });
}

/** The lab's resource of that name, if any (the demo seed uses it to stay idempotent). */
export function findResourceByName(db: Db, kind: VersionedKind, labId: string, name: string): Promise<{ id: string } | undefined> {
  return db(kind).where({ lab_id: labId, name }).first('id');
}
