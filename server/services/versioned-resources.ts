/**
 * Use cases of the versioned lab resources (systems, scenarios, recipes): list, read the latest or
 * any version, list versions, create (version 1) and update (a new version; the old ones stay).
 * The definition is validated twice: by the engine's zod schema in the route, then by the
 * engine's own parser, which adds the cross-field rules (e.g. block length or resolution).
 */
import { diffDefinitions } from '@/shared/api/definition-diff';
import type { ResourceListQuery } from '@/shared/api/work';
import type { Db } from '../db/knex';
import {
  appendVersion,
  findResource,
  findVersion,
  insertResource,
  listResources,
  listVersions,
  type ResourceHeadRow,
  type ResourceVersionRow,
  type VersionedKind,
} from '../db/versioned';
import { AppError, notFound } from '../errors';
import { recordAudit } from './audit';
import { checkedByEngine } from './engine-input';

export interface ResourceKindSpec<D> {
  kind: VersionedKind;
  /** Singular, for messages and the audit trail: 'system', 'scenario', 'recipe'. */
  noun: string;
  /** The engine's parser: returns the definition or throws EngineInputError. */
  parse(definition: unknown): D;
}

export interface ResourceInput<D> {
  name?: string;
  description?: string;
  note?: string;
  definition: D;
}

export const summaryOf = (h: ResourceHeadRow) => ({
  id: h.id,
  labId: h.lab_id,
  name: h.name,
  description: h.description,
  latestVersion: h.latest_version,
  createdBy: { id: h.created_by, displayName: h.created_by_name },
  updatedBy: { id: h.updated_by, displayName: h.updated_by_name },
  createdAt: Number(h.created_at),
  updatedAt: Number(h.updated_at),
});

const versionInfoOf = (v: Omit<ResourceVersionRow, 'body'>) => ({
  version: v.version,
  name: v.name,
  note: v.note,
  author: { id: v.author_id, displayName: v.author_name },
  createdAt: Number(v.created_at),
});

export function resourceService<D>(spec: ResourceKindSpec<D>) {
  const capitalised = spec.noun[0].toUpperCase() + spec.noun.slice(1);

  async function head(db: Db, labId: string, id: string): Promise<ResourceHeadRow> {
    const h = await findResource(db, spec.kind, labId, id);
    if (!h) throw notFound(`${capitalised} ${id}`);
    return h;
  }

  async function get(db: Db, labId: string, id: string, version?: number) {
    const h = await head(db, labId, id);
    const v = await findVersion(db, spec.kind, id, version ?? h.latest_version);
    if (!v) throw notFound(`Version ${version} of ${spec.noun} ${id}`);
    return { ...summaryOf(h), version: versionInfoOf(v), definition: JSON.parse(v.body) as D };
  }

  function nameOf(input: ResourceInput<D>): string {
    const own = (input.definition as { name?: unknown }).name;
    const name = input.name ?? (typeof own === 'string' ? own.trim() : undefined);
    if (!name) {
      throw new AppError(400, 'invalid_request', `name: give the ${spec.noun} a name`, { fields: [{ path: 'name', message: 'Give a name' }] });
    }
    return name;
  }

  return {
    async list(db: Db, labId: string, query: ResourceListQuery) {
      const { rows, total } = await listResources(db, spec.kind, labId, query);
      return { items: rows.map(summaryOf), total, limit: query.limit, offset: query.offset };
    },

    get,

    async versions(db: Db, labId: string, id: string) {
      await head(db, labId, id);
      return { items: (await listVersions(db, spec.kind, id)).map(versionInfoOf) };
    },

    async create(db: Db, labId: string, userId: string, input: ResourceInput<D>) {
      const definition = checkedByEngine('definition', () => spec.parse(input.definition));
      const name = nameOf(input);
      const id = await db.transaction(async (trx) => {
        const newId = await insertResource(trx, spec.kind, labId, {
          name,
          description: input.description ?? '',
          body: definition,
          note: input.note ?? '',
          authorId: userId,
          at: Date.now(),
        });
        await recordAudit(trx, {
          labId,
          actorUserId: userId,
          action: `${spec.kind}.create`,
          targetType: spec.noun,
          targetId: newId,
          after: { version: 1, name },
        });
        return newId;
      });
      return get(db, labId, id);
    },

    async update(db: Db, labId: string, userId: string, id: string, input: ResourceInput<D> & { baseVersion: number }) {
      const definition = checkedByEngine('definition', () => spec.parse(input.definition));
      const name = nameOf(input);
      await db.transaction(async (trx) => {
        const h = await head(trx, labId, id);
        if (h.latest_version !== input.baseVersion) throw conflict(spec.noun, input.baseVersion, h.latest_version);
        const moved = await appendVersion(trx, spec.kind, id, h.latest_version, {
          name,
          description: input.description ?? h.description,
          body: definition,
          note: input.note ?? '',
          authorId: userId,
          at: Date.now(),
        });
        if (!moved) throw conflict(spec.noun, input.baseVersion, h.latest_version + 1);
        const previous = await findVersion(trx, spec.kind, id, h.latest_version);
        await recordAudit(trx, {
          labId,
          actorUserId: userId,
          action: `${spec.kind}.update`,
          targetType: spec.noun,
          targetId: id,
          before: { version: h.latest_version, name: h.name },
          after: { version: h.latest_version + 1, name, changes: fieldChanges(previous, definition, { old: h.description, new: input.description ?? h.description }) },
        });
      });
      return get(db, labId, id);
    },
  };
}

/**
 * What an edit changed, field by field ({ path, old, new }; a missing side is left out), for the
 * audit trail: the definition's leaves by dotted path, and the description.
 */
function fieldChanges(previous: ResourceVersionRow | undefined, definition: unknown, description: { old: string; new: string }) {
  const before = previous ? (JSON.parse(previous.body) as unknown) : undefined;
  const out = diffDefinitions(before, JSON.parse(JSON.stringify(definition))).map((c) => ({ path: c.path, old: c.before, new: c.after }));
  if (description.old !== description.new) out.push({ path: 'description', old: description.old, new: description.new });
  return out;
}

function conflict(noun: string, base: number, latest: number) {
  return new AppError(
    409,
    'version_conflict',
    `This ${noun} is at version ${latest}; your edit started from version ${base}. Reload it and apply your change again.`,
    { baseVersion: base, latestVersion: latest },
  );
}
