/** Version of the API's contract, shown in /api/health and the OpenAPI description. */
export const API_VERSION = '0.1.0';
