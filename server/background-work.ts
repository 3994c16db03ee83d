// What a piece of background work hands back when it starts: how to stop it. Its own small file so
// each worker can name it without importing the list of workers that imports it.
export interface Background {
  stop(): Promise<void>;
}
