// Stands in for Node built-ins (fs, path, crypto) that opencv-wasm requires only when it runs
// under Node; in the browser worker those branches never execute.
const stub = {};
export default stub;
