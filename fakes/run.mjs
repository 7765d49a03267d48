// All fakes in one process: `node fakes/run.mjs [s3] [mail]` (both by default).
import { stopOnSignals } from '../scripts/lib/lifeline.mjs'
import { startFakeMail } from './mail.mjs'
import { startFakeS3 } from './s3.mjs'

const FAKES = { s3: startFakeS3, mail: startFakeMail }

const wanted = process.argv.slice(2)
const names = wanted.length ? wanted : Object.keys(FAKES)
const unknown = names.filter(name => !(name in FAKES))
if (unknown.length) {
  console.error(`unknown fake: ${unknown.join(', ')} (known: ${Object.keys(FAKES).join(', ')})`)
  process.exit(2)
}

const running = []
const closeAll = () => Promise.all(running.map(fake => fake.close()))
try {
  for (const name of names) running.push(await FAKES[name]())
}
catch (error) {
  console.error(error.message)
  await closeAll()
  process.exit(1)
}
stopOnSignals(closeAll)
