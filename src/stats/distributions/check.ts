/** Parameter checks shared by the distribution files: each throws an Error that names the function and value. */

export function requireNumber(x: number, name: string, fn: string): void {
  if (typeof x !== 'number' || Number.isNaN(x)) throw new Error(`${fn}: ${name} must be a number, got ${String(x)}`);
}

export function requireProbability(p: number, name: string, fn: string): void {
  requireNumber(p, name, fn);
  if (p < 0 || p > 1) throw new Error(`${fn}: ${name} must be a probability between 0 and 1, got ${p}`);
}

export function requirePositive(x: number, name: string, fn: string): void {
  requireNumber(x, name, fn);
  if (!(x > 0)) throw new Error(`${fn}: ${name} must be positive, got ${x}`);
}

export function requireCount(x: number, name: string, fn: string): void {
  requireNumber(x, name, fn);
  if (!Number.isInteger(x) || x < 0) throw new Error(`${fn}: ${name} must be a whole number 0 or more, got ${x}`);
}

export function requireInteger(x: number, name: string, fn: string): void {
  requireNumber(x, name, fn);
  if (!Number.isInteger(x)) throw new Error(`${fn}: ${name} must be a whole number, got ${x}`);
}
