import type { Role } from '../../../shared/utils/roles'

// The invented demo scenario (see DEVELOPERS.md): no real people, clubs or events.
export interface DemoMember { email: string, name: string, password: string, roles: Role[] }
export interface DemoClub {
  slug: string
  name: string
  town: string
  about: string
  primaryColor: string
  secondaryColor: string
  /** A PNG beside this file, uploaded to object storage as the club's logo. */
  logoFile?: string
  members: DemoMember[]
}

export const demoClubs: DemoClub[] = [
  {
    slug: 'saltmarsh-sword-guild',
    name: 'Saltmarsh Sword Guild',
    town: 'Wrenmouth',
    about: 'A harbour-town club for sword and buckler and the longsword. We train twice a week in the old net loft and host the Wrenmouth Harvest Open every autumn.',
    primaryColor: '#1f3a4d',
    secondaryColor: '#d9ad4f',
    logoFile: 'saltmarsh-crest.png',
    members: [
      { email: 'admin@saltmarsh.example', name: 'Maren Holt', password: 'saltmarsh-admin', roles: ['admin'] },
      { email: 'organizer@saltmarsh.example', name: 'Tobias Quayle', password: 'saltmarsh-organizer', roles: ['organizer'] },
      { email: 'table@saltmarsh.example', name: 'Ada Fenwick', password: 'saltmarsh-table', roles: ['scorekeeper'] },
      { email: 'stream@saltmarsh.example', name: 'Jonah Pike', password: 'saltmarsh-stream', roles: ['streamer'] },
      { email: 'commentary@saltmarsh.example', name: 'Isolde Marsh', password: 'saltmarsh-commentary', roles: ['commentator'] },
      { email: 'editor@saltmarsh.example', name: 'Priya Dunmore', password: 'saltmarsh-editor', roles: ['editor'] },
    ],
  },
  {
    slug: 'ironquay-fencing-hall',
    name: 'Ironquay Fencing Hall',
    town: 'Ironquay',
    about: 'Longsword and messer on the quayside.',
    primaryColor: '#5a2330',
    secondaryColor: '#e8cc88',
    members: [
      { email: 'admin@ironquay.example', name: 'Elias Corran', password: 'ironquay-admin', roles: ['admin'] },
    ],
  },
]
