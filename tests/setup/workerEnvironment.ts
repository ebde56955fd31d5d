import { applyTestEnvironment } from './testEnvironment.js'

// Test files read the same configuration as the server started by the global setup.
applyTestEnvironment()
