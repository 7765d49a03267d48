// The element trees the templates build: the plain { type, props } objects satori lays out.
// Every box is a flex box (satori asks for it when a box has several children) with border-box
// sizing. No CSS borders: satori turns each into a clip path, which costs far more to draw than
// the same look from a padded box on a darker background.

export type CardStyle = Record<string, string | number>

export interface CardNode {
  type: 'div' | 'img'
  props: {
    style: CardStyle
    children?: (CardNode | string)[] | string
    src?: string
    width?: number
    height?: number
  }
}

export function box(style: CardStyle, ...children: (CardNode | string | null | false)[]): CardNode {
  return {
    type: 'div',
    props: {
      style: { display: 'flex', boxSizing: 'border-box', ...style },
      children: children.filter((c): c is CardNode | string => c !== null && c !== false),
    },
  }
}

/** A line or paragraph of text. */
export function text(style: CardStyle, content: string): CardNode {
  return { type: 'div', props: { style: { display: 'flex', boxSizing: 'border-box', ...style }, children: content } }
}

export function image(src: string, size: number, style: CardStyle = {}): CardNode {
  return { type: 'img', props: { src, width: size, height: size, style: { width: size, height: size, objectFit: 'contain', ...style } } }
}
