/** The overview's heading: ShopFrame's and the server's first screen's (FirstScreen.tsx). */
export const ZONES_HEADING = 'Zones';
