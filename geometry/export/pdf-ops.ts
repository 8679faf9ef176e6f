// A small writer for PDF content-stream operators. The templates draw
// thousands of outline segments on many pages; writing the operators as text
// (numbers rounded to what a printer can show) keeps the file small and the
// writer fast, where one pdf-lib operator object per segment would not.

import type { PDFFont } from 'pdf-lib'
import type { Point } from '../types'

export type Rgb = readonly [number, number, number]

function hex(colour: string): Rgb {
  const v = Number.parseInt(colour.slice(1), 16)
  return [((v >> 16) & 255) / 255, ((v >> 8) & 255) / 255, (v & 255) / 255]
}

/** Rootplate's template palette (our own choice). */
export const COLOURS = {
  cut: hex('#0b5d3b'),
  hole: hex('#0b5d3b'),
  rabbet: hex('#b07219'),
  drill: hex('#a8322d'),
  reference: hex('#8a817c'),
  mount: hex('#44597a'),
  notch: hex('#c2571a'),
  router: hex('#3f8f63'),
  ink: hex('#262626'),
  muted: hex('#6f6a66'),
  guide: hex('#4d4d4d'),
  tint: hex('#eeece8'),
  paper: hex('#ffffff'),
  accent: hex('#0b5d3b'),
  warn: hex('#9b2c1f'),
  warnTint: hex('#fbeee9'),
} as const

export interface LineStyle {
  colour: Rgb
  /** Line width in the current user unit. */
  width: number
  /** Dash lengths in the current user unit; empty for solid. */
  dash?: number[]
}

/** Three decimals: a thousandth of a millimetre or of a point, far below what prints. */
export function num(v: number): string {
  const r = Math.round(v * 1000) / 1000
  return Object.is(r, -0) ? '0' : String(r)
}

const KAPPA = (4 / 3) * (Math.SQRT2 - 1)

export type TextAlign = 'left' | 'center' | 'right'

export interface TextOptions {
  align?: TextAlign
  /** Degrees counter-clockwise. */
  angle?: number
  colour?: Rgb
}

/** A text label kept aside instead of written, with its box in the drawing's units. */
export interface HeldLabel {
  text: string
  x: number
  y: number
  size: number
  options: TextOptions
  /** The four corners of the text's box (descender to cap height), counter-clockwise. */
  corners: [number, number][]
}

export class Ops {
  private readonly parts: string[] = []
  private held: HeldLabel[] | null = null

  constructor(
    private readonly font: PDFFont | null = null,
    private readonly fontName = 'F1',
  ) {}

  raw(op: string): this {
    this.parts.push(op)
    return this
  }

  save(): this {
    return this.raw('q')
  }

  restore(): this {
    return this.raw('Q')
  }

  transform(a: number, b: number, c: number, d: number, e: number, f: number): this {
    return this.raw(`${num(a)} ${num(b)} ${num(c)} ${num(d)} ${num(e)} ${num(f)} cm`)
  }

  /** Exact six-figure matrix, so a reader can recover the scale precisely. */
  transformExact(a: number, b: number, c: number, d: number, e: number, f: number): this {
    const x = (v: number) => String(Number(v.toFixed(6)))
    return this.raw(`${x(a)} ${x(b)} ${x(c)} ${x(d)} ${x(e)} ${x(f)} cm`)
  }

  style(s: LineStyle): this {
    const [r, g, b] = s.colour
    const dash = s.dash && s.dash.length > 0 ? `[${s.dash.map(num).join(' ')}] 0 d` : '[] 0 d'
    return this.raw(`${num(r)} ${num(g)} ${num(b)} RG ${num(s.width)} w ${dash}`)
  }

  fillColour(c: Rgb): this {
    return this.raw(`${num(c[0])} ${num(c[1])} ${num(c[2])} rg`)
  }

  moveTo(x: number, y: number): this {
    return this.raw(`${num(x)} ${num(y)} m`)
  }

  lineTo(x: number, y: number): this {
    return this.raw(`${num(x)} ${num(y)} l`)
  }

  line(x0: number, y0: number, x1: number, y1: number): this {
    return this.raw(`${num(x0)} ${num(y0)} m ${num(x1)} ${num(y1)} l`)
  }

  rect(x: number, y: number, w: number, h: number): this {
    return this.raw(`${num(x)} ${num(y)} ${num(w)} ${num(h)} re`)
  }

  polygon(points: Point[], closed = true): this {
    const first = points[0]
    if (!first) return this
    const out = [`${num(first[0])} ${num(first[1])} m`]
    for (let i = 1; i < points.length; i++) {
      const p = points[i]!
      out.push(`${num(p[0])} ${num(p[1])} l`)
    }
    if (closed) out.push('h')
    return this.raw(out.join('\n'))
  }

  circle(x: number, y: number, r: number): this {
    const k = KAPPA * r
    return this.raw(
      [
        `${num(x + r)} ${num(y)} m`,
        `${num(x + r)} ${num(y + k)} ${num(x + k)} ${num(y + r)} ${num(x)} ${num(y + r)} c`,
        `${num(x - k)} ${num(y + r)} ${num(x - r)} ${num(y + k)} ${num(x - r)} ${num(y)} c`,
        `${num(x - r)} ${num(y - k)} ${num(x - k)} ${num(y - r)} ${num(x)} ${num(y - r)} c`,
        `${num(x + k)} ${num(y - r)} ${num(x + r)} ${num(y - k)} ${num(x + r)} ${num(y)} c h`,
      ].join('\n'),
    )
  }

