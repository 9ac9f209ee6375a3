// What a patient's text reply asks for. One word, any case, surrounding spaces and a trailing
// full stop or exclamation mark ignored.
//
// CANCEL is a visit keyword here (issue 18: "X / CANCEL / N raises a cancel request"), although the
// hosted service's default opt-out list also contains it (STOP, STOPALL, UNSUBSCRIBE, CANCEL, END,
// QUIT). A patient who means "stop texting me" can still send STOP; one who means "cancel my visit"
// and is opted out instead would miss their visit without anyone knowing. In production remove CANCEL
// from the service's opt-out keywords (its Advanced Opt-Out settings) so both sides agree; README.
export type ReplyKeyword = 'confirm' | 'cancel' | 'stop' | 'start'

const KEYWORDS: Record<string, ReplyKeyword> = {
  C: 'confirm', YES: 'confirm', Y: 'confirm',
  X: 'cancel', CANCEL: 'cancel', N: 'cancel',
  STOP: 'stop', STOPALL: 'stop', UNSUBSCRIBE: 'stop', END: 'stop', QUIT: 'stop', OPTOUT: 'stop', REVOKE: 'stop',
  START: 'start', UNSTOP: 'start',
}

export function replyKeywordOf(body: string): ReplyKeyword | null {
  const word = body.trim().replace(/[.!]+$/, '').toUpperCase()
  if (!/^[A-Z]{1,12}$/.test(word)) return null
  return KEYWORDS[word] ?? null
}
