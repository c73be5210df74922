// The browser's copy of the analysis engine, off the main thread so a drag keeps its frames: one message in (a key and a
// table document), one message out (the predictions, or the sentence saying why there are none).
import { predictTable } from "./table-engine";

type Request = { key: string; doc: unknown };

self.onmessage = (event: MessageEvent<Request>) => {
  const { key, doc } = event.data;
  try {
    self.postMessage({ key, predictions: predictTable(doc) });
  } catch (error) {
    self.postMessage({ key, error: error instanceof Error ? error.message : "The table could not be analysed." });
  }
};
