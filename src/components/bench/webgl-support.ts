/**
 * Whether this browser can draw the 3D bench. three.js 0.187 renders with WebGL 2 only, so a browser
 * with WebGL 1 alone gets the numeric bench too.
 */
export function hasWebGL2(doc: Pick<Document, 'createElement'> = document): boolean {
  try {
    const canvas = doc.createElement('canvas');
    const context = canvas.getContext('webgl2');
    if (!context) return false;
    // give the probe's context back at once: browsers cap live WebGL contexts per page
    (context as WebGL2RenderingContext).getExtension('WEBGL_lose_context')?.loseContext();
    return true;
  } catch {
    return false;
  }
}
