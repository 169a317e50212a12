// Chart geometry shared by the portals and the PDF report.
export * from './label-placement';
