// Test footage and checks of cut clips, made with Debian's ffmpeg/ffprobe 5.1 apart from the app.
// The footage is generated (lavfi testsrc2 picture and a sine tone): nothing real is filmed.
import { execFile } from 'node:child_process'
import { mkdtemp, readFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { promisify } from 'node:util'

const run = promisify(execFile)

export const FOOTAGE = { seconds: 12, width: 640, height: 360, fps: 25, keyframeEvery: 50 } as const
/** A keyframe every 50 frames at 25 fps. */
export const KEYFRAME_MS = (FOOTAGE.keyframeEvery / FOOTAGE.fps) * 1000
export const FRAME_MS = 1000 / FOOTAGE.fps

/**
 * H.264/AAC test footage, 12 s of 640×360 at 25 fps with a keyframe every 2 s. A constant bit rate
 * of 10 Mbit/s (padded) makes it about 15 MB, so that it travels in three 5 MiB parts.
 */
export async function makeFootage(options: { creationTime?: Date, seconds?: number } = {}): Promise<string> {
  const dir = await mkdtemp(path.join(tmpdir(), 'unscathed-footage-'))
  const file = path.join(dir, 'ring-1.mp4')
  const seconds = options.seconds ?? FOOTAGE.seconds
  await run('ffmpeg', [
    '-v', 'error', '-y',
    '-f', 'lavfi', '-i', `testsrc2=size=${FOOTAGE.width}x${FOOTAGE.height}:rate=${FOOTAGE.fps}`,
    '-f', 'lavfi', '-i', 'sine=frequency=440:sample_rate=48000',
    '-t', String(seconds),
    '-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p',
    '-g', String(FOOTAGE.keyframeEvery), '-keyint_min', String(FOOTAGE.keyframeEvery), '-sc_threshold', '0',
    '-b:v', '10M', '-minrate', '10M', '-maxrate', '10M', '-bufsize', '2M', '-x264-params', 'nal-hrd=cbr',
    '-c:a', 'aac', '-b:a', '128k',
    ...(options.creationTime ? ['-metadata', `creation_time=${options.creationTime.toISOString()}`] : []),
    file,
  ])
  return file
}

export async function probeJson(input: string) {
  const { stdout } = await run('ffprobe', ['-v', 'error', '-print_format', 'json', '-show_format', '-show_streams', input])
  return JSON.parse(stdout) as { format: { duration: string }, streams: { codec_type: string, duration?: string, codec_name: string }[] }
}

const THUMB = ['-vf', 'scale=64:36,format=gray', '-f', 'rawvideo']
const THUMB_BYTES = 64 * 36

async function frames(args: string[]): Promise<Buffer> {
  const { stdout } = await run('ffmpeg', ['-v', 'error', ...args, ...THUMB, 'pipe:1'], { encoding: 'buffer', maxBuffer: 64 * 1024 * 1024 })
  return stdout
}

/**
 * Where in the recording a clip's first picture comes from: its first frame compared, as a small
 * grey thumbnail, with every frame of the recording from `fromMs` for `spanMs`; the closest wins.
 * testsrc2's picture moves every frame, so only the right frame matches closely.
 */
export async function clipStartInRecording(recording: string, clip: string, fromMs: number, spanMs: number): Promise<number> {
  const first = await frames(['-i', clip, '-frames:v', '1'])
  const start = Math.max(0, fromMs)
  const all = await frames(['-ss', (start / 1000).toFixed(3), '-i', recording, '-t', (spanMs / 1000).toFixed(3)])
  let best = { index: -1, diff: Infinity }
  for (let i = 0; (i + 1) * THUMB_BYTES <= all.length; i++) {
    let diff = 0
    for (let j = 0; j < THUMB_BYTES; j++) diff += Math.abs(all[i * THUMB_BYTES + j]! - first[j]!)
    if (diff < best.diff) best = { index: i, diff }
  }
  if (best.index < 0) throw new Error('no frame of the recording to compare with')
  return start + best.index * FRAME_MS
}

export const readFileBytes = (file: string) => readFile(file)
