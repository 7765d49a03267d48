import { spawn } from 'node:child_process'

// ffprobe and ffmpeg (Debian's 5.1, installed by the two commands) as child processes. They read
// recordings through short-lived presigned addresses, so no recording is ever copied to disk.
// An uploaded file is untrusted: a playlist or concat file could point ffmpeg at other addresses
// or local files, so only the demuxers of real video containers and plain HTTP(S) are allowed.
const INPUT_LIMITS = [
  '-protocol_whitelist', 'http,https,tcp,tls,file',
  '-format_whitelist', 'mov,mp4,m4a,3gp,3g2,mj2,matroska,webm,avi,mpegts,mpeg,flv,asf',
]

export class FfmpegError extends Error {}

function run(command: string, args: string[], options: { timeoutMs: number, onLine?: (line: string) => void }): Promise<string> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { stdio: ['ignore', 'pipe', 'pipe'] })
    let out = ''
    let err = ''
    let pending = ''
    child.stdout.setEncoding('utf8').on('data', (chunk: string) => {
      if (!options.onLine) {
        out += chunk
        return
      }
      pending += chunk
      const lines = pending.split('\n')
      pending = lines.pop() ?? ''
      for (const line of lines) options.onLine(line.trim())
    })
    child.stderr.setEncoding('utf8').on('data', (chunk: string) => {
      err = (err + chunk).slice(-4000)
    })
    const timer = setTimeout(() => child.kill('SIGKILL'), options.timeoutMs)
    child.on('error', (e) => {
      clearTimeout(timer)
      reject(new FfmpegError(`${command} could not start: ${e.message}`))
    })
    child.on('close', (code, signal) => {
      clearTimeout(timer)
      if (code === 0) resolve(out)
      else reject(new FfmpegError(`${command} ${signal ? `was stopped (${signal})` : `exited with ${code}`}: ${err.trim().split('\n').slice(-3).join(' ')}`))
    })
  })
}

export interface ProbeResult {
  durationMs: number | null
  frameRate: number | null
  width: number | null
  height: number | null
  creationTime: Date | null
  hasVideo: boolean
}

interface ProbeJson {
  format?: { duration?: string, tags?: Record<string, string> }
  streams?: { codec_type?: string, width?: number, height?: number, avg_frame_rate?: string, r_frame_rate?: string, duration?: string, tags?: Record<string, string> }[]
}

const rate = (text: string | undefined) => {
  const [n, d] = (text ?? '').split('/').map(Number)
  return n && d ? n / d : null
}

/** Reads duration, frame rate, size and the creation_time tag (ffprobe's JSON writer). */
export async function ffprobe(input: string): Promise<ProbeResult> {
  const text = await run('ffprobe', ['-v', 'error', ...INPUT_LIMITS, '-print_format', 'json', '-show_format', '-show_streams', input], { timeoutMs: 60_000 })
  const json = JSON.parse(text) as ProbeJson
  const video = json.streams?.find(s => s.codec_type === 'video')
  const duration = Number(json.format?.duration ?? video?.duration)
  const created = json.format?.tags?.creation_time ?? video?.tags?.creation_time
  const createdAt = created ? new Date(created) : null
  return {
    durationMs: Number.isFinite(duration) && duration > 0 ? Math.round(duration * 1000) : null,
    frameRate: rate(video?.avg_frame_rate) ?? rate(video?.r_frame_rate),
    width: video?.width ?? null,
    height: video?.height ?? null,
    creationTime: createdAt && !Number.isNaN(createdAt.getTime()) ? createdAt : null,
    hasVideo: video !== undefined,
  }
}

/** The last video keyframe at or before `atMs`, in milliseconds, or null if none was found. */
export async function keyframeBefore(input: string, atMs: number): Promise<number | null> {
  const from = Math.max(0, atMs / 1000 - 20)
  // Packets only: the keyframe flag is in the container, nothing is decoded.
  const text = await run('ffprobe', ['-v', 'error', ...INPUT_LIMITS, '-select_streams', 'v:0', '-read_intervals', `${from.toFixed(3)}%${(atMs / 1000 + 0.001).toFixed(3)}`,
    '-show_entries', 'packet=pts_time,flags', '-print_format', 'json', input], { timeoutMs: 60_000 })
  const packets = (JSON.parse(text) as { packets?: { pts_time?: string, flags?: string }[] }).packets ?? []
  let best: number | null = null
  for (const p of packets) {
    const t = Math.round(Number(p.pts_time) * 1000)
    if (p.flags?.includes('K') && Number.isFinite(t) && t <= atMs && (best === null || t > best)) best = t
  }
  return best
}

/** Runs ffmpeg with `-progress`, reporting how far the output has got in milliseconds. */
export async function ffmpeg(args: string[], options: { onProgressMs?: (ms: number) => void, timeoutMs: number }) {
  await run('ffmpeg', ['-v', 'error', '-nostdin', '-y', '-progress', 'pipe:1', '-nostats', ...args.flatMap(a => (a === '-i' ? [...INPUT_LIMITS, a] : [a]))], {
    timeoutMs: options.timeoutMs,
    onLine: (line) => {
      const [key, value] = line.split('=')
      // out_time_us: microseconds of output written so far (ffmpeg's -progress).
      if (key === 'out_time_us' && value && /^\d+$/.test(value)) options.onProgressMs?.(Number(value) / 1000)
    },
  })
}
