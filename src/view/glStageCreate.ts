// Makes the WebGL2 stage, or says why it cannot. pixi.js would otherwise fall back silently to a
// renderer where custom shaders draw nothing, so WebGL2 is probed first and the result checked.
// The app's Content-Security-Policy has no 'unsafe-eval'; this makes pixi build its shader glue without eval.
import 'pixi.js/unsafe-eval';
import { RendererType, WebGLRenderer } from 'pixi.js';
import { fail, ok, type Result } from '../core/result.ts';
import { GlStage } from './glStage.ts';

export interface GlInfo {
  /** pixi's renderer name ('webgl'), or null without one. */
  renderer: string | null;
  webglVersion: number;
  /** gl.MAX_TEXTURE_SIZE, pixels. */
  maxTextureSize: number;
  /** Tile side used, pixels. */
  tileSize: number;
}

/** Returns the stage drawing into `canvas` with WebGL2, or an error saying why WebGL2 is not there. */
export async function glStageCreate(
  canvas: HTMLCanvasElement,
  opts: { tileSize?: number; background: string },
): Promise<Result<{ stage: GlStage; info: GlInfo }>> {
  const probe = document.createElement('canvas').getContext('webgl2', { failIfMajorPerformanceCaveat: false });
  if (!probe) return fail('viewer', 'this browser gives no WebGL2 context; frames are composed on the CPU instead');
  probe.getExtension('WEBGL_lose_context')?.loseContext();
  const renderer = new WebGLRenderer();
  try {
    await renderer.init({
      canvas,
      preferWebGLVersion: 2,
      antialias: false,
      failIfMajorPerformanceCaveat: false,
      resolution: window.devicePixelRatio || 1,
      autoDensity: false,
      background: opts.background,
      width: 1,
      height: 1,
    });
  } catch (e) {
    return fail('viewer', `WebGL2 start failed (${(e as Error).message}); frames are composed on the CPU instead`);
  }
  if (renderer.type !== RendererType.WEBGL || renderer.name !== 'webgl' || renderer.context.webGLVersion !== 2) {
    const got = `${renderer.name} ${renderer.type === RendererType.WEBGL ? `WebGL${renderer.context.webGLVersion}` : ''}`.trim();
    renderer.destroy();
    return fail('viewer', `pixi.js gave a ${got} renderer, not WebGL2; frames are composed on the CPU instead`);
  }
  const gl = renderer.gl;
  const maxTextureSize = gl.getParameter(gl.MAX_TEXTURE_SIZE) as number;
  const tileSize = Math.max(1, Math.min(maxTextureSize, Math.floor(opts.tileSize ?? maxTextureSize)));
  // Tile rows are laid out for the default 4-byte unpack alignment; make sure that is what is set.
  gl.pixelStorei(gl.UNPACK_ALIGNMENT, 4);
  return ok({ stage: new GlStage(renderer, tileSize), info: { renderer: renderer.name, webglVersion: 2, maxTextureSize, tileSize } });
}
