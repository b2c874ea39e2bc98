/** Stylesheets imported by the pane are bundled as text (webpack rule `asset/source`). */
declare module "*.css" {
  const source: string;
  export default source;
}
