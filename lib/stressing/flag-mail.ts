/**
 * Who gets a flag's e-mail at once. The engineer of record may take flags as one digest per
 * shift instead of one e-mail per flag; a flag that needs action before the shift ends still
 * goes at once to everyone, digest readers included (and is listed in their digest too):
 *
 * - cut_while_held: tails were cut on a held tendon. The step cannot be taken back; the engineer
 *   must judge the anchorage before the slab is loaded or the pockets are grouted.
 * - member_wire_loss: a member has lost more prestressing steel to wire breaks than the
 *   project's limit. Its capacity is in question while the crew keeps stressing its other tendons.
 * - jacking_over_limit: the jack pulled past the force the project allows. The strand may be
 *   overstressed, and the next tendons stressed with the same jack and gauge may be too.
 * - concrete_unconfirmed: the crew stressed before the concrete strength was confirmed. The
 *   anchorage zones may not carry the force; the next tendons should wait for the engineer.
 *
 * Everything else (out of band, calibration, seating, a reading missing…) holds the tendon on
 * the tablet until a disposition, so waiting for the shift's end costs nothing in the field.
 */
export const SENT_AT_ONCE: readonly string[] = [
  "cut_while_held",
  "member_wire_loss",
  "jacking_over_limit",
  "concrete_unconfirmed",
];

export const needsAtOnce = (kinds: readonly string[]) => kinds.some((k) => SENT_AT_ONCE.includes(k));

/**
 * The addresses a flag e-mail goes to now: the project's engineer of record and its other
 * addresses, less the members who take a digest, unless a kind must go at once. Compared
 * without regard to case, as mail addresses are in practice.
 */
export function flagRecipientsNow(
  project: { engineerOfRecordEmail: string | null; notifyEmails: readonly string[] },
  digestEmails: readonly string[],
  kinds: readonly string[],
): string[] {
  const all = [
    ...new Set([project.engineerOfRecordEmail, ...project.notifyEmails].filter((e): e is string => Boolean(e))),
  ];
  if (needsAtOnce(kinds)) return all;
  const digest = new Set(digestEmails.map((e) => e.toLowerCase()));
  return all.filter((e) => !digest.has(e.toLowerCase()));
}
