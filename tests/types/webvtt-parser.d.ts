// The parts of the W3C validator's parser (webvtt-parser, untyped) that the tests read.
declare module 'webvtt-parser' {
  export interface WebVTTNode { type: string, name?: string, value?: string, children?: WebVTTNode[] }
  export interface WebVTTCue {
    id: string
    startTime: number
    endTime: number
    text: string
    tree: { children: WebVTTNode[] }
  }
  export interface WebVTTError { message: string, line: number, col: number }
  export class WebVTTParser {
    constructor(entities?: Record<string, string>)
    parse(input: string, mode?: 'metadata' | 'chapters'): { cues: WebVTTCue[], errors: WebVTTError[], time: number, styles: unknown[] }
  }
}
