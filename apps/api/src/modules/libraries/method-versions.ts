import type { EntityManager } from 'typeorm';
import { ModelDefinitionError, resolveModel } from '@ohmprint/spectral-engine';
import {
  methodDifferences,
  type CreateMethod,
  type MethodItem,
  type MethodListQuery,
  type MethodSettings,
  type MethodVersionDetail,
  type MethodVersionInput,
  type MethodVersionSummary,
  type Page,
} from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import { cappedCount, escapeLike, pageParams, toCappedPage, totalCapFor } from '../../core/paging';
import { recordAudit } from '../audit/record-audit';
import { Method } from './method.entity';
import { MethodVersion } from './method-version.entity';

interface VersionRow {
  id: string;
  method_id: string;
  version: number;
  settings: MethodSettings;
  note: string;
  created_at: Date;
  created_by_id: string | null;
  created_by_name: string | null;
  library_versions: number;
  published_library_versions: number;
  reports: number;
}

const VERSION_SQL = `
  SELECT mv.id, mv.method_id, mv.version, mv.settings, mv.note, mv.created_at,
         u.id AS created_by_id, u.display_name AS created_by_name,
         (SELECT count(*)::int FROM library_version v WHERE v.method_version_id = mv.id) AS library_versions,
         (SELECT count(*)::int FROM library_version v WHERE v.method_version_id = mv.id AND v.status <> 'draft') AS published_library_versions,
         (SELECT count(*)::int FROM test_report r JOIN analysis a ON a.id = r.analysis_id
            JOIN library_version v ON v.id = a.library_version_id WHERE v.method_version_id = mv.id) AS reports
  FROM method_version mv LEFT JOIN app_user u ON u.id = mv.created_by_user_id`;

/** Why a version may no longer change, or null while it may. */
function lockReason(v: VersionRow): string | null {
  if (v.reports > 0) return `Issued reports (${v.reports}) rely on it.`;
  if (v.published_library_versions > 0) return `Published library versions (${v.published_library_versions}) were built under it.`;
  return null;
}

function summary(v: VersionRow): MethodVersionSummary {
  const reason = lockReason(v);
  return {
    id: v.id,
    version: v.version,
    note: v.note,
    createdAt: v.created_at.toISOString(),
    createdBy: v.created_by_id ? { id: v.created_by_id, displayName: v.created_by_name ?? '' } : null,
    libraryVersionCount: v.library_versions,
    locked: reason !== null,
    lockReason: reason,
  };
}

/** A model the engine can fit: a catalog name or an expression it parses; else 400 naming the field. */
export function checkModel(settings: MethodSettings, field = 'settings.model'): void {
  try {
    resolveModel(settings.model);
  } catch (error) {
    if (error instanceof ModelDefinitionError) throw ApiError.badRequest(`The model cannot be used: ${error.message}`, [{ field, message: error.message }]);
    throw error;
  }
}

const METHOD_SORT: Record<MethodListQuery['sort'], string> = { name: 'lower(m.name)', matrix: 'm.matrix' };

export async function listMethods(manager: EntityManager, labId: string, query: MethodListQuery): Promise<Page<MethodItem>> {
  const params: unknown[] = [labId];
  let search = '';
  if (query.q) {
    params.push(escapeLike(query.q));
    search = `AND (m.name ILIKE $2 OR m.matrix ILIKE $2)`;
  }
  const { skip, take } = pageParams(query);
  const [rows, total] = await Promise.all([
    manager.query(
      `SELECT m.id, m.name, m.matrix FROM method m WHERE m.lab_id = $1 ${search}
       ORDER BY ${METHOD_SORT[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}, m.id LIMIT $${params.length + 1} OFFSET $${params.length + 2}`,
      [...params, take, skip],
    ) as Promise<{ id: string; name: string; matrix: MethodItem['matrix'] }[]>,
    cappedCount(manager, `FROM method m WHERE m.lab_id = $1 ${search}`, params, totalCapFor(query)),
  ]);
  const versions: VersionRow[] = rows.length
    ? await manager.query(`${VERSION_SQL} WHERE mv.lab_id = $1 AND mv.method_id = ANY($2::uuid[]) ORDER BY mv.version DESC`, [labId, rows.map((r) => r.id)])
    : [];
  const items = rows.map((r): MethodItem => ({ id: r.id, name: r.name, matrix: r.matrix, versions: versions.filter((v) => v.method_id === r.id).map(summary) }));
  return toCappedPage(items, total, query);
}

async function versionRow(manager: EntityManager, labId: string, versionId: string): Promise<VersionRow> {
  const [row]: VersionRow[] = await manager.query(`${VERSION_SQL} WHERE mv.id = $1 AND mv.lab_id = $2`, [versionId, labId]);
  if (!row) throw ApiError.notFound('Method version');
  return row;
}

