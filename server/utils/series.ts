import { z } from 'zod'
import { CHANNEL_IDS, channelData, downsample, MAX_POINTS, type ChannelId } from '../analysis'

// Asked for by the chart, not typed by a person: the words say what the chart got wrong, in the
// chart's terms (sensors, seconds of the log), never the query's own keys.
const KNOWN = new Set<string>(CHANNEL_IDS)
const SECONDS = 'the chart\'s time range is in seconds from the start of the log, 0 or more'
const POINTS = `the chart draws 10 to ${MAX_POINTS} points`
export const seriesQuery = z.object({
  channels: z.string().max(400).default('chargeTemp,ambientTemp,preCoolerTemp').transform(text => text.split(',').map(s => s.trim()).filter(Boolean))
    .refine(list => list.every(channel => KNOWN.has(channel)), 'the chart asked for sensors Densitas does not know')
    .refine(list => list.length >= 1 && list.length <= 12, 'the chart asks for 1 to 12 sensors at a time')
    .transform(list => list as ChannelId[]),
  from: z.coerce.number({ message: SECONDS }).min(0, SECONDS).optional(),
  to: z.coerce.number({ message: SECONDS }).min(0, SECONDS).optional(),
  points: z.coerce.number({ message: POINTS }).int(POINTS).min(10, POINTS).max(MAX_POINTS, POINTS).default(2000),
}).refine(q => q.from === undefined || q.to === undefined || q.to > q.from, { message: 'the end of the chart\'s time range must be after its start' })

export async function seriesFor(log: typeof tables.logs.$inferSelect, query: z.infer<typeof seriesQuery>) {
  const imported = await loadImported(log)
  const present = query.channels.filter(channel => channel !== 'time' && channelData(imported.channels, channel))
  return downsample(imported.channels, present, { fromS: query.from, toS: query.to, points: query.points })
}
