import { request, segment } from '../../api/client'
import { pricingSettingsSchema, type PricingSettings, type PricingSettingsBody } from '../../../shared/schemas/pricing'

const pricingPath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}/pricing`

export function getPricing(workspaceId: string): Promise<PricingSettings> {
  return request(pricingPath(workspaceId), { schema: pricingSettingsSchema })
}

export function savePricing(workspaceId: string, body: PricingSettingsBody): Promise<PricingSettings> {
  return request(pricingPath(workspaceId), { method: 'PUT', body, schema: pricingSettingsSchema })
}
