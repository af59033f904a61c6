// A study page asked for again by the same viewer, with nothing it shows changed since, is sent
// from the page cache (server/utils/page-cache.ts); the session and memberships are checked first.
export default defineEventHandler(event => cachedStudyPage(event))
