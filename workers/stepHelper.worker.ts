import { joinStepTeam, type TeamInvitation } from '../lib/model/threadTeam';

// A step helper thread of the app: a web worker the simulation worker starts (webStepThreads.ts).
// It says it is ready, then joins each team it is invited to (lib/model/threadTeam.ts), serving that
// step's phases until the team lets it go. It may block in Atomics.wait: a worker is allowed to.
self.addEventListener('message', (e: MessageEvent<TeamInvitation>) => joinStepTeam(e.data));
self.postMessage('ready');
