// s3rver ships no types; the scripts use a narrow interface of their own.
declare module "s3rver";