export async function methodVersionDetail(manager: EntityManager, labId: string, versionId: string): Promise<MethodVersionDetail> {
  const v = await versionRow(manager, labId, versionId);
  const method = await manager.findOneOrFail(Method, { where: { id: v.method_id, labId } });
  const previous = await manager.findOne(MethodVersion, { where: { labId, methodId: v.method_id, version: v.version - 1 } });
  return {
    ...summary(v),
    methodId: method.id,
    name: method.name,
    matrix: method.matrix,
    settings: v.settings,
    previousVersion: previous?.version ?? null,
    differences: methodDifferences(previous?.settings ?? null, v.settings),
  };
}

/** A new method with its version 1. */
export async function createMethod(manager: EntityManager, labId: string, userId: string, input: CreateMethod): Promise<string> {
  checkModel(input.settings);
  const [clash] = await manager.query(`SELECT 1 FROM method WHERE lab_id = $1 AND lower(name) = lower($2)`, [labId, input.name]);
  if (clash) throw ApiError.conflict(`A method named “${input.name}” already exists.`, [{ field: 'name', message: 'is already used by another method' }]);
  const inserted = await manager.insert(Method, { labId, name: input.name, matrix: input.matrix });
  const methodId = inserted.identifiers[0].id as string;
  const version = await manager.insert(MethodVersion, { labId, methodId, version: 1, settings: input.settings, note: input.note, createdByUserId: userId });
  const versionId = version.identifiers[0].id as string;
  await recordAudit(manager, { labId, actorUserId: userId, action: 'method.created', subjectType: 'method_version', subjectId: versionId, details: { name: input.name, matrix: input.matrix, settings: input.settings } });
  return versionId;
}

/** A change to a method: always a new version, numbered after the newest; refused when nothing differs. */
export async function addMethodVersion(manager: EntityManager, labId: string, userId: string, methodId: string, input: MethodVersionInput): Promise<string> {
  checkModel(input.settings);
  const method = await manager.findOne(Method, { where: { id: methodId, labId }, lock: { mode: 'pessimistic_write' } });
  if (!method) throw ApiError.notFound('Method');
  const latest = await manager.findOne(MethodVersion, { where: { labId, methodId }, order: { version: 'DESC' } });
  const differences = methodDifferences(latest?.settings ?? null, input.settings);
  if (latest && differences.length === 0) throw ApiError.conflict(`Nothing differs from version ${latest.version}; change a setting to make a new version.`);
  const next = (latest?.version ?? 0) + 1;
  const inserted = await manager.insert(MethodVersion, { labId, methodId, version: next, settings: input.settings, note: input.note, createdByUserId: userId });
  const versionId = inserted.identifiers[0].id as string;
  await recordAudit(manager, { labId, actorUserId: userId, action: 'method.version-added', subjectType: 'method_version', subjectId: versionId, details: { name: method.name, version: next, differences } });
  return versionId;
}

/**
 * Corrects a version in place while nothing relies on it (no published library version, no
 * issued report); afterwards a change has to be a new version. The database refuses the change
 * itself once an issued report used it, whatever calls it.
 */
export async function editMethodVersion(manager: EntityManager, labId: string, userId: string, versionId: string, input: MethodVersionInput): Promise<void> {
  checkModel(input.settings);
  await manager.query(`SELECT id FROM method_version WHERE id = $1 AND lab_id = $2 FOR UPDATE`, [versionId, labId]);
  const v = await versionRow(manager, labId, versionId);
  const reason = lockReason(v);
  if (reason) {
    throw new ApiError(409, 'Method version is locked', `Version ${v.version} can no longer change: ${reason} Save the change as a new version.`, { type: 'method-version-locked' });
  }
  await manager.update(MethodVersion, { id: versionId, labId }, { settings: input.settings, note: input.note });
  await recordAudit(manager, {
    labId,
    actorUserId: userId,
    action: 'method.version-edited',
    subjectType: 'method_version',
    subjectId: versionId,
    details: { version: v.version, differences: methodDifferences(v.settings, input.settings) },
  });
}

/** The method version a draft is built under; 404 for another lab's. */
export async function methodVersionOf(manager: EntityManager, labId: string, versionId: string): Promise<{ version: MethodVersion; method: Method }> {
  const version = await manager.findOne(MethodVersion, { where: { id: versionId, labId } });
  if (!version) throw ApiError.notFound('Method version');
  const method = await manager.findOneOrFail(Method, { where: { id: version.methodId, labId } });
  return { version, method };
}
