// GET /api/appointments/:id/ics?token=…: the address the calendar link had in e-mails sent before the
// visit routes were renamed; those links stay valid until their visit ends, so the old address answers
// exactly as GET /api/visits/:id/ics does.
export { default } from '../../visits/[id]/ics.get'
