export * from './accounts.js'
export * from './mail.js'
