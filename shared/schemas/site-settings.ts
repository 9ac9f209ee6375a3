// PUT /api/sites/:id/settings: the whole set of a site's patient-mail and booking settings.
import { z } from 'zod'
import { LocalTimeSchema } from './local-time'
import { plainText } from './common'
import { CHANNELS } from '../domain/sms-channels'

const channelList = z.array(z.enum(CHANNELS, { error: `must be ${CHANNELS.join(' or ')}` })).max(CHANNELS.length, 'lists a channel twice')
  .refine((channels) => new Set(channels).size === channels.length, 'lists a channel twice')

const wholeMinutes = (max: number, what: string) => z.number({ error: 'must be a number' }).int('must be whole minutes').min(0, 'cannot be negative').max(max, `must be at most ${max} minutes (${what})`)

export const SiteSettingsSchema = z.object({
  minimumNoticeMinutes: wholeMinutes(10_080, 'a week'),
  reminderOffsetsHours: z.array(z.number({ error: 'must be a number of hours' }).int('must be whole hours').min(1, 'must be at least 1 hour before').max(336, 'must be at most 336 hours (two weeks) before'))
    .max(4, 'can hold at most 4 reminders')
    .refine((hours) => new Set(hours).size === hours.length, 'lists the same hour twice'),
  quietHours: z.object({ start: LocalTimeSchema, end: LocalTimeSchema })
    .refine((quiet) => quiet.start !== quiet.end, { path: ['end'], message: 'must differ from the start' })
    .nullable(),
  includeProcedureNames: z.boolean({ error: 'must be true or false' }),
  patientCancel: z.enum(['request', 'cancel'], { error: "must be 'request' or 'cancel'" }),
  whatToBring: plainText(z.string({ error: 'is required' }).trim().min(1, 'is required').max(300, 'must be at most 300 characters')),
  alarmMinutes: wholeMinutes(1_440, 'a day').min(5, 'must be at least 5 minutes'),
  /** Left out: the stored choice stays. Offers left out (an older form): their default, e-mail and text. */
  messageChannels: z.object({ invitation: channelList, update: channelList, cancellation: channelList, reminder: channelList, offer: channelList.optional(), move_offer: channelList.optional() }).optional(),
})
export type SiteSettingsBody = z.infer<typeof SiteSettingsSchema>
