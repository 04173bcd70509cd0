/**
 * Uploaded files, for any feature: multer in memory with limits, the type read from the bytes against an
 * allow-list, storage under random names in <HOLDFIRE_DATA_DIR>/uploads, and a same-team download route.
 */
export { singleFileUpload } from './middleware';
export { acceptUpload, createUploadStore, uploadDto, type AcceptedFile, type UploadOwner, type UploadStore, type UploadTransaction } from './store';
export { cleanFileName } from './names';
export { sniff } from './sniff';
