// The drawing used without WebGL: an RGBA composite made on the CPU (frameComposite, in a worker)
// shown on a 2-D canvas with the same pan and zoom, nearest-neighbour, so pixels stay crisp.
import { viewOrigin, type ViewState } from './viewTransform.ts';

export class CpuStage {
  private readonly ctx: CanvasRenderingContext2D;
  private image: HTMLCanvasElement | null = null;

  constructor(
    readonly canvas: HTMLCanvasElement,
    private readonly background: string,
  ) {
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('viewer: this browser gives no 2-D canvas either');
    this.ctx = ctx;
  }

  /** Keeps `rgba` (width·height·4 bytes) as the picture to draw. */
  compositeSet(rgba: Uint8Array | null, width: number, height: number): void {
    if (!rgba) {
      this.image = null;
      return;
    }
    const c = this.image && this.image.width === width && this.image.height === height ? this.image : document.createElement('canvas');
    c.width = width;
    c.height = height;
    const data = new ImageData(new Uint8ClampedArray(rgba.buffer as ArrayBuffer, rgba.byteOffset, width * height * 4), width, height);
    c.getContext('2d')!.putImageData(data, 0, 0);
    this.image = c;
  }

  /** Draws the picture with `view` now; the canvas is vpW×vpH device pixels. */
  draw(view: ViewState, vpW: number, vpH: number): void {
    const ctx = this.ctx;
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.fillStyle = this.background;
    ctx.fillRect(0, 0, vpW, vpH);
    if (!this.image) return;
    const { ox, oy } = viewOrigin(view, vpW, vpH);
    ctx.imageSmoothingEnabled = false;
    ctx.setTransform(view.scale, 0, 0, view.scale, ox, oy);
    ctx.drawImage(this.image, 0, 0);
  }

  /** Sets the canvas to vpW×vpH device pixels. */
  resize(vpW: number, vpH: number): void {
    this.canvas.width = vpW;
    this.canvas.height = vpH;
  }
}
