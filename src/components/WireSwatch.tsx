import { parseWireColour, wireColourInfo, wireColourLabel, formatWireColour } from '@shared/standards/iec60757';
import { cx } from '@/lib/cx';

interface SwatchPaint {
  base: string;
  stripe?: string;
  code: string;
  /** Spoken name, e.g. "red with white stripe". */
  name?: string;
}

/** The display colours of an IEC 60757 code such as `RD`, `RD/WH` or `GNYE`; null when it is not a colour. */
export function swatchPaint(text: string): SwatchPaint | null {
  const colour = parseWireColour(text);
  if (!colour) return null;
  const base = wireColourInfo(colour.base);
  const stripe = colour.stripe ? wireColourInfo(colour.stripe) : null;
  if (!base) return null;
  return {
    base: base.hex,
    // GNYE is one code with two colours: its second colour is drawn as the stripe.
    stripe: stripe?.hex ?? base.secondHex,
    code: formatWireColour(colour),
    name: wireColourLabel(text) ?? undefined,
  };
}

type WireSwatchProps = ({ colour: string } | { base: string; stripe?: string; code: string; name?: string }) & {
  size?: 'sm' | 'md';
  /** Hide the letter code (only where it is printed right beside already). */
  hideCode?: boolean;
  className?: string;
};

/**
 * A wire colour swatch with its IEC 60757 letter code beside it; a second
 * colour is drawn as a diagonal stripe. Either pass the code text
 * (`colour="RD/WH"`) or the paint directly (`base`, `stripe`, `code`).
 * Text that is not a colour shows the text with a hatched "unknown" swatch.
 */
export function WireSwatch(props: WireSwatchProps) {
  const { size = 'md', hideCode = false, className } = props;
  const paint: SwatchPaint | null = 'colour' in props ? swatchPaint(props.colour) : props;
  const code = paint?.code ?? ('colour' in props ? props.colour : '');
  const label = paint ? (paint.name ?? paint.code) : `unknown colour ${code}`;
  const w = size === 'sm' ? 22 : 30;
  const h = size === 'sm' ? 12 : 16;
  return (
    <span className={cx('inline-flex items-center gap-1.5 align-middle', className)}>
      <svg width={w} height={h} viewBox="0 0 30 16" role="img" aria-label={label} className="shrink-0">
        <title>{label}</title>
        {paint ? (
          <>
            <rect x="0.75" y="0.75" width="28.5" height="14.5" rx="3" fill={paint.base} />
            {paint.stripe ? (
              <>
                <clipPath id={`sw-${paint.code}`}>
                  <rect x="0.75" y="0.75" width="28.5" height="14.5" rx="3" />
                </clipPath>
                <path d="M9 16 17 0h6l-8 16Z" fill={paint.stripe} clipPath={`url(#sw-${paint.code})`} />
              </>
            ) : null}
          </>
        ) : (
          <path d="M0 16 8 0M8 16 16 0M16 16 24 0M24 16 30 4" stroke="currentColor" strokeWidth="1.5" />
        )}
        <rect x="0.75" y="0.75" width="28.5" height="14.5" rx="3" fill="none" stroke="currentColor" strokeOpacity="0.7" strokeWidth="1.5" />
      </svg>
      {hideCode ? null : <span className="text-sm font-bold tracking-wide">{code}</span>}
    </span>
  );
}
