// The one number format shared by the portals and the report PDF.
export * from './quantity';
export * from './symbol';
