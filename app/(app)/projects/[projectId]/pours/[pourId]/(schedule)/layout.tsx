import { accessLayout } from "../../../page-access";

// A pour's schedule is the admin's. Checked here, above this segment's loading state, so a refusal answers 404 before
// the page starts streaming (a page under a loading state can no longer change its status).
export default accessLayout("schedule.manage");
