/** No clipboard module ships with the app outside the browser; the text stays selectable instead. */
export async function copyText(_text: string): Promise<boolean> {
  return false;
}
