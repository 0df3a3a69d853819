/**
 * The evidence a signature is made over, as one canonical document: the recipe version's
 * definition, each evidence study (its scenario versions, seeds, engine version, stored summary
 * and the sha256 of every stored result curve) and the engine version at signing. Its sha256 is
 * the evidence hash; the signature hash binds that to the signer, meaning, comment and time.
 * Canonical JSON = object keys sorted at every level (services/audit.ts canonicalJson).
 */
import { createHash } from 'node:crypto';
import type { Db } from '../db/knex';
import { findStudy, listCurves, studyScenarios } from '../db/studies';
import { findVersion } from '../db/versioned';
import { notFound } from '../errors';
import { canonicalJson } from './audit';

export const sha256Hex = (text: string | Buffer) => createHash('sha256').update(text).digest('hex');

export interface EvidenceDocument {
  recipe: { id: string; version: number; definition: unknown };
  studies: {
    id: string;
    status: string;
    engineVersion: string;
    seeds: number;
    baseSeed: number;
    scenarios: { position: number; id: string; version: number; definition: unknown }[];
    summary: unknown;
    curves: { scenarioId: string; kind: string; length: number; sha256: string }[];
  }[];
  engineVersion: string;
}

export async function evidenceDocument(
  db: Db,
  labId: string,
  recipe: { id: string; version: number },
  studyIds: string[],
  engineVersion: string,
): Promise<EvidenceDocument> {
  const version = await findVersion(db, 'recipes', recipe.id, recipe.version);
  if (!version) throw notFound(`Version ${recipe.version} of recipe ${recipe.id}`);
  const studies: EvidenceDocument['studies'] = [];
  for (const id of studyIds) {
    const s = await findStudy(db, labId, id);
    if (!s) throw notFound(`Study ${id}`);
    const scenarios = await studyScenarios(db, id);
    const curves = await listCurves(db, id);
    studies.push({
      id,
      status: s.status,
      engineVersion: s.engine_version,
      seeds: s.seeds,
      baseSeed: s.base_seed,
      scenarios: scenarios.map((sc) => ({ position: sc.position, id: sc.scenario_id, version: sc.scenario_version, definition: JSON.parse(sc.body) })),
      summary: s.summary ? JSON.parse(s.summary) : null,
      curves: curves.map((c) => ({ scenarioId: c.scenario_id, kind: c.kind, length: c.length, sha256: sha256Hex(c.data) })),
    });
  }
  return { recipe: { id: recipe.id, version: recipe.version, definition: JSON.parse(version.body) }, studies, engineVersion };
}

export const evidenceSha256 = (doc: EvidenceDocument) => sha256Hex(canonicalJson(doc));

export interface SignatureInput {
  evidenceSha256: string;
  submissionId: string;
  decision: 'approved' | 'returned';
  signer: { id: string; displayName: string; email: string };
  meaning: string | null;
  comment: string;
  reason: string | null;
  signedAt: number;
}

export const signatureSha256 = (s: SignatureInput) => sha256Hex(canonicalJson(s));
