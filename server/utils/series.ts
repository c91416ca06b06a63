import { z } from 'zod'
import { CHANNEL_IDS, channelData, downsample, MAX_POINTS, type ChannelId } from '../analysis'

export const seriesQuery = z.object({
  channels: z.string().default('chargeTemp,ambientTemp,preCoolerTemp').transform(text => text.split(',').map(s => s.trim()).filter(Boolean))
    .pipe(z.array(z.enum(CHANNEL_IDS as unknown as [ChannelId, ...ChannelId[]], { message: `channels are a comma-separated list of ${CHANNEL_IDS.join(', ')}` })).min(1).max(12)),
  from: z.coerce.number().min(0).optional(),
  to: z.coerce.number().min(0).optional(),
  points: z.coerce.number().int().min(10, 'points is at least 10').max(MAX_POINTS, `points is at most ${MAX_POINTS}`).default(2000),
}).refine(q => q.from === undefined || q.to === undefined || q.to > q.from, { message: 'to must be after from', path: ['to'] })

export async function seriesFor(log: typeof tables.logs.$inferSelect, query: z.infer<typeof seriesQuery>) {
  const imported = await loadImported(log)
  const present = query.channels.filter(channel => channel !== 'time' && channelData(imported.channels, channel))
  return downsample(imported.channels, present, { fromS: query.from, toS: query.to, points: query.points })
}
