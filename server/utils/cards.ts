import { createHash } from 'node:crypto'
import { HeadObjectCommand } from '@aws-sdk/client-s3'
import type { H3Event } from 'h3'
import { defaultCaption, defaultHeadline } from '#shared/cards/text'
import { CARD_SIZES } from '#shared/cards/types'
import type { CardBrand, CardData, CardInput, CardSize } from '#shared/cards/types'
import { sniffImageType } from '#shared/utils/images'
import { renderPng } from '../cards/render'
import { cardElement } from '../cards/templates'

// Cards in object storage: each is stored under the hash of what it is drawn from (the element
// tree the template made from its data, words and brand, and the renderer's version), so a card
// whose data has not changed is found in the store and never drawn twice.

type Club = typeof schema.clubs.$inferSelect

// Part of every card's hash: a new renderer or encoder must not serve pictures the old one drew.
const RENDERER = 'satori 0.63.2; resvg-wasm 2.6.2; png rgb8 zlib-1'

// Logos are stored under a random key that changes with every upload, so a key always names the
// same picture and can be kept in memory.
const LOGO_MEMORY = 64
const logos = new Map<string, Promise<string | null>>()

async function logoDataUrl(key: string): Promise<string | null> {
  const object = await getObject(key).catch(() => null)
  const bytes = object?.Body ? await object.Body.transformToByteArray() : null
  const type = bytes ? sniffImageType(bytes) : null
  return bytes && type ? `data:${type};base64,${Buffer.from(bytes).toString('base64')}` : null
}

/** The club's look on its cards. A logo that cannot be read is left out rather than failing the card. */
export async function cardBrand(club: Pick<Club, 'name' | 'primaryColor' | 'secondaryColor' | 'logoKey'>): Promise<CardBrand> {
  let logo: string | null = null
  if (club.logoKey) {
    let known = logos.get(club.logoKey)
    if (!known) {
      if (logos.size >= LOGO_MEMORY) logos.delete(logos.keys().next().value!)
      known = logoDataUrl(club.logoKey)
      logos.set(club.logoKey, known)
      const key = club.logoKey
      // A failed read is tried again next time.
      known.then(found => found ?? logos.delete(key), () => logos.delete(key))
    }
    logo = await known
  }
  return { clubName: club.name, primary: club.primaryColor, secondary: club.secondaryColor, logo }
}

export interface CardWords {
  headline?: string
  caption?: string
}

/** A card's full input: the data with its brand, in a size, with the editor's words or the defaults. */
export function cardInput(data: CardData, size: CardSize, brand: CardBrand, words: CardWords = {}): CardInput {
  return {
    data,
    size,
    brand,
    headline: words.headline?.trim() || defaultHeadline(data),
    caption: words.caption?.trim() ?? defaultCaption(data),
  }
}

export interface StoredCard {
  hash: string
  key: string
  width: number
  height: number
  /** Found in the store: nothing was drawn. */
  cached: boolean
  png: Uint8Array | null
}

export const cardKey = (clubId: number, hash: string) => `cards/${clubId}/${hash}.png`

async function exists(key: string): Promise<boolean> {
  const { client, bucket } = useS3()
  try {
    await client.send(new HeadObjectCommand({ Bucket: bucket, Key: key }))
    return true
  }
  catch (err) {
    const status = (err as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode
    if (status === 404) return false
    throw err
  }
}

/**
 * The card in the store, drawn and stored first if it is not there. `keepPng` also answers the
 * PNG's bytes (read back from the store when the card was there already).
 */
export async function produceCard(clubId: number, input: CardInput, options: { keepPng?: boolean } = {}): Promise<StoredCard> {
  const { width, height } = CARD_SIZES[input.size]
  const element = cardElement(input)
  const hash = createHash('sha256').update(`${RENDERER}\n${width}x${height}\n`).update(JSON.stringify(element)).digest('hex')
  const key = cardKey(clubId, hash)
  if (await exists(key)) {
    const png = options.keepPng ? await readStored(key) : null
    if (!options.keepPng || png) return { hash, key, width, height, cached: true, png }
  }
  const png = await renderPng(element, width, height)
  await putObject(key, png, 'image/png')
  return { hash, key, width, height, cached: false, png: options.keepPng ? png : null }
}

async function readStored(key: string): Promise<Uint8Array | null> {
  const object = await getObject(key).catch(() => null)
  return object?.Body ? object.Body.transformToByteArray() : null
}

/** Sends a stored card or ZIP, or 404. */
export async function sendStored(event: H3Event, key: string, headers: Record<string, string>) {
  const object = await getObject(key).catch(() => null)
  if (!object?.Body) throw notFoundError('File')
  setResponseHeaders(event, { 'x-content-type-options': 'nosniff', ...headers })
  return Buffer.from(await object.Body.transformToByteArray())
}
