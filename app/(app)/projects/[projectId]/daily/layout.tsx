import { accessLayout } from "../page-access";

// The daily inspection report is read by the inspector, the engineer and the admin, not the crew.
// Checked here, above this segment's loading state, so a refusal answers 404 before the page streams.
export default accessLayout("report.download");
