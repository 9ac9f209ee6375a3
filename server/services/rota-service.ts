// Saving shifts, exceptions and blocks: references checked, and no provider at two sites at once.
import type { SessionUser } from '#shared/types/auth'
import { BlockSchema, ShiftSchema, type BlockBody, type BlockPatch, type ShiftBody, type ShiftExceptionBody, type ShiftPatch } from '#shared/schemas/rota'
import type { BlockDto, ShiftDto, ShiftExceptionDto } from '#shared/types/rota-api'
import { findFirstShiftClash } from '#shared/domain/rota'
import { managesProvider } from '#shared/utils/access'
import { displayStyleOf, formatLocalDate } from '#shared/utils/display-time'
import { requireSiteAccess } from '../utils/auth'
import type { Db } from '../utils/db'
import { assertValid, badRequest, conflict, notFound } from '../utils/errors'
import { findProvider, lockProvider } from '../repositories/providers'
import { findSiteDetails } from '../repositories/sites'
import { findOperatory } from '../repositories/operatories'
import { deleteShift as removeShift, findShift, insertShift, listShifts, shiftToInput, updateShift } from '../repositories/shifts'
import { deleteShiftException as removeShiftException, findShiftException, insertShiftException, listShiftExceptions } from '../repositories/shift-exceptions'
import { deleteBlock as removeBlock, findBlock, insertBlock, updateBlock } from '../repositories/blocks'
import { writeAudit } from '../repositories/audit-log'
import { changeWithImpact, type ImpactResult, type ImpactWatch } from './impact-service'

async function requireProvider(db: Db, providerId: number) {
  const provider = await findProvider(db, providerId)
  if (!provider) throw badRequest('providerId', 'is not a provider')
  if (!provider.active) throw badRequest('providerId', 'is an inactive provider')
  return provider
}

async function requireSite(db: Db, siteId: number) {
  const [site] = await findSiteDetails(db, [siteId])
  if (!site) throw badRequest('siteId', 'is not a site')
  return site
}

/** A shift at a site the provider's account does not cover would never show on their own screens. */
async function requireWorksAt(db: Db, providerId: number, siteId: number) {
  const provider = await requireProvider(db, providerId)
  const site = await requireSite(db, siteId)
  if (!provider.siteIds.includes(siteId)) {
    throw badRequest('providerId', `${provider.name}'s account does not include ${site.name}: add the site to their account under People first`)
  }
}

/**
 * 409 when the provider already works at another site at an overlapping time on some date. Shifts at
 * `awaySiteIds` are left out (an extra day where whole-day time off already frees the provider).
 */
async function refuseCrossSiteClash(db: Db, shift: ShiftBody, shiftId: number, awaySiteIds: ReadonlySet<number> | 'all' = new Set()): Promise<void> {
  const provider = await requireProvider(db, shift.providerId)
  const others = (await listShifts(db, { providerId: shift.providerId }))
    .filter((other) => other.id !== shiftId && awaySiteIds !== 'all' && !awaySiteIds.has(other.siteId))
  if (others.length === 0) return
  const sites = await findSiteDetails(db, [...new Set([shift.siteId, ...others.map((other) => other.siteId)])])
  const zoneOf = (siteId: number) => sites.find((site) => site.id === siteId)?.timeZone ?? 'UTC'
  const candidate = shiftToInput({ ...shift, id: shiftId, ruleText: '' })
  const clash = findFirstShiftClash(candidate, others.map(shiftToInput), zoneOf)
  if (!clash) return
  const siteName = sites.find((site) => site.id === clash.otherSiteId)?.name ?? `site ${clash.otherSiteId}`
  // The date in the order of the site whose shift is being saved (the screen that asked).
  const dateText = formatLocalDate(clash.date, displayStyleOf(sites.find((site) => site.id === shift.siteId)), 'medium')
  throw conflict(`${provider.name} already works at ${siteName} on ${dateText} at that time.`, {
    field: 'rrule', date: clash.date, otherShiftId: clash.otherShiftId, otherSiteId: clash.otherSiteId,
  })
}

