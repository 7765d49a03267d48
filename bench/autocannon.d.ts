// The part of autocannon's API the page benchmark uses (the package ships no types).
declare module 'autocannon' {
  interface Options { url: string, connections?: number, duration?: number, headers?: Record<string, string> }
  interface Histogram { average: number, p99: number }
  interface Result { requests: Histogram, latency: Histogram, non2xx: number, errors: number }
  function autocannon(options: Options): Promise<Result>
  export default autocannon
}
