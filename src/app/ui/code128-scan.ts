// Reads Code 128 labels from the camera: each frame of the video is drawn on a canvas, turned to
// grey and handed to @zxing/library's Code 128 reader. Only the few parts of the library this needs
// are imported, each by its own file: the library's index (and @zxing/browser, which imports it)
// brings every format it knows, about 400 kB that no label of ours uses.
import BinaryBitmap from '@zxing/library/esm/core/BinaryBitmap';
import HybridBinarizer from '@zxing/library/esm/core/common/HybridBinarizer';
import Code128Reader from '@zxing/library/esm/core/oned/Code128Reader';
import RGBLuminanceSource from '@zxing/library/esm/core/RGBLuminanceSource';

/** Time between two looks at the picture: often enough to feel immediate, rare enough to stay cool. */
const PAUSE_MS = 250;

export interface ScanControls {
  /** Stops looking and releases the camera. */
  stop(): void;
}

/**
 * Starts the camera into `video` and calls `read` with the text of each Code 128 label seen, until
 * stopped. Fails (and leaves the camera off) when the camera cannot be had or the picture not shown.
 */
export async function scanCode128(
  constraints: MediaStreamConstraints,
  video: HTMLVideoElement,
  read: (text: string) => void,
): Promise<ScanControls> {
  const stream = await navigator.mediaDevices.getUserMedia(constraints);
  let stopped = false;
  let timer: ReturnType<typeof setTimeout> | undefined;
  const stop = () => {
    stopped = true;
    clearTimeout(timer);
    for (const track of stream.getTracks()) track.stop();
    video.srcObject = null;
  };
  try {
    video.srcObject = stream;
    await video.play();
  } catch (error: unknown) {
    stop();
    throw error;
  }
  const canvas = document.createElement('canvas');
  const context = canvas.getContext('2d', { willReadFrequently: true });
  const reader = new Code128Reader();
  const look = () => {
    if (stopped) return;
    const text = context ? readFrame(video, canvas, context, reader) : null;
    if (text !== null) read(text);
    if (!stopped) timer = setTimeout(look, PAUSE_MS);
  };
  look();
  return { stop };
}

/** The label in the video's current picture, or null when none could be read in it. */
function readFrame(
  video: HTMLVideoElement,
  canvas: HTMLCanvasElement,
  context: CanvasRenderingContext2D,
  reader: Code128Reader,
): string | null {
  const { videoWidth: width, videoHeight: height } = video;
  if (!width || !height) return null;
  canvas.width = width;
  canvas.height = height;
  context.drawImage(video, 0, 0, width, height);
  const rgba = context.getImageData(0, 0, width, height).data;
  const grey = new Uint8ClampedArray(width * height);
  for (let i = 0, p = 0; i < grey.length; i++, p += 4) {
    // ITU-R BT.601 luma weights (0.299, 0.587, 0.114) in 1024ths, rounded.
    grey[i] = (306 * rgba[p] + 601 * rgba[p + 1] + 117 * rgba[p + 2] + 0x200) >> 10;
  }
  try {
    const bitmap = new BinaryBitmap(
      new HybridBinarizer(new RGBLuminanceSource(grey, width, height)),
    );
    return reader.decode(bitmap).getText();
  } catch {
    // No label in this picture, or one whose check character did not match: look again.
    return null;
  }
}
