// The invented suppliers of the Project Tern demo data.
export const NORTHGATE = 'Northgate OEM Supply';
export const PINECREST = 'Pinecrest Take-offs';
export const LARKFIELD = 'Larkfield Auto Electric';
export const BRIGHTWATER = 'Brightwater Parts Co.';
