// The `bessel` package (SheetJS) ships no type declarations.
declare module 'bessel' {
  /** Bessel function of the first kind J_n(x). */
  export function besselj(x: number, n: number): number
  const bessel: { besselj: typeof besselj }
  export default bessel
}
