import { request } from '../../api/client'
import { clientConfigSchema, type ClientConfig } from '../../../shared/schemas/index'

export function fetchClientConfig(): Promise<ClientConfig> {
  return request('/api/config', { schema: clientConfigSchema, withoutSession: true })
}
