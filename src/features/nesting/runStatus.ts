import type { NestRunStatus } from '../../../shared/schemas/index'

interface StatusLook {
  label: string
  /** Quasar colour name for the chip. */
  color: string
  icon: string
}

const looks: Record<NestRunStatus, StatusLook> = {
  queued: { label: 'Waiting', color: 'grey-7', icon: 'schedule' },
  running: { label: 'Searching', color: 'info', icon: 'autorenew' },
  succeeded: { label: 'Done', color: 'positive', icon: 'check_circle' },
  failed: { label: 'Failed', color: 'negative', icon: 'error_outline' },
  cancelled: { label: 'Stopped early', color: 'warning', icon: 'pan_tool' },
}

export function statusLook(status: NestRunStatus): StatusLook {
  return looks[status]
}
