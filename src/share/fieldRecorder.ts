/** Container and codec choices, best first; the first the browser supports is used. */
const WEBM_TYPES = ['video/webm;codecs=vp9', 'video/webm;codecs=vp8', 'video/webm'];

/** True when this browser can record a canvas to WebM. */
export function canRecordWebm(): boolean {
  return typeof MediaRecorder !== 'undefined' && WEBM_TYPES.some((t) => MediaRecorder.isTypeSupported(t));
}

/**
 * Records a canvas to a WebM video: a stream captured from the canvas (a frame whenever it is
 * repainted, at most `fps` a second) fed to a MediaRecorder. `stop` resolves with the video.
 */
export class FieldRecorder {
  private readonly recorder: MediaRecorder;
  private readonly chunks: Blob[] = [];
  private readonly done: Promise<Blob>;

  constructor(canvas: HTMLCanvasElement, fps = 30) {
    const mimeType = WEBM_TYPES.find((t) => MediaRecorder.isTypeSupported(t));
    if (!mimeType) throw new Error('this browser cannot record WebM video');
    const stream = canvas.captureStream(fps);
    this.recorder = new MediaRecorder(stream, { mimeType, videoBitsPerSecond: 4_000_000 });
    this.done = new Promise<Blob>((resolve, reject) => {
      this.recorder.ondataavailable = (e) => {
        if (e.data.size > 0) this.chunks.push(e.data);
      };
      this.recorder.onstop = () => {
        for (const track of stream.getTracks()) track.stop();
        resolve(new Blob(this.chunks, { type: 'video/webm' }));
      };
      this.recorder.onerror = () => reject(new Error('video recording failed'));
    });
    // Gather data each second, so a long recording does not sit in one growing buffer.
    this.recorder.start(1000);
  }

  stop(): Promise<Blob> {
    if (this.recorder.state !== 'inactive') this.recorder.stop();
    return this.done;
  }
}