  /** Arc of a circle as cubic pieces of at most 90 degrees, from a0 to a1 (degrees, counter-clockwise). */
  arc(x: number, y: number, r: number, a0: number, a1: number): this {
    const pieces = Math.max(1, Math.ceil(Math.abs(a1 - a0) / 90))
    const step = ((a1 - a0) / pieces) * (Math.PI / 180)
    let t = a0 * (Math.PI / 180)
    const k = (4 / 3) * Math.tan(step / 4) * r
    const out = [`${num(x + r * Math.cos(t))} ${num(y + r * Math.sin(t))} m`]
    for (let i = 0; i < pieces; i++) {
      const t1 = t + step
      const [c0, s0, c1, s1] = [Math.cos(t), Math.sin(t), Math.cos(t1), Math.sin(t1)]
      out.push(
        `${num(x + r * c0 - k * s0)} ${num(y + r * s0 + k * c0)} ${num(x + r * c1 + k * s1)} ${num(y + r * s1 - k * c1)} ${num(x + r * c1)} ${num(y + r * s1)} c`,
      )
      t = t1
    }
    return this.raw(out.join('\n'))
  }

  /** A centre cross of arm length `arm`. */
  cross(x: number, y: number, arm: number): this {
    return this.line(x - arm, y, x + arm, y).line(x, y - arm, x, y + arm)
  }

  stroke(): this {
    return this.raw('S')
  }

  fill(): this {
    return this.raw('f')
  }

  fillStroke(): this {
    return this.raw('B')
  }

  /** Clip to the current path. */
  clip(): this {
    return this.raw('W n')
  }

  drawObject(name: string): this {
    return this.raw(`/${name} Do`)
  }

  textWidth(text: string, size: number): number {
    if (!this.font) throw new Error('No font given to this content stream.')
    return encode(this.font, sanitise(this.font, text), size).width
  }

  /**
   * From now on text() keeps each label in `into` instead of writing it, so
   * the tiled writer can put every label whole on a sheet (a label cut by a
   * sheet's edge reads as nonsense: "bbet 7-3/4 in").
   */
  holdLabels(into: HeldLabel[]): this {
    this.held = into
    return this
  }

  text(text: string, x: number, y: number, size: number, options: TextOptions = {}): this {
    if (!this.font) throw new Error('No font given to this content stream.')
    const safe = sanitise(this.font, text)
    if (safe === '') return this
    const { hex, width: w } = encode(this.font, safe, size)
    const shift = options.align === 'center' ? w / 2 : options.align === 'right' ? w : 0
    const a = ((options.angle ?? 0) * Math.PI) / 180
    const cos = Math.cos(a)
    const sin = Math.sin(a)
    const tx = x - shift * cos
    const ty = y - shift * sin
    if (this.held) {
      const box: [number, number][] = [[0, -0.25 * size], [w, -0.25 * size], [w, 0.8 * size], [0, 0.8 * size]]
      this.held.push({ text, x, y, size, options, corners: box.map(([u, v]) => [tx + u * cos - v * sin, ty + u * sin + v * cos]) })
      return this
    }
    const c = options.colour ?? COLOURS.ink
    return this.raw(
      `BT ${num(c[0])} ${num(c[1])} ${num(c[2])} rg /${this.fontName} ${num(size)} Tf ${num(cos)} ${num(sin)} ${num(-sin)} ${num(cos)} ${num(tx)} ${num(ty)} Tm ${hex} Tj ET`,
    )
  }

  toString(): string {
    return this.parts.join('\n')
  }
}

interface Glyph {
  /** Hex glyph code(s) in the embedded font's encoding, without the angle brackets. */
  hex: string
  /** Advance width at size 1. */
  width: number
}

interface FontCache {
  charset: Set<number>
  glyphs: Map<string, Glyph>
}

const fontCaches = new WeakMap<PDFFont, FontCache>()

/**
 * Text is encoded one character at a time, each character once per font:
 * fontkit's layout costs about a third of a millisecond a call, and a
 * template writes the same few dozen characters hundreds of times. Without
 * kerning or ligatures the advance widths add up exactly as the PDF viewer
 * will place the glyphs.
 */
function glyphsOf(font: PDFFont): FontCache {
  let cache = fontCaches.get(font)
  if (!cache) {
    cache = { charset: new Set(font.getCharacterSet()), glyphs: new Map() }
    fontCaches.set(font, cache)
  }
  return cache
}

function glyph(font: PDFFont, cache: FontCache, ch: string): Glyph {
  let g = cache.glyphs.get(ch)
  if (!g) {
    g = { hex: font.encodeText(ch).toString().slice(1, -1), width: font.widthOfTextAtSize(ch, 1) }
    cache.glyphs.set(ch, g)
  }
  return g
}

/** Characters the font lacks (a design named in another script) become '?', never a missing glyph box or a crash. */
export function sanitise(font: PDFFont, text: string): string {
  const { charset } = glyphsOf(font)
  let out = ''
  for (const ch of text.replace(/[\r\n\t]+/g, ' ')) {
    const cp = ch.codePointAt(0) ?? 63
    out += charset.has(cp) ? ch : '?'
  }
  return out
}

/** Hex string and width at `size` of already sanitised text. */
export function encode(font: PDFFont, text: string, size: number): { hex: string; width: number } {
  const cache = glyphsOf(font)
  let hex = ''
  let width = 0
  for (const ch of text) {
    const g = glyph(font, cache, ch)
    hex += g.hex
    width += g.width
  }
  return { hex: `<${hex}>`, width: width * size }
}