/** A new shift only adds time: its dry run strands nothing, but is checked (and refused) like the save. */
export function createShift(user: SessionUser, shift: ShiftBody, dryRun = false): Promise<ImpactResult<ShiftDto>> {
  return changeWithImpact({ userId: user.id, dryRun, cause: 'shift added' }, async (trx) => {
    await requireWorksAt(trx, shift.providerId, shift.siteId)
    await lockProvider(trx, shift.providerId)
    await refuseCrossSiteClash(trx, shift, 0)
    const id = await insertShift(trx, shift)
    await writeAudit(trx, { userId: user.id, action: 'shift_created', entity: 'shift', entityId: id, after: shift })
    return (await findShift(trx, id))!
  })
}

/** The merged shift is validated and clash-checked again; visits it strands are answered (issue 13). */
export function changeShift(user: SessionUser, id: number, patch: ShiftPatch, dryRun = false): Promise<ImpactResult<ShiftDto>> {
  return changeWithImpact({ userId: user.id, dryRun, cause: 'shift changed' }, async (trx, impact) => {
    const before = await findShift(trx, id)
    if (!before) throw notFound('No such shift.')
    requireSiteAccess(user, before.siteId)
    const { id: _id, ruleText: _text, ...stored } = before
    const shift = assertValid(ShiftSchema, { ...stored, ...patch })
    requireSiteAccess(user, shift.siteId)
    await requireWorksAt(trx, shift.providerId, shift.siteId)
    await lockProvider(trx, shift.providerId)
    await refuseCrossSiteClash(trx, shift, before.id)
    await impact.watch({ siteIds: [...new Set([before.siteId, shift.siteId])], providerId: before.providerId })
    await updateShift(trx, before.id, shift)
    await writeAudit(trx, { userId: user.id, action: 'shift_updated', entity: 'shift', entityId: before.id, before, after: shift })
    return (await findShift(trx, before.id))!
  })
}

export function deleteShift(user: SessionUser, id: number, dryRun = false): Promise<ImpactResult<void>> {
  return changeWithImpact({ userId: user.id, dryRun, cause: 'shift deleted' }, async (trx, impact) => {
    const shift = await findShift(trx, id)
    if (!shift) throw notFound('No such shift.')
    requireSiteAccess(user, shift.siteId)
    await impact.watch({ siteIds: [shift.siteId], providerId: shift.providerId })
    await removeShift(trx, id)
    await writeAudit(trx, { userId: user.id, action: 'shift_deleted', entity: 'shift', entityId: id, before: shift })
  })
}

/** A provider's time off and extra days are kept by the managers of a site they work at (403 otherwise). */
export function requireManages(user: SessionUser, provider: { name: string; siteIds: number[] }): void {
  if (!managesProvider(user, provider.siteIds)) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `${provider.name} works at none of your sites: their own sites' managers keep their time off.` })
  }
}

/** Time off for every site touches all of the provider's sites, so it needs access to each. */
export function createShiftException(user: SessionUser, exception: ShiftExceptionBody, dryRun = false): Promise<ImpactResult<ShiftExceptionDto>> {
  return changeWithImpact({ userId: user.id, dryRun, cause: exception.kind === 'time_off' ? 'time off' : 'extra day' }, (trx, impact) => addShiftException(trx, impact, user, exception))
}

/**
 * Time off or an extra day inside a change-impact transaction: checked, clash-refused, watched and
 * written with its audit row. Balance's rota move (rota-move-service.ts) writes two in one transaction.
 */
export async function addShiftException(trx: Db, impact: ImpactWatch, user: SessionUser, exception: ShiftExceptionBody): Promise<ShiftExceptionDto> {
  const provider = await requireProvider(trx, exception.providerId)
  requireManages(user, provider)
  if (exception.siteId !== null) {
    requireSiteAccess(user, exception.siteId)
    // Time off or an extra day only at a site the provider works at.
    await requireWorksAt(trx, exception.providerId, exception.siteId)
  } else {
    for (const siteId of provider.siteIds) requireSiteAccess(user, siteId)
  }
  if (exception.kind === 'extra' && exception.siteId !== null) {
    // An extra day is a shift too: never at two sites at once. Without hours it is taken as the whole
    // day, which refuses rather than risks a clash.
    await lockProvider(trx, exception.providerId)
    // Whole-day time off at another site over every date of the extra day frees the provider there
    // (Balance's rota move: a day off at a quiet site and an extra day at a tight one).
    const away = (await listShiftExceptions(trx, { providerId: exception.providerId, from: exception.startDate, to: exception.endDate }))
      .filter((off) => off.kind === 'time_off' && off.localStart === null && off.startDate <= exception.startDate && off.endDate >= exception.endDate)
    const awaySiteIds = away.some((off) => off.siteId === null) ? 'all' as const : new Set(away.map((off) => off.siteId!))
    await refuseCrossSiteClash(trx, {
      providerId: exception.providerId, siteId: exception.siteId, rrule: 'FREQ=DAILY',
      validFrom: exception.startDate, validUntil: exception.endDate,
      localStart: exception.localStart ?? '00:00', localEnd: exception.localEnd ?? '24:00', note: '',
    }, 0, awaySiteIds)
  }
  await impact.watch({ ...(exception.siteId === null ? {} : { siteIds: [exception.siteId] }), providerId: exception.providerId })
  const id = await insertShiftException(trx, exception)
  await writeAudit(trx, { userId: user.id, action: 'shift_exception_created', entity: 'shift_exception', entityId: id, after: exception })
  return (await findShiftException(trx, id))!
}

