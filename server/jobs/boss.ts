import PgBoss from 'pg-boss'
import type { Transporter } from 'nodemailer'
import type { Database } from '../db/client.js'
import type { Logger } from '../logger.js'
import { deliverMail, type MailDispatcher } from '../features/mail/mail.service.js'
import { findStaleQueuedMail } from '../features/mail/mail.repo.js'
import { processNestRun } from '../features/nesting/nesting.service.js'
import type { AppContext, JobSender } from '../context.js'
import { queueNames, type MailDeliverJob, type NestRunJob } from './queues.js'

const mailRetryLimit = 5

export async function startJobQueue(databaseUrl: string, logger: Logger): Promise<PgBoss> {
  const boss = new PgBoss({ connectionString: databaseUrl, schema: 'pgboss', max: 4 })
  boss.on('error', (error) => logger.error({ err: error }, 'job queue error'))
  await boss.start()
  await boss.createQueue(queueNames.mailDeliver, { name: queueNames.mailDeliver, retryLimit: mailRetryLimit, retryDelay: 5, retryBackoff: true })
  await boss.createQueue(queueNames.mailSweep, { name: queueNames.mailSweep, policy: 'singleton' })
  await boss.createQueue(queueNames.nestRun, { name: queueNames.nestRun, retryLimit: 2, retryDelay: 2 })
  return boss
}

export function createJobSender(boss: PgBoss): JobSender {
  return {
    // A run that outlives its budget by two minutes is taken as lost (its process died) and retried.
    sendNestRun: async (runId, timeBudgetSeconds) => {
      await boss.send(queueNames.nestRun, { runId } satisfies NestRunJob, { expireInSeconds: Math.ceil(timeBudgetSeconds) + 120 })
    },
  }
}

/** Nest runs: one at a time per process, since each run already uses every core through its threads. */
export async function workNestRuns(boss: PgBoss, context: AppContext) {
  await boss.work<NestRunJob>(queueNames.nestRun, { pollingIntervalSeconds: 0.5, batchSize: 1 }, async (jobs) => {
    for (const job of jobs) await processNestRun(context, job.data.runId)
  })
}

export function createQueuedMailDispatcher(boss: PgBoss): MailDispatcher {
  return {
    dispatch: async (mailId) => {
      await boss.send(queueNames.mailDeliver, { mailId } satisfies MailDeliverJob)
    },
  }
}

/** Registers the handlers this process works: mail delivery, and a sweep that re-sends mail whose job was lost. */
export async function workJobs(boss: PgBoss, deps: { db: Database; transport: Transporter; mailFrom: string; logger: Logger }) {
  await boss.work<MailDeliverJob>(queueNames.mailDeliver, { pollingIntervalSeconds: 0.5, includeMetadata: true }, async (jobs) => {
    for (const job of jobs) {
      await deliverMail(deps.db, deps.transport, deps.mailFrom, job.data.mailId, {
        finalAttempt: job.retryCount >= job.retryLimit,
        logger: deps.logger,
      })
    }
  })
  await boss.work(queueNames.mailSweep, async () => {
    const stale = await findStaleQueuedMail(deps.db, 300)
    for (const mail of stale) await boss.send(queueNames.mailDeliver, { mailId: mail.id }, { singletonKey: mail.id, singletonMinutes: 5 })
  })
  await boss.schedule(queueNames.mailSweep, '*/10 * * * *')
}
