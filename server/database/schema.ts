// The whole schema, one file per domain; drizzle-kit and the db helper read it from here.
export * from './accounts'
export * from './tournaments'
export * from './matches'
export * from './live'
export * from './cards'
export * from './footage'
export * from './publishing'
