/**
 * The part of the AGS4 data dictionary (edition 4.1.1) Settlescope writes and checks: the housekeeping
 * groups, LOCA, and the plate loading test groups PLTG and PLTT. Headings are listed in the dictionary's
 * order (AGS4 rule 7) with their status (KEY or REQUIRED, AGS4 rule 10), suggested unit and type. Groups
 * outside this subset are read for their file shape only and listed as not used.
 */

export type HeadingStatus = 'KEY' | 'REQUIRED' | 'OTHER';

export interface HeadingDef {
  name: string;
  status: HeadingStatus;
  unit: string;
  type: string;
  description: string;
}

export interface GroupDef {
  name: string;
  description: string;
  /** The group whose keys each row's first keys must match (AGS4 rule 10c). */
  parent?: string;
  headings: readonly HeadingDef[];
}

const h = (name: string, type: string, description: string, unit = '', status: HeadingStatus = 'OTHER'): HeadingDef => ({
  name,
  status,
  unit,
  type,
  description,
});
const key = (name: string, type: string, description: string, unit = '') => h(name, type, description, unit, 'KEY');
const required = (name: string, type: string, description: string, unit = '') => h(name, type, description, unit, 'REQUIRED');
const fileSet = h('FILE_FSET', 'X', 'Associated file reference');

