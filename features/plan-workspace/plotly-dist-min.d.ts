// The minified plotly.js bundle ships without type declarations; the workspace only hands it to react-plotly.js's factory.
declare module 'plotly.js-dist-min' {
  const Plotly: unknown;
  export default Plotly;
}
