/** Line styles on the desk map: our own ink colours and dash patterns, told apart in grey too. */
export const LINE_STYLES = [
  { stroke: '#23313f', dash: '', width: 1.6 },
  { stroke: '#b4532a', dash: '7 4', width: 2 },
  { stroke: '#2f7a5f', dash: '2 3', width: 2.2 },
  { stroke: '#5d4a94', dash: '10 3 2 3', width: 2 },
  { stroke: '#8c6a12', dash: '14 5', width: 2 },
  { stroke: '#1f6f9a', dash: '4 2 4 6', width: 2 },
] as const;

export const lineStyle = (index: number) => LINE_STYLES[index % LINE_STYLES.length];
