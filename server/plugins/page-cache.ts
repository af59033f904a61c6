// Stores the study page's server render for the page cache (server/utils/page-cache.ts).
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('render:response', (response, { event }) => keepStudyPage(event, response))
})
