import { accessLayout } from "../page-access";

// Only an engineer chooses how flags reach them.
// Checked here, above this segment's loading state, so a refusal answers 404 before the page streams.
export default accessLayout("flag_mail.choose");
