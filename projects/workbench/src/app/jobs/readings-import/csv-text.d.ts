/** A CSV file imported as its text (`import sample from './x.csv' with { loader: 'text' }`). */
declare module '*.csv' {
  const text: string;
  export default text;
}
