export { UNAMBIGUOUS_ALPHABET, PARTICIPANT_CODE_PATTERN, randomCode, newParticipantCode, newCompletionCode } from "./codes";
export { dataKeyFrom, sealText, openText } from "./sealText";
export { invitationMail } from "./invitationMail";
export { invitationsCsv } from "./invitationsCsv";
export { returnAddress } from "./returnAddress";
