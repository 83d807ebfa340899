/**
 * An exact rational number on BigInt. Lineage quantities are multiplied
 * along chains and inverted for reverse interchange (1/2 of a part, then ×2 again); floating point
 * would turn 1/3 × 3 into 0.9999….
 */
export class Ratio {
  static readonly ZERO = new Ratio(0n, 1n);
  static readonly ONE = new Ratio(1n, 1n);

  private constructor(
    /** Numerator in lowest terms; carries the sign. */
    readonly numerator: bigint,
    /** Denominator in lowest terms; always positive. */
    readonly denominator: bigint,
  ) {}

  /** Builds `numerator / denominator` in lowest terms. Throws on a zero denominator. */
  static of(numerator: bigint | number, denominator: bigint | number = 1n): Ratio {
    let n = BigInt(numerator);
    let d = BigInt(denominator);
    if (d === 0n) throw new RangeError('Ratio denominator must not be zero');
    if (d < 0n) {
      n = -n;
      d = -d;
    }
    const g = gcd(n < 0n ? -n : n, d);
    return new Ratio(n / g, d / g);
  }

  /**
   * The exact value of a finite number as written in decimal (0.5 → 1/2, 0.1 → 1/10, 3 → 3).
   * Returns null for NaN and ±Infinity.
   */
  static fromNumber(value: number): Ratio | null {
    if (!Number.isFinite(value)) return null;
    if (Number.isInteger(value)) return value === 1 ? Ratio.ONE : Ratio.of(BigInt(value));
    // The shortest decimal that round-trips is what a person typed; take that, not the binary value.
    const match = /^(-?)(\d+)(?:\.(\d+))?(?:e([+-]\d+))?$/.exec(String(value));
    if (!match) return null;
    const [, sign = '', whole = '0', fraction = '', exponentText = '0'] = match;
    let n = BigInt(whole + fraction);
    let d = 10n ** BigInt(fraction.length);
    const exponent = Number(exponentText);
    if (exponent >= 0) n *= 10n ** BigInt(exponent);
    else d *= 10n ** BigInt(-exponent);
    return Ratio.of(sign === '-' ? -n : n, d);
  }

  /** this × other. */
  times(other: Ratio): Ratio {
    // Most lineage quantities are 1: skip the BigInt work.
    if (other.numerator === other.denominator) return this;
    if (this.numerator === this.denominator) return other;
    return Ratio.of(this.numerator * other.numerator, this.denominator * other.denominator);
  }

  /** this + other. */
  plus(other: Ratio): Ratio {
    if (this.denominator === 1n && other.denominator === 1n) return new Ratio(this.numerator + other.numerator, 1n);
    return Ratio.of(
      this.numerator * other.denominator + other.numerator * this.denominator,
      this.denominator * other.denominator,
    );
  }

  /** 1 / this. Throws for zero. */
  inverse(): Ratio {
    if (this.numerator === 0n) throw new RangeError('Zero has no inverse');
    return Ratio.of(this.denominator, this.numerator);
  }

  /** Strictly greater than zero. */
  isPositive(): boolean {
    return this.numerator > 0n;
  }

  /** Same value (terms are always kept in lowest form, so equal terms). */
  equals(other: Ratio): boolean {
    return this.numerator === other.numerator && this.denominator === other.denominator;
  }

  /** The value as a double (correctly rounded while both terms are safe integers). */
  toNumber(): number {
    const n = this.numerator;
    const d = this.denominator;
    const safe = BigInt(Number.MAX_SAFE_INTEGER);
    // Both terms exact as doubles: one IEEE division rounds correctly.
    if (n <= safe && n >= -safe && d <= safe) return Number(n) / Number(d);
    // Otherwise Number() of either term may overflow or lose digits: write out 21 significant
    // digits and let the decimal parser do the rounding.
    const magnitude = n < 0n ? -n : n;
    const shift = 21 - (magnitude.toString().length - d.toString().length);
    const scaled = shift >= 0 ? (magnitude * 10n ** BigInt(shift)) / d : magnitude / (d * 10n ** BigInt(-shift));
    return Number(`${n < 0n ? '-' : ''}${scaled}e${-shift}`);
  }

  /** "3", "1/2", "-5/4": lossless and safe to send as JSON. */
  toString(): string {
    return this.denominator === 1n ? `${this.numerator}` : `${this.numerator}/${this.denominator}`;
  }
}

function gcd(a: bigint, b: bigint): bigint {
  while (b !== 0n) [a, b] = [b, a % b];
  return a === 0n ? 1n : a;
}
