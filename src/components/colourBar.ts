import { TABLE_SIZE } from './divergingTable';

/** Paint a colour table into a 1 × TABLE_SIZE canvas for the colour bar: top = the table's last entry. */
export function paintColourBar(bar: HTMLCanvasElement, table: Uint32Array): void {
  bar.width = 1;
  bar.height = TABLE_SIZE;
  const image = new ImageData(1, TABLE_SIZE);
  const words = new Uint32Array(image.data.buffer);
  for (let r = 0; r < TABLE_SIZE; r++) words[r] = table[TABLE_SIZE - 1 - r];
  bar.getContext('2d')?.putImageData(image, 0, 0);
}
