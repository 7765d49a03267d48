import { and, desc, eq } from 'drizzle-orm'
import { z } from 'zod'
import { PRESETS, presetCopy, ruleSetSchema } from '#shared/rules'
import type { PresetId, RuleSet } from '#shared/rules'
import { idParamSchema } from '#shared/schemas/club'
import type { DbTx } from './events'

// The one adapter between the rule engine (shared/rules) and the routes: presets, validation and
// the stamp of the server-kept name and version into the settings.

export function presetNames(): string[] {
  return Object.keys(PRESETS)
}

export function presetSettings(name: string): RuleSet | undefined {
  return Object.hasOwn(PRESETS, name) ? presetCopy(name as PresetId) : undefined
}

/**
 * Settings checked by the engine's schema; problems are reported under `settings.…`. The engine's
 * `name` and `version` fields belong to the server (see `stamped`), so whatever the caller sent
 * there is replaced before the check.
 */
export function validSettings(settings: unknown): RuleSet {
  const isObject = typeof settings === 'object' && settings !== null && !Array.isArray(settings)
  const result = ruleSetSchema.safeParse(isObject ? { ...settings, name: 'pending', version: 1 } : settings)
  if (!result.success) {
    throw badRequest(result.error.issues.map((issue) => {
      const field = issue.path.map(String).join('.')
      // The engine's messages start with their field already; it is not repeated.
      const message = field && issue.message.startsWith(`${field}: `) ? issue.message.slice(field.length + 2) : issue.message
      return { ...issue, path: ['settings', ...issue.path], message }
    }), 'settings')
  }
  return result.data
}

/** The settings as stored for one version: they say which rule set and version they are. */
export function stamped(settings: RuleSet, stamp: { name: string, version: number }): RuleSet {
  return { ...settings, name: stamp.name, version: stamp.version }
}

/**
 * The copy a tournament keeps from the start of its pools, checked once more by the engine;
 * null when the stored version no longer passes its checks.
 */
export function frozenCopy(settings: unknown): RuleSet | null {
  const result = ruleSetSchema.safeParse(settings)
  return result.success ? structuredClone(result.data) : null
}

/** How many reach the finals when the organizer does not say: the rule set's own top N, within our limits. */
export function defaultQualifyCount(settings: RuleSet): number {
  return Math.min(64, Math.max(2, settings.qualification.topN ?? 4))
}

export const ruleSetParams = z.object({ clubId: idParamSchema, ruleSetId: idParamSchema })
export const ruleSetVersionParams = z.object({ clubId: idParamSchema, ruleSetId: idParamSchema, version: idParamSchema })

export function ruleSetView(ruleSet: typeof schema.ruleSets.$inferSelect, extra: { usedBy?: number } = {}) {
  return {
    id: ruleSet.id,
    name: ruleSet.name,
    currentVersion: ruleSet.currentVersion,
    createdAt: ruleSet.createdAt,
    updatedAt: ruleSet.updatedAt,
    ...extra,
  }
}

export function ruleSetNameTaken() {
  return fieldError(409, 'name', 'This club already has a rule set with this name')
}

export function versionView(version: typeof schema.ruleSetVersions.$inferSelect, createdByName: string | null = null) {
  return { version: version.version, createdAt: version.createdAt, createdBy: version.createdBy, createdByName }
}

/** A rule set with its current settings, every version (newest first) and the tournaments using it. */
export async function ruleSetDetail(db: DbTx, clubId: number, ruleSetId: number) {
  const r = schema.ruleSets
  const v = schema.ruleSetVersions
  const [ruleSet] = await db.select().from(r).where(and(eq(r.id, ruleSetId), eq(r.clubId, clubId)))
  if (!ruleSet) throw notFoundError('Rule set')
  const versions = await db.select({ version: v, createdByName: schema.users.name }).from(v)
    .leftJoin(schema.users, eq(schema.users.id, v.createdBy))
    .where(eq(v.ruleSetId, ruleSetId)).orderBy(desc(v.version))
  const current = versions.find(row => row.version.version === ruleSet.currentVersion)
  const t = schema.tournaments
  const usedBy = await db.select({ id: t.id, eventId: t.eventId, name: t.name, version: t.ruleSetVersion, phase: t.phase })
    .from(t).where(eq(t.ruleSetId, ruleSetId)).orderBy(t.id)
  return {
    ...ruleSetView(ruleSet, { usedBy: usedBy.length }),
    settings: current?.version.settings ?? {},
    versions: versions.map(row => versionView(row.version, row.createdByName)),
    tournaments: usedBy,
  }
}
