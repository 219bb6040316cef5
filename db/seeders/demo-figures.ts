import sharp from 'sharp';

/**
 * Plain drawn figures for the demo's photos: a dress form wearing wide-leg trousers, seen from the
 * front, the side or the back, with a caption naming the size and the view. No person is shown;
 * every figure is drawn from a few shapes, so the demo carries no real photograph.
 */
export type FigureView = 'front' | 'side' | 'back';

export type FigureSpec = {
  view: FigureView;
  sizeLabel: string;
  /** Position of the size in the range (0 = smallest): the figure widens with it. */
  sizeIndex: number;
  /** Trouser colour, a CSS hex colour. */
  colour: string;
  caption: string;
};

const WIDTH = 900;
const HEIGHT = 1200;

/** Escapes text for an SVG text node. */
function xml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** The drawing of one figure as SVG source. */
export function figureSvg(spec: FigureSpec): string {
  const cx = WIDTH / 2;
  // Half widths at waist and hip, growing with the size; the side view is narrower (body depth).
  const depth = spec.view === 'side' ? 0.72 : 1;
  const waist = (78 + spec.sizeIndex * 5) * depth;
  const hip = (112 + spec.sizeIndex * 6) * depth;
  const hem = (132 + spec.sizeIndex * 4) * depth;
  const waistY = 420;
  const hipY = 540;
  const crotchY = 640;
  const hemY = 1040;
  const shoulder = (130 + spec.sizeIndex * 4) * depth;
  const bust = (118 + spec.sizeIndex * 6) * depth;

  const form =
    `<rect x="${cx - 14}" y="90" width="28" height="60" fill="#8a8178"/>` +
    `<path d="M ${cx - 40} 150 Q ${cx} 138 ${cx + 40} 150 L ${cx + shoulder} 200 Q ${cx + bust + 6} 260 ${cx + bust} 320 ` +
    `Q ${cx + waist + 8} 380 ${cx + waist} ${waistY} L ${cx - waist} ${waistY} Q ${cx - waist - 8} 380 ${cx - bust} 320 ` +
    `Q ${cx - bust - 6} 260 ${cx - shoulder} 200 Z" fill="#e6ddd2" stroke="#8a8178" stroke-width="3"/>`;

  let trousers: string;
  let details: string;
  if (spec.view === 'side') {
    // One leg in profile: the front line falls straight, the back line follows the seat.
    trousers =
      `<path d="M ${cx - waist} ${waistY} L ${cx + waist} ${waistY} Q ${cx + hip + 10} ${hipY} ${cx + hip} ${crotchY} ` +
      `L ${cx + hem} ${hemY} L ${cx - hem} ${hemY} L ${cx - hip} ${crotchY} Q ${cx - hip} ${hipY} ${cx - waist} ${waistY} Z" ` +
      `fill="${spec.colour}" stroke="#3a342f" stroke-width="3"/>`;
    details =
      `<line x1="${cx}" y1="${waistY}" x2="${cx}" y2="${hemY}" stroke="#3a342f" stroke-width="2" stroke-dasharray="10 8"/>` +
      `<path d="M ${cx + 12} ${waistY + 40} q 30 60 22 120" fill="none" stroke="#3a342f" stroke-width="2"/>`;
  } else {
    const gap = 10;
    trousers =
      `<path d="M ${cx - waist} ${waistY} L ${cx + waist} ${waistY} Q ${cx + hip + 4} ${hipY} ${cx + hip} ${crotchY} ` +
      `L ${cx + hem} ${hemY} L ${cx + gap} ${hemY} L ${cx} ${crotchY} L ${cx - gap} ${hemY} L ${cx - hem} ${hemY} ` +
      `L ${cx - hip} ${crotchY} Q ${cx - hip - 4} ${hipY} ${cx - waist} ${waistY} Z" fill="${spec.colour}" stroke="#3a342f" stroke-width="3"/>`;
    details =
      spec.view === 'front'
        ? // Fly front and a pressed crease in each leg.
          `<path d="M ${cx + 6} ${waistY + 36} L ${cx + 30} ${waistY + 36} L ${cx + 30} ${waistY + 150} Q ${cx + 28} ${waistY + 180} ${cx + 4} ${waistY + 190}" fill="none" stroke="#3a342f" stroke-width="2"/>` +
          `<line x1="${cx - hip / 2}" y1="${hipY}" x2="${cx - hem / 2}" y2="${hemY}" stroke="#3a342f" stroke-width="1.5" stroke-dasharray="6 8"/>` +
          `<line x1="${cx + hip / 2}" y1="${hipY}" x2="${cx + hem / 2}" y2="${hemY}" stroke="#3a342f" stroke-width="1.5" stroke-dasharray="6 8"/>`
        : // Centre back seam and a dart each side.
          `<line x1="${cx}" y1="${waistY + 36}" x2="${cx}" y2="${crotchY}" stroke="#3a342f" stroke-width="2"/>` +
          `<line x1="${cx - waist / 2}" y1="${waistY + 36}" x2="${cx - waist / 2 + 4}" y2="${waistY + 110}" stroke="#3a342f" stroke-width="2"/>` +
          `<line x1="${cx + waist / 2}" y1="${waistY + 36}" x2="${cx + waist / 2 - 4}" y2="${waistY + 110}" stroke="#3a342f" stroke-width="2"/>`;
  }
  const band = `<rect x="${cx - waist - 2}" y="${waistY}" width="${2 * waist + 4}" height="36" fill="${spec.colour}" stroke="#3a342f" stroke-width="3"/>`;
  const stand =
    `<line x1="${cx}" y1="${hemY}" x2="${cx}" y2="1110" stroke="#8a8178" stroke-width="10"/>` +
    `<ellipse cx="${cx}" cy="1118" rx="120" ry="16" fill="#8a8178"/>`;
  const caption =
    `<text x="${cx}" y="58" text-anchor="middle" font-family="DejaVu Sans, Arial, sans-serif" font-size="34" fill="#3a342f">` +
    `${xml(`Size ${spec.sizeLabel} · ${spec.view}`)}</text>` +
    `<text x="${cx}" y="1172" text-anchor="middle" font-family="DejaVu Sans, Arial, sans-serif" font-size="24" fill="#6b635b">${xml(spec.caption)}</text>`;
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH}" height="${HEIGHT}" viewBox="0 0 ${WIDTH} ${HEIGHT}">` +
    `<rect width="100%" height="100%" fill="#f4f1ec"/>${form}${trousers}${band}${details}${stand}${caption}</svg>`
  );
}

/** The figure rendered as a JPEG, the kind of file a tester's phone would upload. */
export async function renderFigure(spec: FigureSpec): Promise<Buffer> {
  return sharp(Buffer.from(figureSvg(spec))).jpeg({ quality: 90 }).toBuffer();
}
