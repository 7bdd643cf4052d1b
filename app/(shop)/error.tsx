'use client';
import { ErrorNotice } from '@/components/errors/error-notice';

export default ErrorNotice;
