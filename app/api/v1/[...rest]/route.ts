import { errorResponse } from "@/lib/api/respond";
import { AppError } from "@/lib/errors";

// Unknown API paths answer in the API's JSON error shape, not with an HTML page.
const unknown = async () => errorResponse(new AppError("not_found", "There is no such API route."));
export { unknown as GET, unknown as POST, unknown as PUT, unknown as PATCH, unknown as DELETE };
