import { accessLayout } from "../page-access";

// Read-only links are made by the inspector, the engineer and the admin, not the crew.
// Checked here, above this segment's loading state, so a refusal answers 404 before the page streams.
export default accessLayout("share.manage");
