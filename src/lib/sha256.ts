/** SHA-256 of UTF-8 text as lowercase hex, with the browser's Web Crypto; null where it is not offered (plain HTTP). */
export function webSha256(): ((text: string) => Promise<string>) | null {
  const subtle = globalThis.crypto?.subtle;
  if (!subtle) return null;
  return async (text: string) => {
    const digest = await subtle.digest('SHA-256', new TextEncoder().encode(text));
    return Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, '0')).join('');
  };
}
