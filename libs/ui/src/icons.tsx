import type { SVGProps } from 'react';

/*
 * A handful of line icons drawn for Tappet on a 24-unit grid. They are decorative by default
 * (aria-hidden): the word next to them carries the meaning.
 */

type IconProps = SVGProps<SVGSVGElement> & { size?: number };

function Svg({ size = 20, children, ...rest }: IconProps) {
  return (
    <svg
      width={size}
      height={size}
      viewBox="0 0 24 24"
      fill="none"
      stroke="currentColor"
      strokeWidth={2}
      strokeLinecap="round"
      strokeLinejoin="round"
      aria-hidden="true"
      focusable="false"
      {...rest}
    >
      {children}
    </svg>
  );
}

/** A tick in a circle: "OK". */
export function IconOk(props: IconProps) {
  return (
    <Svg {...props}>
      <circle cx="12" cy="12" r="9" />
      <path d="M8 12.5l2.5 2.5L16 9.5" />
    </Svg>
  );
}

/** An exclamation in a diamond: "Advise". */
export function IconAdvise(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M12 2.8l9.2 9.2-9.2 9.2L2.8 12z" />
      <path d="M12 8v4.5" />
      <path d="M12 16h.01" />
    </Svg>
  );
}

/** A cross in a square: "Fail". */
export function IconFail(props: IconProps) {
  return (
    <Svg {...props}>
      <rect x="3.5" y="3.5" width="17" height="17" rx="2" />
      <path d="M9 9l6 6M15 9l-6 6" />
    </Svg>
  );
}

/** A dash in a circle: "Not applicable". */
export function IconNotApplicable(props: IconProps) {
  return (
    <Svg {...props}>
      <circle cx="12" cy="12" r="9" strokeDasharray="3 2.5" />
      <path d="M8 12h8" />
    </Svg>
  );
}

/** A warning triangle, used only for safety cautions. */
export function IconCaution(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M12 3L2.5 20h19z" />
      <path d="M12 9.5v5" />
      <path d="M12 17.5h.01" />
    </Svg>
  );
}

/** Information: an "i" in a circle. */
export function IconInfo(props: IconProps) {
  return (
    <Svg {...props}>
      <circle cx="12" cy="12" r="9" />
      <path d="M12 11v5.5" />
      <path d="M12 7.5h.01" />
    </Svg>
  );
}

export function IconClose(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M6 6l12 12M18 6L6 18" />
    </Svg>
  );
}

export function IconChevronDown(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M6 9l6 6 6-6" />
    </Svg>
  );
}

export function IconMenu(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M4 7h16M4 12h16M4 17h16" />
    </Svg>
  );
}

export function IconEye(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M2 12s3.6-6.5 10-6.5S22 12 22 12s-3.6 6.5-10 6.5S2 12 2 12z" />
      <circle cx="12" cy="12" r="3" />
    </Svg>
  );
}

export function IconEyeOff(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M3 3l18 18" />
      <path d="M10.6 6.1A10.6 10.6 0 0 1 12 6c6.4 0 10 6 10 6a17 17 0 0 1-3.1 3.8M6.3 7.4C3.7 9.2 2 12 2 12s3.6 6.5 10 6.5c1.7 0 3.2-.4 4.5-1" />
      <path d="M9.9 9.9a3 3 0 0 0 4.2 4.2" />
    </Svg>
  );
}

/** Sort direction: both arrows when unsorted, one when sorted. */
export function IconSort({ sortOrder: order, ...props }: IconProps & { sortOrder: 'asc' | 'desc' | false }) {
  return (
    <Svg {...props} size={props.size ?? 16}>
      {order !== 'desc' && <path d="M8 10l4-4 4 4" opacity={order === 'asc' ? 1 : 0.45} />}
      {order !== 'asc' && <path d="M8 14l4 4 4-4" opacity={order === 'desc' ? 1 : 0.45} />}
    </Svg>
  );
}

export function IconHome(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M3.5 11L12 4l8.5 7" />
      <path d="M5.5 9.5V20h13V9.5" />
      <path d="M10 20v-5.5h4V20" />
    </Svg>
  );
}

/** A shopfront with an awning. */
export function IconShop(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M3 9l1.5-5h15L21 9" />
      <path d="M3 9c0 1.4 1.3 2.5 3 2.5S9 10.4 9 9c0 1.4 1.3 2.5 3 2.5s3-1.1 3-2.5c0 1.4 1.3 2.5 3 2.5S21 10.4 21 9" />
      <path d="M5 11.5V20h14v-8.5" />
      <path d="M10 20v-5h4v5" />
    </Svg>
  );
}

/** Braces: API documentation. */
export function IconBraces(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M8 4H7a2 2 0 0 0-2 2v3.5A2.5 2.5 0 0 1 2.5 12 2.5 2.5 0 0 1 5 14.5V18a2 2 0 0 0 2 2h1" />
      <path d="M16 4h1a2 2 0 0 1 2 2v3.5a2.5 2.5 0 0 0 2.5 2.5 2.5 2.5 0 0 0-2.5 2.5V18a2 2 0 0 1-2 2h-1" />
    </Svg>
  );
}

export function IconSignOut(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M14 4h4a2 2 0 0 1 2 2v12a2 2 0 0 1-2 2h-4" />
      <path d="M10 16l-4-4 4-4" />
      <path d="M6 12h10" />
    </Svg>
  );
}

export function IconCheck(props: IconProps) {
  return (
    <Svg {...props}>
      <path d="M5 12.5l4.5 4.5L19 7.5" />
    </Svg>
  );
}

/** A half-filled circle: the colour theme. */
export function IconContrast(props: IconProps) {
  return (
    <Svg {...props}>
      <circle cx="12" cy="12" r="9" />
      <path d="M12 3a9 9 0 0 1 0 18z" fill="currentColor" />
    </Svg>
  );
}

/** A grid of four tiles: the platform (all shops). */
export function IconPlatform(props: IconProps) {
  return (
    <Svg {...props}>
      <rect x="3.5" y="3.5" width="7" height="7" rx="1.5" />
      <rect x="13.5" y="3.5" width="7" height="7" rx="1.5" />
      <rect x="3.5" y="13.5" width="7" height="7" rx="1.5" />
      <rect x="13.5" y="13.5" width="7" height="7" rx="1.5" />
    </Svg>
  );
}
