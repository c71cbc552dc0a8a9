/** Sets the document title as "<page> · Guyline" (React hoists <title> into <head>). */
export function Title({ children }: { children: string }) {
  return <title>{`${children} · Guyline`}</title>;
}
