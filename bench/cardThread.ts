// A worker thread of the benchmark: initialises the renderer once, then draws the cards it is sent.
import { parentPort } from 'node:worker_threads'
import { renderPng } from '../server/cards/render'
import { cardElement } from '../server/cards/templates'
import { CARD_SIZES } from '../shared/cards/types'
import type { CardInput } from '../shared/cards/types'

parentPort!.on('message', async (message: { id: number, input: CardInput } | 'warm') => {
  if (message === 'warm') {
    const { sampleInput } = await import('../tests/support/cards')
    const input = sampleInput('summary', 'square', 99)
    await renderPng(cardElement(input), 1080, 1080)
    parentPort!.postMessage({ id: -1, bytes: 0 })
    return
  }
  const { width, height } = CARD_SIZES[message.input.size]
  const png = await renderPng(cardElement(message.input), width, height)
  parentPort!.postMessage({ id: message.id, bytes: png.length })
})

parentPort!.postMessage('ready')
