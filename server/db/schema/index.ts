export * from './accounts.js'
export * from './mail.js'
export * from './designs.js'
export * from './nesting.js'
