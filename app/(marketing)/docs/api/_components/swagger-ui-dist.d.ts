/** swagger-ui-dist ships no types: its browser bundle is one function taking the options object. */
declare module "swagger-ui-dist/swagger-ui-bundle.js";
