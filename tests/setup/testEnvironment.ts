// Defaults for the test server. `npm test` sets DATABASE_URL to its throw-away database; nothing here touches demo data.
export function applyTestEnvironment(environment: NodeJS.ProcessEnv = process.env) {
  if (!environment.DATABASE_URL || !/_test\b/.test(environment.DATABASE_URL)) {
    throw new Error('Tests need DATABASE_URL pointing at a throw-away *_test database. Run them with `npm test`.')
  }
  environment.NODE_ENV = 'test'
  environment.PORT ??= '5183'
  environment.MAIL_CATCHER_PORT ??= '2526'
  environment.APP_URL ??= `http://127.0.0.1:${environment.PORT}`
  // The API tests sign in many times from one address; the limiter itself is tested with its own small app.
  environment.AUTH_RATE_LIMIT ??= '100000'
  // A pathological upload is refused after this long; short here so the test of it stays quick.
  environment.IMPORT_TIMEOUT_MS ??= '4000'
  // Pay links go to the local fake payment provider on its own test port, never to a real account.
  environment.PAYMENTS_FAKE_PORT ??= '12112'
  delete environment.PAYMENTS_SECRET_KEY
  delete environment.PAYMENTS_API_URL
  environment.SMTP_URL = ''
  delete environment.SMTP_URL
}
