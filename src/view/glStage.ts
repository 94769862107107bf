// The WebGL2 side of the viewer: one Mesh per tile, all sharing one program and one uniform group,
// so a layer switch, opacity, colour, solo class, band width or curtain move is a uniform write and a
// redraw; ids, photo and bins are uploaded once per frame (a run on first use).
import {
  Container,
  GlProgram,
  Mesh,
  MeshGeometry,
  RenderTexture,
  Shader,
  UniformGroup,
  WebGLRenderer,
  type TextureSource,
} from 'pixi.js';
import type { CompositeFrame, FrameAround } from '../core/composite/compositeFrame.ts';
import type { CompositePalette } from '../core/composite/compositePalette.ts';
import { LAYER_INDEX, type CompositeParams } from '../core/composite/compositeParams.ts';
import { HIGHLIGHT_BOXES_MAX, LAYER_KEYS, type PixelBox } from '../core/composite/layerSettings.ts';
import { MARK_KEYS } from '../core/composite/compositePalette.ts';
import { fail, ok, type Result } from '../core/result.ts';
import { FrameTextures, frameSources, layoutOf, textureRaw } from './frameTextures.ts';
import { TextureKeep } from './textureKeep.ts';
import { FRAGMENT_SOURCE, VERTEX_SOURCE } from './shaderSource.ts';
import { tilesOf } from './tiles.ts';
import { viewOrigin, type ViewState } from './viewTransform.ts';

interface TileDraw {
  mesh: Mesh<MeshGeometry, Shader>;
  geometry: MeshGeometry;
  shader: Shader;
}

const ivec4s = (n: number) => ({ value: new Int32Array(4 * n), type: 'vec4<i32>' as const, size: n });

export class GlStage {
  readonly stage = new Container();
  private readonly world = new Container();
  private readonly program = GlProgram.from({ vertex: VERTEX_SOURCE, fragment: FRAGMENT_SOURCE, name: 'hairline-composite' });
  private readonly layerGroup = new UniformGroup({
    uLayers: ivec4s(LAYER_KEYS.length),
    uSolo: ivec4s(1),
    uMisc: ivec4s(1),
    uMarks: ivec4s(MARK_KEYS.length),
    uBoxes: ivec4s(HIGHLIGHT_BOXES_MAX),
  });
  private readonly blank8 = textureRaw(new Uint8Array(4), 1, 1, 'r8unorm');
  private readonly blankRgba = textureRaw(new Uint8Array(4), 1, 1, 'rgba8unorm');
  private palette: TextureSource = textureRaw(new Uint8Array(65536 * 4), 256, 256, 'rgba8unorm');
  private paletteBytes: Uint8Array | null = null;
  private textures: FrameTextures | null = null;
  /** Textures of frames seen or prefetched, by the arrays they were made from. */
  private readonly keep = new TextureKeep();
  /** How the frame on screen is cut into tiles (the meshes are reused while it stays the same). */
  private layout = '';

  private draws: TileDraw[] = [];
  private runA: string | null = null;
  private runB: string | null = null;
  /** The run whose neighbours are bound for the flicker layer (only while the layer is drawn), null for none, undefined before binding. */
  private flickerRun: string | null | undefined = undefined;

  constructor(
    readonly renderer: WebGLRenderer,
    /** Largest tile side: the GPU's MAX_TEXTURE_SIZE, or smaller when asked. */
    readonly tileSize: number,
  ) {
    this.stage.addChild(this.world);
  }

  /**
   * Shows `frame`: its textures come from the keep (uploaded when not kept), and the tile meshes of
   * the last frame are reused when the new one is cut the same way. Returns the tiles.
   */
  frameSet(frame: CompositeFrame | null): PixelBox[] {
    this.runA = this.runB = null;
    this.flickerRun = undefined;
    if (!frame) {
      this.drawsFree();
      this.textures = null;
      this.keep.pin([]);
      return [];
    }
    const tiles = tilesOf(frame.truth.width, frame.truth.height, this.tileSize);
    const layout = layoutOf(frame.truth.width, frame.truth.height, tiles);
    this.keep.pin(frameSources(frame, []));
    const tex = new FrameTextures(frame, tiles, this.keep);
    this.textures = tex;
    if (layout !== this.layout) {
      this.drawsFree();
      this.layout = layout;
      this.draws = tiles.map((t) => this.drawMake(t));
    }
    this.draws.forEach((d, i) => {
      const r = d.shader.resources;
      r.uPhoto = tex.photo ? tex.photo[i] : this.blankRgba;
      r.uTruth = tex.truth[i];
      r.uBins = tex.bins ? tex.bins[i] : this.blank8;
      r.uPredA = r.uPredB = r.uPrevA = r.uNextA = this.blank8;
    });
    return tiles;
  }

  /**
   * Makes `frame`'s textures (and those of `runs`) and uploads them now, so that showing it later
   * uploads nothing; kept as long as the keep's budget allows.
   */
  prefetch(frame: CompositeFrame, runs: string[]): void {
    const tiles = tilesOf(frame.truth.width, frame.truth.height, this.tileSize);
    for (const s of new FrameTextures(frame, tiles, this.keep).all(runs)) this.renderer.texture.initSource(s);
  }

