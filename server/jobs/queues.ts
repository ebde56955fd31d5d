/** Names of the pg-boss queues. Later work (nest runs, comparisons) adds its own here. */
export const queueNames = {
  mailDeliver: 'mail-deliver',
  mailSweep: 'mail-sweep',
  nestRun: 'nest-run',
} as const

export interface NestRunJob {
  runId: string
}

export interface MailDeliverJob {
  mailId: string
}
