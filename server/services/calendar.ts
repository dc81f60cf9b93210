import { shelvesWords } from '../../shared/firing/check'
import ical, { ICalCalendarMethod } from 'ical-generator'
import { formatCone } from '../../shared/firing/cones'
import type { AppContext } from '../context'
import { Kiln } from '../entities/Kiln'
import type { Studio } from '../entities/Studio'
import { firingsJson, listStudioFirings } from './firings'
import { FIRING_STATUS_LABELS } from '../../shared/workflow/firing-status'

/**
 * The studio's upcoming firings as an iCalendar feed potters can subscribe to: each firing, and the
 * drop-off deadline before it, in the studio's zone.
 */
export async function studioCalendar(ctx: AppContext, studio: Studio): Promise<string> {
  const firings = await listStudioFirings(ctx.db.manager, studio.id, { from: new Date(Date.now() - 7 * 24 * 3600_000) })
  const kilns = new Map((await ctx.db.getRepository(Kiln).find({ where: { studioId: studio.id } })).map((k) => [k.id, k]))
  const withSpace = await firingsJson(ctx.db.manager, firings, studio.id)
  const calendar = ical({
    name: `${studio.name} firings`,
    description: `Upcoming kiln firings at ${studio.name}, from Conewright`,
    timezone: studio.timezone,
    method: ICalCalendarMethod.PUBLISH,
    prodId: { company: 'Conewright', product: 'firing-calendar', language: 'EN' },
    ttl: 3600,
  })
  const host = new URL(ctx.config.publicUrl).host
  for (const firing of withSpace) {
    const kiln = kilns.get(firing.kilnId)!
    const title = `${formatCone(firing.cone)} ${firing.atmosphere} ${firing.kind} firing — ${kiln.name}`
    const url = `${ctx.config.publicUrl}/studios/${studio.id}`
    calendar.createEvent({
      id: `firing-${firing.id}@${host}`,
      start: new Date(firing.firingDate),
      end: new Date(firing.readyBy),
      summary: title,
      description: `${firing.status === 'open' ? `${shelvesWords(firing.space.shelvesLeft)} of space left.` : `${FIRING_STATUS_LABELS[firing.status]}.`} Drop off by ${new Date(firing.dropOffBy).toISOString()}.`,
      location: [studio.city, studio.region].filter(Boolean).join(', '),
      url,
      timezone: studio.timezone,
    })
    calendar.createEvent({
      id: `dropoff-${firing.id}@${host}`,
      start: new Date(firing.dropOffBy),
      end: new Date(new Date(firing.dropOffBy).getTime() + 30 * 60_000),
      summary: `Drop-off closes: ${title}`,
      url,
      timezone: studio.timezone,
    })
  }
  return calendar.toString()
}
