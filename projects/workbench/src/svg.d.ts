// An SVG file imported by the workbench is its text (the `.svg` loader in angular.json): see app-icons.ts.
declare module '*.svg' {
  const text: string;
  export default text;
}
