/**
 * Where the invented demo site lies: its grid origin (peg WH1) at an invented point of the British National
 * Grid, chosen to be plausible for the demo and belonging to no real site.
 *
 * The CRS is EPSG:27700, OSGB36 / British National Grid, written as OGC WKT1 as GDAL prints it for that code
 * (`gdalsrsinfo -o wkt1 EPSG:27700`), with the seven-parameter shift to WGS 84 of EPSG transformation 1314
 * ("OSGB36 to WGS 84 (6)", stated accuracy 2 m) as TOWGS84, so that Loamwork's own transformation to WGS 84
 * agrees with a GIS's where the GIS has no national grid-shift file.
 */
export const DEMO_PLACEMENT = {
  crs: 'PROJCS["OSGB36 / British National Grid",GEOGCS["OSGB36",DATUM["Ordnance_Survey_of_Great_Britain_1936",SPHEROID["Airy 1830",6377563.396,299.3249646,AUTHORITY["EPSG","7001"]],TOWGS84[446.448,-125.157,542.06,0.15,0.247,0.842,-20.489],AUTHORITY["EPSG","6277"]],PRIMEM["Greenwich",0,AUTHORITY["EPSG","8901"]],UNIT["degree",0.0174532925199433,AUTHORITY["EPSG","9122"]],AUTHORITY["EPSG","4277"]],PROJECTION["Transverse_Mercator"],PARAMETER["latitude_of_origin",49],PARAMETER["central_meridian",-2],PARAMETER["scale_factor",0.9996012717],PARAMETER["false_easting",400000],PARAMETER["false_northing",-100000],UNIT["metre",1,AUTHORITY["EPSG","9001"]],AXIS["Easting",EAST],AXIS["Northing",NORTH],AUTHORITY["EPSG","27700"]]',
  /** Easting and northing of peg WH1, the site grid's (0, 0), in metres on the National Grid (invented). */
  gridOriginX: 398_450,
  gridOriginY: 491_180,
  /** The EPSG code of the CRS above. */
  epsg: 27700,
} as const;
