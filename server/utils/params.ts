import { z } from 'zod'
import { idParamSchema } from '#shared/schemas/club'

export const clubParams = z.object({ clubId: idParamSchema })
export const memberParams = z.object({ clubId: idParamSchema, userId: idParamSchema })
export const invitationParams = z.object({ clubId: idParamSchema, invitationId: idParamSchema })
