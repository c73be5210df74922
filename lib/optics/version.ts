// The optics engine's version, kept with every as-built observation beside the prediction it was compared
// with. Raise it whenever analyzeBench or screenProfile would give a different answer for the same bench.
export const OPTICS_ENGINE_VERSION = "2026-12-02b";
