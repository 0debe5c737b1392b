import { sceneToSvg } from './hr-paint';
import type { Palette, Scene } from './hr-scene';

function download(blob: Blob, filename: string) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  document.body.append(a);
  a.click();
  a.remove();
  // Give the browser a moment to start the download before the address is let go.
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** The canvas as drawn, at the screen's pixel density. */
export function savePng(canvas: HTMLCanvasElement, filename: string): void {
  canvas.toBlob((blob) => {
    if (blob) download(blob, filename);
  }, 'image/png');
}

/** The same drawing rebuilt as SVG, so it scales for a paper or a slide. */
export function saveSvg(scene: Scene, palette: Palette, title: string, filename: string): void {
  download(new Blob([sceneToSvg(scene, palette, title)], { type: 'image/svg+xml' }), filename);
}