export const DICTIONARY: readonly GroupDef[] = [
  {
    name: 'PROJ',
    description: 'Project information',
    headings: [
      key('PROJ_ID', 'ID', 'Project identifier'),
      h('PROJ_NAME', 'X', 'Project title'),
      h('PROJ_LOC', 'X', 'Location of site'),
      h('PROJ_CLNT', 'X', 'Client name'),
      h('PROJ_CONT', 'X', 'Contractor name'),
      h('PROJ_ENG', 'X', 'Project engineer'),
      h('PROJ_MEMO', 'X', 'Memorandum'),
      fileSet,
    ],
  },
  {
    name: 'TRAN',
    description: 'Data file transmission information',
    headings: [
      required('TRAN_ISNO', 'X', 'Issue sequence reference'),
      required('TRAN_DATE', 'DT', 'Date of production of data', 'yyyy-mm-dd'),
      required('TRAN_PROD', 'X', 'Data file producer'),
      required('TRAN_STAT', 'X', 'Status of data within submission'),
      h('TRAN_DESC', 'X', 'Description of data in the file'),
      required('TRAN_AGS', 'X', 'AGS edition reference'),
      h('TRAN_RECV', 'X', 'Data file recipient'),
      required('TRAN_DLIM', 'X', 'Concatenation delimiter'),
      required('TRAN_RCON', 'X', 'Concatenation character for record links'),
      h('TRAN_REM', 'X', 'Remarks'),
      fileSet,
    ],
  },
  {
    name: 'ABBR',
    description: 'Abbreviation definitions',
    headings: [
      key('ABBR_HDNG', 'X', 'Field heading in group'),
      key('ABBR_CODE', 'X', 'Abbreviation used'),
      required('ABBR_DESC', 'X', 'Description of abbreviation'),
      h('ABBR_LIST', 'X', 'Source of abbreviation'),
      h('ABBR_REM', 'X', 'Remarks'),
      fileSet,
    ],
  },
  {
    name: 'DICT',
    description: 'User-defined groups and headings',
    headings: [
      key('DICT_TYPE', 'X', 'Flag to indicate definition is a GROUP or HEADING'),
      key('DICT_GRP', 'X', 'Group name'),
      key('DICT_HDNG', 'X', 'Heading name'),
      h('DICT_STAT', 'X', 'Heading status KEY, REQUIRED or OTHER'),
      h('DICT_DTYP', 'X', 'Data type'),
      h('DICT_DESC', 'X', 'Description'),
      h('DICT_UNIT', 'X', 'Units'),
      h('DICT_EXMP', 'X', 'Example'),
      h('DICT_PGRP', 'X', 'Parent group name'),
      h('DICT_REM', 'X', 'Remarks'),
      fileSet,
    ],
  },
  {
    name: 'TYPE',
    description: 'Definition of data types',
    headings: [key('TYPE_TYPE', 'X', 'Data type code'), required('TYPE_DESC', 'X', 'Description'), fileSet],
  },
  {
    name: 'UNIT',
    description: 'Definition of units',
    headings: [key('UNIT_UNIT', 'X', 'Unit'), required('UNIT_DESC', 'X', 'Description'), h('UNIT_REM', 'X', 'Remarks'), fileSet],
  },
  {
    name: 'LOCA',
    description: 'Location details',
    parent: 'PROJ',
    headings: [
      key('LOCA_ID', 'ID', 'Location identifier'),
      h('LOCA_TYPE', 'PA', 'Type of activity'),
      h('LOCA_STAT', 'PA', 'Status of information relating to this position'),
      h('LOCA_NATE', '2DP', 'National Grid Easting of location or start of traverse', 'm'),
      h('LOCA_NATN', '2DP', 'National Grid Northing of location or start of traverse', 'm'),
      h('LOCA_GREF', 'PA', 'National grid referencing system used'),
      h('LOCA_GL', '2DP', 'Ground level relative to datum of location or start of traverse', 'm'),
      h('LOCA_REM', 'X', 'General remarks'),
      h('LOCA_FDEP', '2DP', 'Final depth', 'm'),
      h('LOCA_STAR', 'DT', 'Date of start of activity', 'yyyy-mm-dd'),
      h('LOCA_PURP', 'X', 'Purpose of activity at this location'),
      h('LOCA_TERM', 'X', 'Reason for activity termination'),
      h('LOCA_ENDD', 'DT', 'End date of activity', 'yyyy-mm-dd'),
      h('LOCA_LETT', 'X', 'OSGB letter grid reference'),
      h('LOCA_LOCX', '2DP', 'Local grid x co-ordinate of location or start of traverse', 'm'),
      h('LOCA_LOCY', '2DP', 'Local grid y co-ordinate of location or start of traverse', 'm'),
      h('LOCA_LOCZ', '2DP', 'Level of location or start of traverse relative to local datum', 'm'),
      h('LOCA_LREF', 'X', 'Local grid referencing system used'),
      h('LOCA_DATM', 'X', 'Local datum referencing system used'),
      h('LOCA_ETRV', '2DP', 'National Grid Easting of end of traverse', 'm'),
      h('LOCA_NTRV', '2DP', 'National Grid Northing of end of traverse', 'm'),
      h('LOCA_LTRV', '2DP', 'Ground level relative to datum of end of traverse', 'm'),
      h('LOCA_XTRL', '2DP', 'Local grid easting of end of traverse', 'm'),
      h('LOCA_YTRL', '2DP', 'Local grid northing of end of traverse', 'm'),
      h('LOCA_ZTRL', '2DP', 'Local elevation of end of traverse', 'm'),
      h('LOCA_LAT', 'X', 'Latitude of location or start of traverse'),
      h('LOCA_LON', 'X', 'Longitude of location or start of traverse'),
      h('LOCA_ELAT', 'X', 'Latitude of end of traverse'),
      h('LOCA_ELON', 'X', 'Longitude of end of traverse'),
      h('LOCA_LLZ', 'X', 'Projection format'),
      h('LOCA_LOCM', 'X', 'Method of location'),
      h('LOCA_LOCA', 'X', 'Site location sub-division'),
      h('LOCA_CLNT', 'X', 'Client name for activity'),
      h('LOCA_ALID', 'X', 'Alternative ID'),
      h('LOCA_OFFS', '2DP', 'Offset', 'm'),
      h('LOCA_CNGE', 'X', 'Chainage'),
      h('LOCA_TRAN', 'X', 'Reference to or details of algorithm used to calculate local grid'),
      fileSet,
    ],
  },
  {
    name: 'PLTG',
    description: 'Plate loading tests - general',
    parent: 'LOCA',
    headings: [
      key('LOCA_ID', 'ID', 'Location identifier'),
      key('PLTG_DPTH', '2DP', 'Depth of test', 'm'),
      key('PLTG_TESN', 'X', 'Test reference'),
      key('PLTG_CYC', 'X', 'Load cycle'),
      h('PLTG_PDIA', '0DP', 'Plate diameter', 'mm'),
      h('PLTG_SEAT', '1DP', 'Seating load including apparatus mass', 'kN'),
      h('PLTG_FA0', '2DP', 'Factor a0 of the second-order fit'),
      h('PLTG_FA1', '2DP', 'Factor a1 of the second-order fit'),
      h('PLTG_FA2', '2DP', 'Factor a2 of the second-order fit'),
      h('PLTG_SMOD', '1DP', 'Strain modulus', 'MPa'),
      h('PLTG_EV2', '1DP', 'Modulus of the second loading cycle', 'MPa'),
      h('PLTG_MOSR', '1DP', 'Modulus of subgrade reaction', 'MPa/m'),
      h('PLTG_EMOD', '1DP', 'Elastic modulus', 'MPa'),
      h('PLTG_DATE', 'DT', 'Test date', 'yyyy-mm-dd'),
      h('PLTG_STAB', '2SF', 'Stabiliser amount', '%'),
      h('PLTG_STYP', 'X', 'Stabiliser type'),
      h('PLTG_REM', 'X', 'Remarks'),
      h('PLTG_ENV', 'X', 'Weather and environmental conditions during test'),
      h('PLTG_METH', 'X', 'Test method'),
      h('PLTG_CONT', 'X', 'Name of testing organisation'),
      h('PLTG_CRED', 'X', 'Accrediting body and reference number'),
      h('TEST_STAT', 'X', 'Test status'),
      h('GEOL_STAT', 'X', 'Stratum reference'),
      fileSet,
    ],
  },
  {
    name: 'PLTT',
    description: 'Plate loading tests - data',
    parent: 'PLTG',
    headings: [
      key('LOCA_ID', 'ID', 'Location identifier'),
      key('PLTG_DPTH', '2DP', 'Depth of test', 'm'),
      key('PLTG_TESN', 'X', 'Test reference'),
      key('PLTG_CYC', 'X', 'Load cycle'),
      key('PLTT_STG', 'X', 'Load stage'),
      key('PLTT_TIME', '1DP', 'Elapsed time in the stage', 'min'),
      h('PLTT_LOAD', '1DP', 'Applied load', 'kN'),
      h('PLTT_SET1', '2DP', 'Settlement of gauge 1', 'mm'),
      h('PLTT_SET2', '2DP', 'Settlement of gauge 2', 'mm'),
      h('PLTT_SET3', '2DP', 'Settlement of gauge 3', 'mm'),
      h('PLTT_SET4', '2DP', 'Settlement of gauge 4', 'mm'),
      h('PLTT_REM', 'X', 'Comment on the reading'),
      fileSet,
    ],
  },
];

export const GROUPS: ReadonlyMap<string, GroupDef> = new Map(DICTIONARY.map((g) => [g.name, g]));

/** The key headings of a group, in order. */
export const keysOf = (group: GroupDef): string[] => group.headings.filter((x) => x.status === 'KEY').map((x) => x.name);

/** Descriptions of the units Settlescope writes, for the UNIT group. */
export const UNIT_DESCRIPTIONS: Readonly<Record<string, string>> = {
  m: 'metre',
  mm: 'millimetre',
  kN: 'kilonewton',
  kPa: 'kilopascal',
  MPa: 'megapascal',
  'MPa/m': 'megapascal per metre',
  min: 'minute',
  '%': 'percent',
  'yyyy-mm-dd': 'year month day',
};
