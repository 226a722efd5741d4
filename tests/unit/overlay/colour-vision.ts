/**
 * Colour-vision-deficiency simulation and colour distance for the overlay checks.
 * Simulation: Machado, Oliveira & Fernandes (2009), "A Physiologically-based Model for
 * Simulation of Color Vision Deficiency", IEEE TVCG 15(6) — the severity-1.0 matrices,
 * applied to linear sRGB. Distance: CIE 1976 ΔE*ab in CIELAB, D65 white (CIE 15:2004), with
 * the IEC 61966-2-1 sRGB transfer curve and sRGB->XYZ matrix.
 */
export type Rgb = [number, number, number];

export const MACHADO_2009 = {
  deuteranopia: [0.367322, 0.860646, -0.227968, 0.280085, 0.672501, 0.047413, -0.01182, 0.04294, 0.968881],
  protanopia: [0.152286, 1.052583, -0.204868, 0.114503, 0.786281, 0.099216, -0.003882, -0.048116, 1.051998],
} as const;

const toLinear = (c: number) => {
  const v = c / 255;
  return v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4;
};
const toSrgb = (v: number) => {
  const c = Math.min(1, Math.max(0, v));
  return 255 * (c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055);
};

export function simulate(rgb: Rgb, kind: keyof typeof MACHADO_2009): Rgb {
  const m = MACHADO_2009[kind];
  const l = rgb.map(toLinear);
  return [0, 1, 2].map((i) => toSrgb(m[3 * i] * l[0] + m[3 * i + 1] * l[1] + m[3 * i + 2] * l[2])) as Rgb;
}

export function lab(rgb: Rgb): Rgb {
  const [r, g, b] = rgb.map(toLinear);
  const x = (0.4124 * r + 0.3576 * g + 0.1805 * b) / 0.95047;
  const y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
  const z = (0.0193 * r + 0.1192 * g + 0.9505 * b) / 1.08883;
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : (24389 / 27 * t + 16) / 116);
  return [116 * f(y) - 16, 500 * (f(x) - f(y)), 200 * (f(y) - f(z))];
}

export function deltaE76(a: Rgb, b: Rgb): number {
  const p = lab(a);
  const q = lab(b);
  return Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);
}

export const rgbOf = (c: number): Rgb => [(c >> 16) & 255, (c >> 8) & 255, c & 255];
