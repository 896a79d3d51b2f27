/** The server reads the one API catalogue; it lives in lib/api so the browser's fetch layer reads it too. */
export { api, noInput, type ApiName, type ApiOperation } from "@/lib/api/catalog";
