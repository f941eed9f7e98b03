// The cartesian partial bundle of Plotly has the same API as the full one.
declare module 'plotly.js-cartesian-dist-min' {
  import Plotly from 'plotly.js';
  export default Plotly;
}
