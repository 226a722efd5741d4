/**
 * Reused text labels (shirt numbers, metres). Bitmap text from one white dynamic font,
 * coloured by tint: changing a label's text costs no texture upload, which plain Text
 * would pay every frame.
 */
import { BitmapText, Container } from 'pixi.js';

const FONT = { fontFamily: 'DejaVu Sans, Arial, sans-serif', fontSize: 28, fontWeight: 'bold' as const, fill: 0xffffff };

export class LabelPool {
  readonly container = new Container();
  private items: BitmapText[] = [];
  private used = 0;

  begin(): void {
    this.used = 0;
  }

  /** A label centred at (x, y); size in output pixels (cap height roughly). */
  place(text: string, x: number, y: number, size: number, tint: number, anchorX = 0.5, anchorY = 0.5): void {
    let t = this.items[this.used];
    if (!t) {
      t = new BitmapText({ text, style: FONT });
      this.items.push(t);
      this.container.addChild(t);
    }
    this.used++;
    if (t.text !== text) t.text = text;
    t.anchor.set(anchorX, anchorY);
    t.scale.set(size / FONT.fontSize);
    t.tint = tint;
    t.position.set(x, y);
    t.visible = true;
  }

  end(): void {
    for (let i = this.used; i < this.items.length; i++) this.items[i].visible = false;
  }
}
