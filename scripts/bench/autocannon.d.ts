// The part of autocannon 9's API the load benchmark uses (the package ships no types).
declare module 'autocannon' {
  export interface AutocannonRequest {
    method?: string
    path?: string
    body?: string
    setupRequest?: (req: Record<string, unknown>, context: Record<string, unknown>) => Record<string, unknown>
    onResponse?: (status: number, body: string, context: Record<string, unknown>) => void
  }
  export interface AutocannonOptions {
    url: string
    connections?: number
    duration?: number
    headers?: Record<string, string>
    requests?: AutocannonRequest[]
    histograms?: { latencies?: unknown }
  }
  export interface AutocannonResult {
    requests: { average: number }
    latency: Record<string, number>
    non2xx: number
    errors: number
    timeouts: number
    '2xx': number
  }
  export default function autocannon(options: AutocannonOptions): Promise<AutocannonResult>
}
