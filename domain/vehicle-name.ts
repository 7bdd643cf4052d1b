/** A vehicle as people say it: year, make and model, whichever are known (on pages, in e-mail and in the PDF). */
export function vehicleName(v: { year: number | null; make: string; model: string }): string {
  return [v.year, v.make, v.model].filter(Boolean).join(' ');
}
