/** Rules the sign-up and reset forms check before the server checks them again. */
export const PASSWORD_MIN_LENGTH = 10;
export const PASSWORD_MAX_LENGTH = 200;
export const DISPLAY_NAME_MAX_LENGTH = 120;
export const PROJECT_NAME_MAX_LENGTH = 160;
export const PROJECT_DESCRIPTION_MAX_LENGTH = 4000;
export const COMMENT_MAX_LENGTH = 5000;
export const ACCESS_LINK_MAX_DAYS = 90;
export const INVITATION_DAYS = 7;
