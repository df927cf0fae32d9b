/** SVG files imported by the web app arrive as their text (angular.json: loader ".svg": "text"). */
declare module '*.svg' {
  const text: string;
  export default text;
}
