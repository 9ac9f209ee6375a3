// The Balance computations as first written (issue 14 / 17): plain filters over every segment or
// visit for each chair, provider and day. Kept as the reference the linear versions in
// shared/domain/balance.ts and balance-refill.ts must agree with (tests/unit/shared/domain/balance.properties.test.ts,
// balance-refill.properties.test.ts).
import type { EpochInterval } from '../../shared/types/rota'
import { bandOf, type BalanceInput, type BalanceThresholds, type SiteBalance, type UseFigures, DEFAULT_BALANCE_THRESHOLDS } from '../../shared/domain/balance'
import { median, type FreedVisit, type LaterVisit, type RefillFigures } from '../../shared/domain/balance-refill'
import { clipIntervals, intersectIntervals, mergeIntervals, subtractIntervals, totalDurationMs } from '../../shared/domain/intervals'

function figures(availableMs: number, usedMs: number, thresholds: BalanceThresholds): UseFigures {
  const share = availableMs > 0 ? usedMs / availableMs : null
  return { availableMinutes: Math.round(availableMs / 60_000), usedMinutes: Math.round(usedMs / 60_000), share, band: bandOf(share, thresholds) }
}

function usedWithin(available: readonly EpochInterval[], used: EpochInterval[]): number {
  return totalDurationMs(intersectIntervals(available, mergeIntervals(used)))
}

export function siteBalanceReference(input: BalanceInput, thresholds: BalanceThresholds = DEFAULT_BALANCE_THRESHOLDS): SiteBalance {
  const range = { startMs: input.fromMs, endMs: input.toMs }
  const shiftTime = mergeIntervals(input.providers.flatMap((provider) => provider.intervals))
  const unstaffed = (input.days ?? []).filter((day) => clipIntervals(shiftTime, day.startMs, day.endMs).length === 0)
  const unstaffedSpans = unstaffed.map((day) => ({ startMs: day.startMs, endMs: day.endMs }))
  const clip = (intervals: readonly EpochInterval[]) => clipIntervals(mergeIntervals(intervals), range.startMs, range.endMs)
  const openTime = (intervals: readonly EpochInterval[]) => subtractIntervals(clip(intervals), unstaffedSpans)
  let chairsAvailable = 0
  let chairsUsed = 0
  const operatories = input.operatories.map(({ operatoryId, intervals }) => {
    const open = openTime(intervals)
    const held = input.segments.filter((segment) => segment.operatoryId === operatoryId)
    const availableMs = totalDurationMs(open)
    const usedMs = usedWithin(open, held)
    chairsAvailable += availableMs
    chairsUsed += usedMs
    return { operatoryId, ...figures(availableMs, usedMs, thresholds) }
  })
  const providers = input.providers.map(({ providerId, intervals }) => {
    const onShift = clip(intervals)
    const working = input.segments.filter((segment) => segment.providerId === providerId && segment.kind === 'hands_on')
    return { providerId, ...figures(totalDurationMs(onShift), usedWithin(onShift, working), thresholds) }
  })
  const days = (input.days ?? []).map((day) => {
    let availableMs = 0
    let usedMs = 0
    for (const { operatoryId, intervals } of input.operatories) {
      const open = clipIntervals(mergeIntervals(intervals), Math.max(day.startMs, range.startMs), Math.min(day.endMs, range.endMs))
      availableMs += totalDurationMs(open)
      usedMs += usedWithin(open, input.segments.filter((segment) => segment.operatoryId === operatoryId))
    }
    const nobodyOnShift = unstaffed.includes(day)
    return nobodyOnShift
      ? { date: day.date, ...figures(0, 0, thresholds), nobodyOnShift }
      : { date: day.date, ...figures(availableMs, usedMs, thresholds), nobodyOnShift }
  })
  return { operatories, providers, chairs: figures(chairsAvailable, chairsUsed, thresholds), days }
}

export function refillFiguresReference(freed: readonly FreedVisit[], later: readonly LaterVisit[]): RefillFigures {
  let freedMs = 0
  let refilledMs = 0
  let freedVisits = 0
  let refilledVisits = 0
  const delays: number[] = []
  for (const visit of freed) {
    const span: EpochInterval = { startMs: Math.max(visit.startMs, visit.freedAtMs), endMs: visit.endMs }
    if (span.endMs <= span.startMs) continue
    freedVisits += 1
    freedMs += span.endMs - span.startMs
    const refills = later.filter((other) => other.visitId !== visit.visitId && other.operatoryId === visit.operatoryId
      && other.createdAtMs > visit.freedAtMs && other.startMs < span.endMs && other.endMs > span.startMs)
    if (!refills.length) continue
    refilledVisits += 1
    refilledMs += totalDurationMs(clipIntervals(mergeIntervals(refills), span.startMs, span.endMs))
    delays.push((Math.min(...refills.map((other) => other.createdAtMs)) - visit.freedAtMs) / 3_600_000)
  }
  return {
    freedVisits, freedMinutes: Math.round(freedMs / 60_000), refilledVisits, refilledMinutes: Math.round(refilledMs / 60_000),
    refilledShare: freedMs > 0 ? refilledMs / freedMs : null, medianHoursToRefill: median(delays),
  }
}
