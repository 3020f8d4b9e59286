/** The four demo files with the mapping a researcher would confirm on the upload screen. */
export const DEMO_CATALOGS = [
  {
    file: 'hrg-co-clouds.txt',
    name: 'HRG CO clouds (J=1–0)',
    kind: 'co',
    mapping: {
      position: {
        system: 'galactic',
        lon: { column: 'l_deg', unit: 'deg' },
        lat: { column: 'b_deg', unit: 'deg' },
      },
      velocity: { column: 'v_lsr_kms', unit: 'km/s', frame: 'lsr', convention: 'radio' },
      lineWidth: { column: 'sigma_v', unit: 'km/s', kind: 'sigma' },
      size: { column: 'radius_arcsec', unit: 'arcsec', kind: 'radius' },
      name: { column: 'cloud_id' },
    },
  },
  {
    file: 'hrg-hi-clouds.csv',
    name: 'HRG HI clouds (21 cm)',
    kind: 'hi',
    mapping: {
      position: {
        system: 'galactic',
        lon: { column: 'GLON', unit: 'deg' },
        lat: { column: 'GLAT', unit: 'deg' },
      },
      velocity: { column: 'VLSR', unit: 'km/s', frame: 'lsr', convention: 'radio' },
      lineWidth: { column: 'FWHM_KMS', unit: 'km/s', kind: 'fwhm' },
      size: { column: 'SIZE_ARCMIN', unit: 'arcmin', kind: 'diameter' },
      name: { column: 'NAME' },
    },
  },
  {
    file: 'hrg-hii-regions.csv',
    name: 'HRG HII regions (recombination lines)',
    kind: 'hii',
    mapping: {
      position: {
        system: 'equatorial',
        lon: { column: 'RA_J2000', unit: 'sexagesimal' },
        lat: { column: 'DEC_J2000', unit: 'sexagesimal' },
      },
      velocity: { column: 'V_HEL_OPT', unit: 'km/s', frame: 'heliocentric', convention: 'optical' },
      velocityError: { column: 'E_V_HEL', unit: 'km/s' },
      lineWidth: { column: 'RRL_FWHM', unit: 'km/s', kind: 'fwhm' },
      size: { column: 'DIAM_ARCMIN', unit: 'arcmin', kind: 'diameter' },
      name: { column: 'REGION' },
    },
  },
  {
    file: 'hrg-ob-associations.vot',
    name: 'HRG OB associations',
    kind: 'ob',
    mapping: {
      position: {
        system: 'equatorial',
        lon: { column: 'ra', unit: 'deg' },
        lat: { column: 'dec', unit: 'deg' },
      },
      velocity: { column: 'vlsr', unit: 'km/s', frame: 'lsr', convention: 'radio' },
      velocityError: { column: 'vlsr_err', unit: 'km/s' },
      distance: { column: 'dist', unit: 'kpc' },
      distanceError: { column: 'dist_err', unit: 'kpc' },
      size: { column: 'diam', unit: 'arcmin', kind: 'diameter' },
      name: { column: 'assoc' },
    },
  },
] as const;