  private drawMake(t: PixelBox): TileDraw {
    const geometry = new MeshGeometry({
      positions: Float32Array.of(0, 0, t.width, 0, t.width, t.height, 0, t.height),
      uvs: Float32Array.of(0, 0, 1, 0, 1, 1, 0, 1),
      indices: Uint32Array.of(0, 1, 2, 0, 2, 3),
    });
    const shader = new Shader({
      glProgram: this.program,
      resources: {
        layers: this.layerGroup,
        tile: new UniformGroup({ uTile: { value: Int32Array.of(t.x, t.y, t.width, t.height), type: 'vec4<i32>' } }),
        uPhoto: this.blankRgba,
        uTruth: this.blank8,
        uPredA: this.blank8,
        uPredB: this.blank8,
        uPrevA: this.blank8,
        uNextA: this.blank8,
        uBins: this.blank8,
        uPalette: this.palette,
      },
    });
    const mesh = new Mesh({ geometry, shader });
    mesh.position.set(t.x, t.y);
    this.world.addChild(mesh);
    return { mesh, geometry, shader };
  }

  private drawsFree(): void {
    for (const d of this.draws) {
      d.mesh.destroy(); // leaves geometry and shader alive: free them too
      d.geometry.destroy();
      d.shader.destroy();
    }
    this.draws = [];
    this.layout = '';
  }

  /** Takes the neighbours' predictions for the flicker layer; they are uploaded when the layer is drawn. */
  aroundSet(around: FrameAround | null): void {
    this.textures?.aroundSet(around);
    this.flickerRun = undefined;
  }

  /** Uploads the id → colour table again only when its bytes are a different array. */
  paletteSet(palette: CompositePalette): void {
    if (palette.rgba === this.paletteBytes) return;
    this.paletteBytes = palette.rgba;
    const next = textureRaw(palette.rgba, 256, 256, 'rgba8unorm');
    for (const d of this.draws) d.shader.resources.uPalette = next;
    this.palette.destroy();
    this.palette = next;
  }

  /** Writes resolved layer settings into the shared uniforms and binds the runs they name. */
  paramsSet(p: CompositeParams): void {
    const u = this.layerGroup.uniforms as Record<string, Int32Array>;
    u.uLayers.set(p.layers);
    u.uSolo.set(p.solo);
    u.uMisc.set([p.curtainX, p.ignore, 0, 0]);
    u.uMarks.set(p.marks);
    u.uBoxes.set(p.boxes);
    // Everything the frame on screen may draw from stays on the GPU while it is shown.
    if (this.textures) this.keep.pin(frameSources(this.textures.of, [p.runA, p.runB]));
    if (p.runA !== this.runA) {
      this.runA = p.runA;
      this.runBind('uPredA', p.runA);
    }
    if (p.runB !== this.runB) {
      this.runB = p.runB;
      this.runBind('uPredB', p.runB);
    }
    // The neighbours' maps go to the GPU only once the flicker layer is drawn.
    const flickerRun = p.layers[LAYER_INDEX.flicker] !== 0 ? p.runA : null;
    if (flickerRun !== this.flickerRun) {
      this.flickerRun = flickerRun;
      const tex = flickerRun !== null && this.textures ? this.textures.around(flickerRun) : null;
      this.draws.forEach((d, i) => {
        d.shader.resources.uPrevA = tex ? tex.prev[i] : this.blank8;
        d.shader.resources.uNextA = tex ? tex.next[i] : this.blank8;
      });
    }
  }

  private runBind(slot: 'uPredA' | 'uPredB', run: string | null): void {
    const tex = run !== null && this.textures ? this.textures.run(run) : null;
    this.draws.forEach((d, i) => (d.shader.resources[slot] = tex ? tex[i] : this.blank8));
  }

  /** Draws the image with `view` into the screen canvas of vpW×vpH device pixels now. */
  draw(view: ViewState, vpW: number, vpH: number): void {
    const { ox, oy } = viewOrigin(view, vpW, vpH);
    const r = this.renderer.resolution;
    this.world.position.set(ox / r, oy / r);
    this.world.scale.set(view.scale / r);
    this.renderer.render(this.stage);
  }

  /** Returns the image pixels of `rect` drawn at 1:1 (RGBA, row-major, top row first), rendered off screen now. */
  pixelsRead(rect: PixelBox): Result<Uint8Array> {
    if (this.draws.length === 0) return fail('viewer', 'no frame to read back');
    const out = new Uint8Array(rect.width * rect.height * 4);
    // Read in pieces no larger than a tile (the GPU's limits, or a forced smaller size in tests).
    const chunk = Math.min(2048, this.tileSize, this.renderer.gl.getParameter(this.renderer.gl.MAX_RENDERBUFFER_SIZE) as number);
    const saved = { x: this.world.x, y: this.world.y, s: this.world.scale.x };
    try {
      for (let y0 = 0; y0 < rect.height; y0 += chunk) {
        for (let x0 = 0; x0 < rect.width; x0 += chunk) {
          const w = Math.min(chunk, rect.width - x0), h = Math.min(chunk, rect.height - y0);
          const rt = RenderTexture.create({ width: w, height: h, resolution: 1, antialias: false, scaleMode: 'nearest' });
          this.world.position.set(-(rect.x + x0), -(rect.y + y0));
          this.world.scale.set(1);
          this.renderer.render({ container: this.stage, target: rt, clear: true });
          const { pixels } = this.renderer.extract.pixels(rt);
          rt.destroy(true);
          for (let row = 0; row < h; row++) {
            out.set(pixels.subarray(row * w * 4, (row + 1) * w * 4), ((y0 + row) * rect.width + x0) * 4);
          }
        }
      }
    } finally {
      this.world.position.set(saved.x, saved.y);
      this.world.scale.set(saved.s);
    }
    return ok(out);
  }

  /** Frees the frame, the kept textures, the palette and the renderer. */
  destroy(): void {
    this.frameSet(null);
    this.keep.clear();
    this.palette.destroy();
    this.blank8.destroy();
    this.blankRgba.destroy();
    this.renderer.destroy();
  }
}