/** Time off for every site touches all of the provider's sites, so withdrawing it needs access to each. */
export function deleteShiftException(user: SessionUser, id: number, dryRun = false): Promise<ImpactResult<void>> {
  return changeWithImpact({ userId: user.id, dryRun, cause: 'time off or extra day withdrawn' }, async (trx, impact) => {
    const exception = await findShiftException(trx, id)
    if (!exception) throw notFound('No such exception.')
    const siteIds = exception.siteId !== null ? [exception.siteId] : (await findProvider(trx, exception.providerId))?.siteIds ?? []
    for (const siteId of siteIds) requireSiteAccess(user, siteId)
    await impact.watch({ siteIds, providerId: exception.providerId })
    await removeShiftException(trx, id)
    await writeAudit(trx, { userId: user.id, action: 'shift_exception_deleted', entity: 'shift_exception', entityId: id, before: exception })
  })
}

async function checkBlockReferences(db: Db, block: BlockBody): Promise<void> {
  await requireSite(db, block.siteId)
  if (block.operatoryId !== null) {
    const room = await findOperatory(db, block.operatoryId)
    if (!room || room.siteId !== block.siteId) throw badRequest('operatoryId', 'is not a room of this site')
  }
  if (block.providerId !== null) await requireProvider(db, block.providerId)
}

async function saveBlock(trx: Db, user: SessionUser, block: BlockBody, impact: ImpactWatch, before?: BlockDto): Promise<BlockDto> {
  requireSiteAccess(user, block.siteId)
  await checkBlockReferences(trx, block)
  await impact.watch({ siteIds: [block.siteId] })
  const id = before ? before.id : await insertBlock(trx, block)
  if (before) await updateBlock(trx, id, block)
  await writeAudit(trx, { userId: user.id, action: before ? 'block_updated' : 'block_created', entity: 'block', entityId: id, before, after: block })
  const saved = await findBlock(trx, id)
  if (!saved) throw notFound('No such block.')
  return saved
}

export function createBlock(user: SessionUser, block: BlockBody, dryRun = false): Promise<ImpactResult<BlockDto>> {
  return changeWithImpact({ userId: user.id, dryRun, cause: 'block' }, (trx, impact) => saveBlock(trx, user, block, impact))
}

/** The merged block is validated again. */
export function changeBlock(user: SessionUser, id: number, patch: BlockPatch, dryRun = false): Promise<ImpactResult<BlockDto>> {
  return changeWithImpact({ userId: user.id, dryRun, cause: 'block changed' }, async (trx, impact) => {
    const before = await findBlock(trx, id)
    if (!before) throw notFound('No such block.')
    requireSiteAccess(user, before.siteId)
    const { id: _id, ruleText: _text, ...stored } = before
    return saveBlock(trx, user, assertValid(BlockSchema, { ...stored, ...patch }), impact, before)
  })
}

export function deleteBlock(user: SessionUser, id: number, dryRun = false): Promise<ImpactResult<void>> {
  return changeWithImpact({ userId: user.id, dryRun, cause: 'block removed' }, async (trx, impact) => {
    const block = await findBlock(trx, id)
    if (!block) throw notFound('No such block.')
    requireSiteAccess(user, block.siteId)
    // Nothing can be stranded by freeing time, but flagged visits it frees leave the Rebook list.
    await impact.watch({ siteIds: [block.siteId] })
    await removeBlock(trx, id)
    await writeAudit(trx, { userId: user.id, action: 'block_deleted', entity: 'block', entityId: id, before: block })
  })
}
