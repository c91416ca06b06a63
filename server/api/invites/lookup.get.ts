import { z } from 'zod'

const query = z.object({ token: z.string().min(10, 'the invitation link is incomplete') })

// Public: the join page shows whom the invitation is for before the person picks a password.
export default defineEventHandler((event) => {
  const { token } = readQueryWith(event, query)
  const { invite, workshopName } = findOpenInvite(token)
  return { email: invite.email, role: invite.role, workshopName }
})
