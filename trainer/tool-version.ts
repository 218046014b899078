/** The tool's version, recorded in every file it writes so files can be traced to the code that made them. */
export const toolVersion = "0.1.0";
