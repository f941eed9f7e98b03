// The card's Plotly bundle (every trace type, minified) has the API of plotly.js, whose types we use.
declare module 'plotly.js-dist-min' {
  import Plotly from 'plotly.js';
  export default Plotly;
}
